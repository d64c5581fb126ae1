package stages

import (
	"math"
	"testing"

	"pare/graph/figure"
)

// A top-cut tone control on an anode whose load is a plain resistance (R2
// 10 kΩ ∥ the pentode's ra 1 MΩ = 9.901 kΩ) is exactly the handbook divider
// H = (Rv + 1/jωC)/(R + Rv + 1/jωC), so the solver's figures must meet the
// formula's: −3 dB where 1/(ωC) = √((R+Rv)² − 2Rv²) (derived), 342.01 Hz with
// the 5 kΩ pot at nought and 258.17 Hz at full; at 20 kHz the cut is 35.341 dB
// and 9.4805 dB (derived, the same divider: −20·log10|H|).
func TestToneTopCutFigures(t *testing.T) {
	c := circuit(t, "valve", `V1 = { valve = "pentode", pins = { g1 = "in", k = "gnd", a = "a", g2 = "ht", g3 = "gnd" }, gm = "2m", ra = "1M" }
R1 = { r = "470k", pins = ["in", "gnd"] }
R2 = { r = "10k", pins = ["a", "ht"] }
C1 = { c = "47n", pins = ["a", "m"] }
RV1 = { pot = "5k", pins = ["m", "gnd", "gnd"] }`)
	c.Band.Min, c.Band.Max = 20, 20e3
	s := stageOf(find(t, c, Options{}), "tone-top-cut")
	if s == nil {
		t.Fatal("the tone control is not named")
	}
	for _, tc := range []struct {
		name     string
		unit     figure.Unit
		lo, hi   float64
		relative float64
	}{
		{"f_top_cut", figure.Hertz, 258.17, 342.01, 1e-4},
		{"top_cut", figure.Decibel, 9.4805, 35.341, 1e-4},
	} {
		f, ok := s.Figures.Get(tc.name)
		if !ok || f.Range == nil {
			t.Fatalf("%s: no range over the pot's travel: %+v", tc.name, s.Figures)
		}
		if math.Abs(f.Range.Min-tc.lo) > math.Abs(tc.lo)*tc.relative || math.Abs(f.Range.Max-tc.hi) > math.Abs(tc.hi)*tc.relative {
			t.Errorf("%s = %g..%g, want %g..%g", tc.name, f.Range.Min, f.Range.Max, tc.lo, tc.hi)
		}
		if f.Origin.Source != figure.Solver {
			t.Errorf("%s comes from %v, want the solver", tc.name, f.Origin)
		}
	}
}
