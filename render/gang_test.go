package render

import (
	"testing"

	"pare/graph"
	"pare/render/check"
)

// The gang link (the trade's dashed mechanical link between the sections
// of a ganged capacitor) is drawn on every view, the reduced one too, and
// the checker takes it for furniture, not a wire: the sheet stays clean.
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
			if len(g.Links) != 1 || g.Links[0].Name != "tune" {
				t.Errorf("%v %v: links %v, want the one joining VC1a and VC1b", v, st, g.Links)
			}
			for _, p := range check.Measure(g).Problems() {
				t.Errorf("%v %v: %s", v, st, p)
			}
			for _, l := range g.Links {
				for _, q := range l.Path {
					if !g.Bounds.Contains(q) {
						t.Errorf("%v %v: the link leaves the sheet's bounds at %v", v, st, q)
					}
				}
			}
		}
	}
}
