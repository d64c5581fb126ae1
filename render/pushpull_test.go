package render

import (
	"math"
	"testing"

	"pare/graph"
	"pare/render/check"
	"pare/render/geom"
)

// A push-pull output pair as the reduction leaves it (HT at AC ground, the
// screens dropped to "nc"), framed as one stage. A repairer expects each
// grid leak to hang from the wire into its grid (common practice), every
// wire of the stage to stay inside its frame, and wires a grid step apart.
const pushPullStage = `
title = "Push-pull output pair"
band = "50..15k"
inputs = ["g_a", "g_b"]
outputs = ["spk"]
[parts]
V1 = { valve = "pentode", gm = "6mA/V", ra = "40k", pins = { a = "a1", g1 = "g_a", g2 = "nc", g3 = "k", k = "k" } }
V2 = { valve = "pentode", gm = "6mA/V", ra = "40k", pins = { a = "a2", g1 = "g_b", g2 = "nc", g3 = "k", k = "k" } }
R1 = { r = "130", pins = ["k", "gnd"] }
C1 = { c = "100u", type = "electrolytic", pins = ["k", "gnd"] }
R2 = { r = "470k", pins = ["g_a", "gnd"] }
R3 = { r = "470k", pins = ["g_b", "gnd"] }
T1 = { windings = { p = ["10", "10"], s = "25m" }, k = 0.99, pins = { p1 = "a1", pt = "gnd", p2 = "a2", s1 = "spk", s2 = "gnd" } }
R4 = { r = "8", pins = ["spk", "gnd"] }
`

func TestPushPullReadable(t *testing.T) {
	c, err := graph.Parse("pushpull.toml", []byte(pushPullStage))
	if err != nil {
		t.Fatal(err)
	}
	frame := Frame{Title: "S1 Push-pull output stage (valve)", Parts: []string{"V1", "V2", "R1", "C1", "R2", "R3", "T1", "R4"}}
	for _, st := range []Style{IEC, IEEE} {
		g, err := Config{Style: st}.Geometry(&Sheet{Circuit: c, View: Reduced, Frames: []Frame{frame}})
		if err != nil {
			t.Fatal(err)
		}
		r := check.Measure(g)
		for _, p := range append(r.Problems(), r.FrameHugs...) {
			t.Errorf("%s: %s", st, p)
		}
		pins := map[string]geom.Pt{}
		for _, s := range g.Symbols {
			for _, p := range s.Pins {
				pins[s.Ref+"."+p.Name] = p.At
			}
		}
		// each grid leak stands before its grid, its top pin at most two
		// steps below the grid's wire and no further left than a wide
		// valve column (20 steps)
		for _, leak := range []struct{ r, grid string }{{"R2.1", "V1.g1"}, {"R3.1", "V2.g1"}} {
			a, b := pins[leak.r], pins[leak.grid]
			if dx, dy := b.X-a.X, math.Abs(a.Y-b.Y); dx < 0 || dx > 20 || dy > 2 {
				t.Errorf("%s: grid leak %s at %v is not beside %s at %v", st, leak.r, a, leak.grid, b)
			}
		}
		// the wires of nets wholly inside the stage stay inside its frame
		fb := g.Frames[0].Box
		for _, w := range g.Wires {
			if w.Net == "g_a" || w.Net == "g_b" || w.Net == "spk" {
				continue // they come from or go to the sheet's edge flags
			}
			for _, s := range w.Segs {
				if !fb.Contains(s.A) || !fb.Contains(s.B) {
					t.Errorf("%s: wire of %s %v leaves the frame %v", st, w.Net, s, fb)
				}
			}
		}
	}
}
