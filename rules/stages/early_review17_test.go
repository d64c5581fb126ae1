package stages

import (
	"math"
	"path/filepath"
	"testing"
)

// A blind reviewer's complementary output stage (testdata/review17/b04.toml):
// the driver's collector load is the output pair's input, an emitter
// follower's, so it rests on the pair's β at the bias. In SPICE's
// Gummel–Poon model the Early effect (VAF, here the device model's VA of
// 100 V) raises Ic and not Ib, so that β is βF·(1 + Vcb/VA), about 5 %
// above βF; pare's DC law left the Early factor out and read the driver's
// gain 42.8 and the closed loop 4.72 against the deck's 45.1 and 4.97.
// Reference: the reviewer's ngspice deck testdata/review17/spice/b/c04.cir,
// the circuit as captured with ngspice's own devices at its .op, read at
// 774.6 Hz (√(40·15000), the band's middle, where the stages read).
func TestReview17EarlyGains(t *testing.T) {
	got := findBiased(t, reviewCircuit(t, "review17", "b04.toml"))
	deck := filepath.Join("..", "..", "testdata", "review17", "spice", "b", "c04.cir")
	f := math.Sqrt(40 * 15e3)
	cases := []struct {
		topology, figure string
		num, den         string
	}{
		{"amp-shunt-feedback", "gain_closed_loop", "mid", "q1_in"},
		{"bootstrapped-load", "gain", "q1_c", "q1_b"},
		{"complementary-pair-preset", "gain", "mid", "q1_c"},
	}
	for _, tc := range cases {
		s := stageOf(got, tc.topology)
		if s == nil {
			t.Errorf("no %s; found %s", tc.topology, topologies(got))
			continue
		}
		want := deckRatio(t, deck, tc.num, tc.den, f)
		fg, ok := s.Figures.Get(tc.figure)
		if !ok || math.Abs(math.Abs(fg.Value)/want-1) > 0.005 {
			t.Errorf("%s %s %v (found %v), ngspice |v(%s)/v(%s)| %g at %.4g Hz (0.5 %%)",
				tc.topology, tc.figure, fg.Value, ok, tc.num, tc.den, want, f)
		}
	}
}
