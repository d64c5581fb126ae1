package stages

import (
	"math"
	"path/filepath"
	"testing"

	"pare/graph"
)

// The blind review 12 wrote ten circuits of its own, kept under
// testdata/review12/ at the repository's top with the reviewer's ngspice
// decks in testdata/review12/spice/.

func reduceReview12(t *testing.T, name string) []Stage {
	t.Helper()
	c, err := graph.LoadFile(filepath.Join("..", "..", "testdata", "review12", name))
	if err != nil {
		t.Fatalf("%s: %v", name, err)
	}
	return findReduced(t, c)
}

// A Colpitts VFO's tank is its coil with the gang section and trimmer
// across it and the divider's series pair: c eff is all of it, C1 10–60 pF
// + TC1 15 pF + 680 pF·680 pF/1360 pF = 365–415 pF (handbook Colpitts
// formula, docs/references.md §29), so the resonance formula agrees with
// the solver; the divider alone (340 pF) is not what the coil sees. The
// solver's f is checked against the reviewer's ngspice (3.610 and
// 3.849 MHz, testdata/review12/spice/c01.cir); no tank stage inside the
// oscillator repeats f on the gang alone.
func TestReview12ColpittsTankCountsTheGang(t *testing.T) {
	st := reduceReview12(t, "c01.toml")
	osc := stageOf(st, "colpitts-common-tap")
	if osc == nil {
		t.Fatalf("no Colpitts: %s", topologies(st))
	}
	c, ok := osc.Figures.Get("c_eff")
	if !ok || c.Range == nil || math.Abs(c.Range.Min-365e-12) > 0.5e-12 || math.Abs(c.Range.Max-415e-12) > 0.5e-12 {
		t.Errorf("c eff = %+v, want 365–415 pF", c)
	}
	f, ok := osc.Figures.Get("f")
	if !ok || f.Range == nil || math.Abs(f.Range.Min-3.610e6)/3.610e6 > 0.005 || math.Abs(f.Range.Max-3.849e6)/3.849e6 > 0.005 {
		t.Errorf("f = %+v, want 3.610–3.849 MHz within 0.5 %%", f)
	}
	if f.Check == nil || f.Check.Range == nil || math.Abs(f.Check.Range.Min-f.Range.Min)/f.Range.Min > 0.02 {
		t.Errorf("the formula's f %+v strays from the solver's %+v", f.Check, f.Range)
	}
	for _, s := range st {
		if s.Topology == "lc-tank" {
			t.Errorf("%s: a tank stage inside the oscillator: %v", s.Name, s.Parts)
		}
	}
}
