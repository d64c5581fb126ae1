package stages

import (
	"math"
	"os"
	"slices"
	"testing"
)

// The club receiver's R22 (1 kΩ) sits straight at V7's grid: a grid
// stopper, a stage of its own (no longer "not part of a known topology"),
// that leaves V7 to the output stage. Its corner is the Miller formula
// fc = 1/(2πR·(Cin + (1 + |A|)·Cf)) (handbook, from memory) with the
// pentode's typical Cin 8 pF and Cf 0.5 pF and the solver's grid-to-anode
// gain, checked against ngspice .ac on testdata/stopper/club-stopper.cir
// at the middle of the audio region (20 Hz..20 kHz: 632.5 Hz, where the
// stage's gain is read); the corner must lie far above the
// audio band: 1 kΩ with even 100 pF gives 1.6 MHz.
func TestGridStopper(t *testing.T) {
	full, reduced, log := reduceExample(t, "club-receiver.toml")
	st := find(t, reduced, Options{Full: full, ACGround: log.ACGround})
	s := stageWith(st, "R22")
	if s == nil || s.Topology != "grid-stopper" || s.Title != "Stopper resistor at the grid (valve)" {
		t.Fatalf("R22 in %v, want a grid stopper; all: %s", s, topologies(st))
	}
	if slices.Contains(s.Parts, "V7") {
		t.Errorf("the stopper claims the valve: %v", s.Parts)
	}
	a := fig(s.Figures, "gain_miller")
	deck, err := os.ReadFile("testdata/stopper/club-stopper.cir")
	if err != nil {
		t.Fatal(err)
	}
	if want := valueAt(t, string(deck), math.Sqrt(20*20e3)); math.Abs(a/want-1) > 0.01 {
		t.Errorf("Miller gain %g, ngspice %g", a, want)
	}
	cin := 8e-12 + (1+a)*0.5e-12
	if got := fig(s.Figures, "c_in_f"); math.Abs(got/cin-1) > 1e-9 {
		t.Errorf("input C %g F, want %g F", got, cin)
	}
	fc := fig(s.Figures, "f_c_hz")
	if want := 1 / (2 * math.Pi * 1e3 * cin); math.Abs(fc/want-1) > 1e-9 || fc < 1e6 {
		t.Errorf("corner %g Hz, want %g Hz, far above the audio band", fc, want)
	}
	if len(Unmatched(reduced, st)) != 0 {
		t.Errorf("unmatched parts left: %v", Unmatched(reduced, st))
	}
}
