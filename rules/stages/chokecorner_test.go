package stages

import (
	"fmt"
	"strings"
	"testing"

	"pare/graph"
)

// TestChokeCornerWhy: the words beside an LC section's corner agree with
// the solver's figure. review23 a05's field coil (6 H, 1.2 kΩ) with 16 µF:
// resonance 1/(2π√(6·16µ)) = 16.24 Hz, the solver's corner 10.42 Hz, below
// it; the old words said the section falls 3 dB only above 1.55 × 16.24 Hz
// (reviewer A of the twelfth review). Check values (handbook formulas):
// Q = 2π·16.24·6/1200 = 0.51; 1/(2π·1200·16µ) = 8.289 Hz. Near miss: a
// low-resistance choke whose corner lies above its resonance keeps the
// undamped words.
func TestChokeCornerWhy(t *testing.T) {
	for _, tc := range []struct {
		name     string
		rdc      float64
		fc       float64
		has, not []string
	}{
		{"field coil, damped", 1200, 10.42, []string{"damps it", "Q 0.51", "8.289 Hz", "below the resonance"}, []string{"only above it (√"}},
		{"choke, corner above resonance", 100, 25, []string{"falls 3 dB only above it"}, []string{"damps it"}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			l, err := graph.Parse("choke.toml", []byte(fmt.Sprintf("title = \"choke\"\nband = \"20..20k\"\n[parts]\nL2 = { l = \"6\", rdc = \"%g\", pins = [\"a\", \"b\"] }\n", tc.rdc)))
			if err != nil {
				t.Fatal(err)
			}
			got := chokeCornerWhy(l.Part("L2"), resonance(6, 16e-6), tc.fc)
			for _, w := range tc.has {
				if !strings.Contains(got, w) {
					t.Errorf("%q lacks %q", got, w)
				}
			}
			for _, w := range tc.not {
				if strings.Contains(got, w) {
					t.Errorf("%q says %q", got, w)
				}
			}
		})
	}
}
