package stages

import (
	"math"
	"slices"
	"testing"

	"pare/graph/figure"
)

// A Vbe multiplier between a complementary pair's bases is recognised with
// the pair, and the volts it holds are the DC operating point's, checked
// against the amplified-diode law V = Vbe·(1 + Ra/Rb) at the same Vbe
// (handbook, from memory): 1k5 over 1k gives 2.5·Vbe. Before, the pair
// with a transistor between its bases matched no pattern.
func TestVbeMultiplierPair(t *testing.T) {
	op, st := findFixture(t, "pairs", "comp-vbe.toml")
	s := holding(st, "Q4")
	if s == nil || s.Topology != "complementary-pair-vbe" || !slices.Contains(s.Parts, "Q2") || !slices.Contains(s.Parts, "Q3") {
		t.Fatalf("Q4 not a Vbe multiplier with the pair: %s", topologies(st))
	}
	v, ok := s.Figures.Get("bias_v")
	if !ok || v.Origin.Source != figure.Solver || v.Check == nil {
		t.Fatalf("no bias V from the operating point with its check: %v", s.Figures)
	}
	vb, _ := op.Volts("vm_b")
	ve, _ := op.Volts("drv")
	if want := (vb - ve) * (1 + 1500.0/1000); math.Abs(v.Value-want)/want > 0.02 {
		t.Errorf("bias V %g, want Vbe·(1 + R7/R8) = %g within 2 %%", v.Value, want)
	}
	if g, ok := s.Figures.Get("gain"); !ok || g.Value < 0.5 || g.Value > 1.05 {
		t.Errorf("the pair's gain %v is not a follower's", g)
	}
}
