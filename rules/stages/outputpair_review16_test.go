package stages

import (
	"math"
	"slices"
	"testing"
)

// review16's output pairs, named and checked against the reviewer's own
// ngspice deck (docs/references.md §41): b04's complementary pair with a
// preset strapped on its diodes' end, its gain from the driver's collector
// (Q3's base) to the joined emitters 0.8545 in
// testdata/review16/spice/b/c04_nl.cir (the reviewer's nonlinear deck,
// VAF=100, linearised by ngspice at its .op; c04_ss.cir's 0.8487 was
// pare's old operating point without the Early effect) at 774.6 Hz
// (√(40·15000), the band's middle); b05's push-pull pair on a decoupled centre tap, its two
// bases driven in antiphase from the audio input, equal halves of one
// driver secondary (-1, derived: the tap is held by C25).
func TestReview16OutputPairs(t *testing.T) {
	cases := []struct {
		file, topology string
		parts          []string
		figure         string
		want, tol      float64
	}{
		{"b04.toml", "complementary-pair-preset", []string{"D1", "D2", "Q2", "Q3", "R7", "R8", "RV1"}, "gain", 0.8545, 0.005},
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

// review16 a04's driver takes the overall feedback at the foot of its
// cathode lead: named for it, its loop's figures against the reviewer's
// deck (testdata/review16/spice/a/c04_run.cir at 775 Hz: V(spk)/V(v1_g)
// 34.62 closed, 127.53 with R5/C3 to chassis, 11.33 dB between), and the
// feedback resistor left to the loop, not framed with the driver (framed,
// it pulled the push-pull page off its mirror).
func TestReview16FeedbackFoot(t *testing.T) {
	got := findBiased(t, reviewCircuit(t, "review16", "a04.toml"))
	s := stageOf(got, "amp-common-feedback-foot")
	if s == nil {
		t.Fatalf("no amp-common-feedback-foot; found %s", topologies(got))
	}
	for _, ref := range []string{"V1", "R3", "R4", "C2"} {
		if !slices.Contains(s.Parts, ref) {
			t.Errorf("%s not in the driver's stage %v", ref, s.Parts)
		}
	}
	if slices.Contains(s.Parts, "R5") || slices.Contains(s.Parts, "C3") {
		t.Errorf("the feedback network framed with the driver: %v", s.Parts)
	}
	for _, w := range []struct {
		name      string
		want, tol float64
	}{{"gain_closed_loop", 34.62, 0.01}, {"gain_open_loop", 127.53, 0.01}, {"nfb", 11.33, 0.01}} {
		f, ok := s.Figures.Get(w.name)
		if !ok || math.Abs(math.Abs(f.Value)-w.want) > w.tol*w.want {
			t.Errorf("%s %v (found %v), want %g within %g %%", w.name, f.Value, ok, w.want, 100*w.tol)
		}
	}
}
