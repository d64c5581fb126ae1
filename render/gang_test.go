package render

import (
	"math"
	"strings"
	"testing"

	"pare/graph"
	"pare/render/check"
	"pare/render/geom"
)

// The gang (the mechanical link between the sections of a ganged
// capacitor) is marked on every view, the reduced one too: each section's
// label names it, and a dashed link joins sections only where it is short,
// straight or with one bend (a long one run round the drawing closed into
// a loop that read as a stage frame, review18 b02). The checker takes a
// link for furniture, not a wire: the sheet stays clean.
func TestGangLinkOnEveryView(t *testing.T) {
	c, err := graph.Parse("mixer.toml", []byte(portableMixer))
	if err != nil {
		t.Fatal(err)
	}
	for _, v := range []View{Reduced, Full, Faded} {
		for _, st := range []Style{IEC, IEEE} {
			g, err := Config{Style: st}.Geometry(&Sheet{Circuit: c, View: v})
			if err != nil {
				t.Fatal(err)
			}
			if len(g.Links) > 1 || len(g.Links) == 1 && g.Links[0].Name != "tune" {
				t.Errorf("%v %v: links %v, want at most the one joining VC1a and VC1b", v, st, g.Links)
			}
			for _, ref := range []string{"VC1a", "VC1b"} {
				if !labelSays(g, ref, "gang tune") {
					t.Errorf("%v %v: %s's label does not name its gang", v, st, ref)
				}
			}
			for _, p := range check.Measure(g).Problems() {
				t.Errorf("%v %v: %s", v, st, p)
			}
			for _, l := range g.Links {
				if n := linkLength(l.Path); len(l.Path) > 3 || n > 20 {
					t.Errorf("%v %v: the link runs %g grid steps with %d bends; want 20 or less, one bend at most (layout.linkReach)", v, st, n, len(l.Path)-2)
				}
				for _, q := range l.Path {
					if !g.Bounds.Contains(q) {
						t.Errorf("%v %v: the link leaves the sheet's bounds at %v", v, st, q)
					}
				}
			}
		}
	}
}

// labelSays says whether the label of ref holds a line containing want.
func labelSays(g *geom.Sheet, ref, want string) bool {
	for _, l := range g.Labels {
		if l.Owner != ref {
			continue
		}
		for _, line := range l.Lines {
			if strings.Contains(line, want) {
				return true
			}
		}
	}
	return false
}

// linkLength is a link's length along its path, in grid steps.
func linkLength(path []geom.Pt) float64 {
	n := 0.0
	for k := 0; k+1 < len(path); k++ {
		n += math.Abs(path[k+1].X-path[k].X) + math.Abs(path[k+1].Y-path[k].Y)
	}
	return n
}
