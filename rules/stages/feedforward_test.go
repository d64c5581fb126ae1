package stages

import (
	"math"
	"testing"

	"pare/graph"
)

// TestDecouplerFeedsForward: a supply filter's series part must carry the
// supply's current from its input to the line it feeds at the DC
// operating point. review22 b02 (a blind reviewer's RF amplifier, invented
// values) has R4 330 Ω from +9 V to the RF amplifier's line, held by C3
// 47 nF, and R2 22 kΩ from that line down to the base bias node, itself
// held by C1 and fed from the AGC line through R1: the finder had named
// R2 with C3 a "supply decoupling filter" (153.9 Hz) and R1 with C1
// another, neither carrying current the way it claimed. The decoupler is
// R4 with C3: fc = 1/(2πRC) = 10.26 kHz (handbook formula; the reviewer's
// deck testdata/review22/spice/b/c02-base.inc has those parts), higher in
// circuit where the line's load is across C3.
func TestDecouplerFeedsForward(t *testing.T) {
	c, err := graph.LoadFile("../../testdata/review22/b02.toml")
	if err != nil {
		t.Fatal(err)
	}
	st := findBiased(t, c)
	for _, ref := range []string{"R1", "R2"} {
		if h := holding(st, ref); h != nil && (h.Topology == "smoothing-filter" || h.Topology == "supply-filter-section") {
			t.Errorf("%s named a supply filter (%s %v): its current runs the other way", ref, h.Name, h.Parts)
		}
	}
	h := holding(st, "R4")
	if h == nil || h.Topology != "smoothing-filter" {
		t.Fatalf("R4 not in a supply filter: %s", topologies(st))
	}
	fc, ok := h.Figures.Lookup("f_c_hz")
	formula := 1 / (2 * math.Pi * 330 * 47e-9)
	if !ok || fc < formula || fc > 1.2*formula {
		t.Errorf("decoupler corner %g Hz, want from the formula's %.4g Hz to a fifth above it (%v)", fc, formula, h.Figures)
	}
}
