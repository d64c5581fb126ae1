package stages

import (
	"slices"
	"testing"
)

// TestBiasChainBypassInItsPair: a capacitor across an output pair's bias
// chain, base to base, is the chain's bypass (both bases see the same
// signal: common practice) and belongs to the pair, never a "Coupling
// capacitor" with a corner of its own: review17 b04's C5 was named one,
// "f c 1.693 Hz", by its blind reviewer's reading a confidently wrong name.
func TestBiasChainBypassInItsPair(t *testing.T) {
	cases := []struct{ dir, file, cap, topology string }{
		{"review17", "b04.toml", "C5", "complementary-pair-preset"}, // the reviewer's capture
	}
	for _, c := range cases {
		_, sts := findFixture(t, c.dir, c.file)
		for _, st := range sts {
			if !slices.Contains(st.Parts, c.cap) {
				continue
			}
			if st.Topology != c.topology {
				t.Errorf("%s/%s: %s is in a %q stage (%s), want the pair's %q", c.dir, c.file, c.cap, st.Topology, st.Title, c.topology)
			}
		}
	}
}
