package stages

import (
	"math"
	"slices"
	"testing"
)

// The club receiver's detector and its AGC filter are two stages: R16
// (1 MΩ) runs from the detector's output to the AGC line, which the
// reduction grounds, so on the reduced circuit it looks like a load to
// chassis; but it feeds the line (with C31 100 nF, τ = RC = 0.1 s,
// handbook formula), and the detector's DC load is R15 with RV1
// (47 kΩ + 500 kΩ = 547 kΩ, netlist). The detector's frame must not hold
// it, nor fold it back as a shunt.
func TestDetectorLeavesTheAGCFeed(t *testing.T) {
	full, reduced, log := reduceExample(t, "club-receiver.toml")
	st := find(t, reduced, Options{Full: full, ACGround: log.ACGround})
	det := stageOf(st, "diode-detector-cold-end")
	if det == nil {
		t.Fatalf("no detector: %s", topologies(st))
	}
	if slices.Contains(det.Parts, "R16") {
		t.Errorf("detector holds the AGC feed R16: %v", det.Parts)
	}
	if got := fig(det.Figures, "r_load_ohm"); math.Abs(got-547e3) > 1 {
		t.Errorf("detector load %g Ω, want R15 + RV1 547 kΩ", got)
	}
	agc := stageOf(st, "agc-line-filter")
	if agc == nil || agc.Title != "AGC filter" || !slices.Equal(agc.Parts, []string{"C31", "R16"}) {
		t.Fatalf("AGC filter %v, want its own stage of C31 and R16", agc)
	}
	if got, _ := formulaOf(agc.Figures, "tau_s"); math.Abs(got-0.1) > 1e-9 {
		t.Errorf("AGC τ formula %g s, want RC = 0.1 s", got)
	}
}
