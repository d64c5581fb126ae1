package main

import (
	"strings"
	"testing"

	"pare/render"
	"pare/render/check"
	"pare/render/geom"
)

// A valve push-pull pair on its reduced page drawn the trade's way
// (common practice in valve service sheets): the two valves mirrored about
// the centre line, the lower one upside down so the two cathodes meet at
// the shared cathode network between them, the output transformer's
// primary between the anodes, and no wire crossing another inside the
// pair's frame. review17 a04's page was a knot: V3's cathode lead ran down
// across V4's grid lead and the overall feedback lead circled the stage
// twice. Each row: the fixture, the lower valve, the off-row connector of a
// feedback lead that must run along the stage's foot (past the pair only
// under the lower valve), "" for none, and the crossings left inside the
// pair's frame.
func TestPushPullMirroredOnItsPage(t *testing.T) {
	cases := []struct {
		file, lower, feedback string
		cross                 int
	}{
		{"../../testdata/review17/a04.toml", "V4", "spk", 0},
		{"../../testdata/review16/a04.toml", "V4", "", 0},
		// the screens' shared feed stands in a decoupler's frame of its
		// own, so their lead leaves the pair across the upper anode lead
		{"../../testdata/review14/a04.toml", "V4", "spk", 1},
		// the frame's title, longer since it says the frequency its drive
		// ratio was solved at, turns the upper anode lead over its screen lead
		{"../../testdata/review13/a04.toml", "V3", "", 1},
		{"../../rules/stages/testdata/push-pull-output.toml", "V2", "", 0},
	}
	for _, tc := range cases {
		pages, err := cachedPages(tc.file, render.Reduced, "A4")
		if err != nil {
			t.Fatal(err)
		}
		at, _ := symbolOn(pages, tc.lower)
		if at < 0 {
			t.Errorf("%s: %s not drawn", tc.file, tc.lower)
			continue
		}
		g := pages[at]
		var sym geom.Symbol
		for _, s := range g.Symbols {
			if s.Ref == tc.lower {
				sym = s
			}
		}
		for _, p := range sym.Pins {
			if p.Name == "k" && p.Dir != geom.Up || p.Name == "a" && p.Dir != geom.Down {
				t.Errorf("%s: %s's %s points %v: want the lower valve upside down, cathode up to the centre line", tc.file, tc.lower, p.Name, p.Dir)
			}
		}
		r := check.Measure(g)
		for i, f := range g.Frames {
			if strings.Contains(strings.Join(f.Title.Lines, " "), "Push-pull") && r.FrameCrossings[i] > tc.cross {
				t.Errorf("%s: %d crossings inside the push-pull frame, want at most %d", tc.file, r.FrameCrossings[i], tc.cross)
			}
		}
		if tc.feedback != "" {
			foot := sym.Box.Y1
			for _, w := range g.Wires {
				if w.Net != tc.feedback {
					continue
				}
				for _, sg := range w.Segs {
					// a run past the pair towards the page's left edge
					if sg.A.Y == sg.B.Y && min(sg.A.X, sg.B.X) < sym.Box.X0 && sg.A.Y < foot {
						t.Errorf("%s: the feedback lead %s runs at y %g past the pair, not along its foot (under %g)", tc.file, tc.feedback, sg.A.Y, foot)
					}
				}
			}
		}
	}
}
