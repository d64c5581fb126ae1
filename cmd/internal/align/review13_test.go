package align_test

import (
	"math"
	"path/filepath"
	"testing"
)

func review13(name string) string {
	return filepath.Join("..", "..", "..", "testdata", "review13", name+".toml")
}

// Push-pull halves are driven side by side, not one from the other: an
// injection row at one half's grid gives its gain to what follows the pair
// (the loudspeaker), never to the other half's grid (the level there is
// only what comes back through the feedback and the splitter). Check
// values from ngspice on the reviewer's deck (testdata/review13/spice/
// a04.cir, Vin at 0, 1 V at v2_g, R11 kept, `ac lin 1 400 400`):
// |V(spk)| = 0.4778, |V(v3_g)| = 0.5786 — the second is what the row
// quoted as V2's stage gain before.
func TestReview13PushPullHalvesAreParallel(t *testing.T) {
	_, g := build(t, review13("a04"))
	found := false
	for _, in := range g.Inject {
		if in.Net != "v2_g" {
			continue
		}
		found = true
		if in.GainTo != "spk" {
			t.Errorf("V2's row gains to %s, want spk (past the pair)", in.GainTo)
		}
		if math.Abs(in.Gain-0.4778)/0.4778 > 0.01 { // ngspice, above
			t.Errorf("V2 grid to spk ×%.4g, ngspice gives ×0.4778", in.Gain)
		}
	}
	if !found {
		t.Fatalf("no row at V2's grid: %+v", g.Inject)
	}
}
