package stages

import (
	"math"
	"slices"
	"testing"
)

// review16's output pairs, named and checked against the reviewer's own
// ngspice deck (docs/references.md §41): b04's complementary pair with a
// preset strapped on its diodes' end, its gain from the driver's collector
// (Q3's base) to the joined emitters 0.8487 in
// testdata/review16/spice/b/c04_ss.cir at 774.6 Hz (√(40·15000), the
// band's middle); b05's push-pull pair on a decoupled centre tap, its two
// bases driven in antiphase from the audio input, equal halves of one
// driver secondary (-1, derived: the tap is held by C25).
func TestReview16OutputPairs(t *testing.T) {
	cases := []struct {
		file, topology string
		parts          []string
		figure         string
		want, tol      float64
	}{
		{"b04.toml", "complementary-pair-preset", []string{"D1", "D2", "Q2", "Q3", "R7", "R8", "RV1"}, "gain", 0.8487, 0.005},
		{"b05.toml", "push-pull", []string{"Q5", "Q6", "R22", "R23", "T7"}, "drive_ratio", -1, 0.02},
	}
	for _, tc := range cases {
		got := findBiased(t, reviewCircuit(t, "review16", tc.file))
		s := stageOf(got, tc.topology)
		if s == nil {
			t.Errorf("%s: no %s; found %s", tc.file, tc.topology, topologies(got))
			continue
		}
		for _, ref := range tc.parts {
			if !slices.Contains(s.Parts, ref) {
				t.Errorf("%s: %s not in the pair's stage %v", tc.file, ref, s.Parts)
			}
		}
		f, ok := s.Figures.Get(tc.figure)
		if !ok || math.Abs(f.Value-tc.want) > tc.tol*math.Abs(tc.want) {
			t.Errorf("%s: %s %v (found %v), want %g within %g %%", tc.file, tc.figure, f.Value, ok, tc.want, 100*tc.tol)
		}
	}
}
