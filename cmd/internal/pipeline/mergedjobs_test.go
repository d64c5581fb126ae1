package pipeline

import (
	"slices"
	"strings"
	"testing"

	"pare/render"
	"pare/render/geom"
)

// TestMergedBundleNotOneMembersJob: in review 17's b05 (the circuit's own
// wiring) the reduction merges seven resistors from the smoothed HT line
// into one part under R3's ref: the heptode's screen feed, the smoothing
// resistor, the bleeder and four decouplers. Common practice: those are
// different jobs, so the reduced sheet may not tag its grounded end with
// R3's screen line ("HT via R3"); the bundle's end returns to AC ground.
// Its frame is still the screen feed's: keeping the bundle out of a supply
// stage's frame (stages.StandsAlone) moved review16 b05's merged line feeds
// into its push-pull frame and the pair lost its mirror, so that waits for
// a drawing of the bundle as its members.
func TestMergedBundleNotOneMembersJob(t *testing.T) {
	res, err := stagesRun("../../../testdata/review17/b05.toml")
	if err != nil {
		t.Fatal(err)
	}
	m := res.Reduced.Part("R3")
	if m == nil || len(m.From) < 3 {
		t.Fatalf("the reduced netlist no longer merges the HT resistors into R3: %+v", m)
	}
	s := res.Sheet(render.Reduced)
	for _, tc := range []struct{ what, bad string }{
		{"tag", "via R3"},
	} {
		t.Run(tc.what, func(t *testing.T) {
			switch tc.what {
			case "frame":
				for _, f := range s.Frames {
					if slices.Contains(f.Parts, "R3") && strings.Contains(f.Title, tc.bad) {
						t.Errorf("frame %q holds the merged R3 (%v)", f.Title, m.From)
					}
				}
			case "tag":
				g, err := render.Config{}.Geometry(s)
				if err != nil {
					t.Fatal(err)
				}
				for _, l := range g.Locals {
					if l.Owner == "R3" && l.Kind == geom.LocalRail && strings.Contains(l.Text, tc.bad) {
						t.Errorf("R3.%s tagged %q: the bundle does not return to R3's screen line alone", l.Pin, l.Text)
					}
				}
			}
		})
	}
}
