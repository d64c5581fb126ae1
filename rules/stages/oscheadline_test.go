package stages

import (
	"math"
	"testing"

	"pare/graph"
	"pare/graph/figure"
)

// An oscillator's headline frequency (the f a sheet's frame, the title
// block's tuning line and the note lead with) is where its loop runs: the
// solver's 0° of loop phase across the gang, not its tank's resonance
// alone, which stays beside it as "tank alone". Check values: ngspice-39
// .ac on the blind reviewer's decks of the loop broken at the grid
// (testdata/review17/spice/a/, 0° read by its phase0.py), docs/references.md §42.
func TestOscillatorHeadlineIsTheLoop(t *testing.T) {
	cases := []struct {
		file, topology string
		lo, hi         float64 // the decks' 0° of loop phase, gang full in and full out
		tankAlone      bool    // a tank stage's own resonance shown beside it
	}{
		// c01-loop-250p.cir 534339 Hz, c01-loop-15p.cir 683986 Hz
		{"a01.toml", "colpitts-grounded-tap", 534.34e3, 683.99e3, true},
		// c02-365p.cir 977653 Hz, c02-12p.cir 2083862 Hz
		{"a02.toml", loopTopology, 977.65e3, 2083.86e3, false},
	}
	for _, tc := range cases {
		t.Run(tc.file, func(t *testing.T) {
			c, err := graph.LoadFile("../../testdata/review17/" + tc.file)
			if err != nil {
				t.Fatal(err)
			}
			found := findReduced(t, c)
			st := stageOf(found, tc.topology)
			if st == nil {
				t.Fatalf("stages %s: want %s", topologies(found), tc.topology)
			}
			if len(st.Figures) == 0 || st.Figures[0].Name != "f" {
				t.Fatalf("figures %v: want f first, the frame's headline", st.Figures)
			}
			f := st.Figures[0]
			if f.Range == nil || f.Origin.Source != figure.Solver {
				t.Fatalf("f %+v: want the solver's range across the gang", f)
			}
			for _, p := range []struct{ got, want float64 }{{f.Range.Min, tc.lo}, {f.Range.Max, tc.hi}} {
				if math.Abs(p.got/p.want-1) > 0.005 {
					t.Errorf("f %s, want within 0.5 %% of ngspice's %s", hzText(p.got), hzText(p.want))
				}
			}
			tank, ok := st.Figures.Get("f_tank")
			if ok != tc.tankAlone {
				t.Fatalf("tank alone %+v (%v), want shown %v", tank, ok, tc.tankAlone)
			}
			if ok && (st.Figures[1].Name != "f_tank" || tank.Label != "tank alone") {
				t.Errorf("figures %v: want the tank alone second, named", st.Figures)
			}
		})
	}
}
