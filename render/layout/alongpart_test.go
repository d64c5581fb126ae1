package layout

import (
	"testing"

	"pare/render/check"
	"pare/render/geom"
)

// TestUnalongClearsAWireBesideItsPart: net a wired from R1's left pin down
// and along under R1, two grid steps from the line through its pins, to
// A2 beyond R1's right end reads as a strap across R1 (render/check's
// AlongParts, from the blind reviewers' reading of a feedback resistor
// with its own base wire run under it). Each case lays that wire by hand
// at one distance; the unalong pass wires a again clear of R1 where the
// wire ran within render/check's reach (two steps), and leaves it where it
// did not, the sheet staying connected and uncrossed.
func TestUnalongClearsAWireBesideItsPart(t *testing.T) {
	for _, tc := range []struct {
		name   string
		under  float64 // the hand-laid run's distance below R1's pin line
		beside bool    // whether that run reads as beside R1 (render/check)
	}{
		{"one step under", 1, true},
		{"two steps under", 2, true},
		{"three steps under", 3, false},
	} {
		t.Run(tc.name, func(t *testing.T) {
			ly := handSheet(
				box{"R1", geom.R(1, -0.5, 5, 0.5), []geom.Pin{pinAt("a", 0, 0, geom.Left), pinAt("b", 6, 0, geom.Right)}},
				box{"B1", geom.R(8, -1, 10, 1), []geom.Pin{pinAt("b", 8, 0, geom.Left)}},
				box{"A2", geom.R(11, 6, 13, 8), []geom.Pin{pinAt("a", 12, 6, geom.Up)}},
			)
			rt := newRouter(ly, &scratch{})
			rt.routeNets()
			a := -1
			for id, nr := range rt.nets {
				if nr.name == "a" {
					a = id
				}
			}
			rt.ripUp(a)
			rt.lay(a, geom.Pt{X: 0, Y: 0}, geom.Pt{X: -1, Y: 0}, geom.Pt{X: -1, Y: tc.under},
				geom.Pt{X: 12, Y: tc.under}, geom.Pt{X: 12, Y: 6})
			if got := rt.alongRuns(a) > 0; got != tc.beside {
				t.Fatalf("hand-laid wire beside R1: %v, want %v (%v)", got, tc.beside, rt.nets[a].cells)
			}
			before := measureHand(ly, rt)
			if got := len(before.AlongParts) > 0; got != tc.beside {
				t.Fatalf("checker reads the hand-laid wire beside R1: %v, want %v %v", got, tc.beside, before.AlongParts)
			}
			rt.unalong()
			if n := rt.alongRuns(a); n != 0 {
				t.Errorf("after unalong net a still runs beside R1 at %d points", n)
			}
			r := measureHand(ly, rt)
			if len(r.AlongParts) > 0 || r.Crossings > before.Crossings || len(r.Connectivity) > 0 {
				t.Errorf("after unalong: %s %v", r.Summary(), r.AlongParts)
			}
		})
	}
}

// measureHand is the checker's report on a hand-made sheet as routed,
// its boxes drawn as two-terminal parts.
func measureHand(ly *state, rt *router) *check.Report {
	g := &geom.Sheet{}
	for _, cl := range ly.cells {
		g.Symbols = append(g.Symbols, geom.Symbol{Ref: cl.ref, Kind: "resistor", Box: cl.shape.Box, Pins: cl.shape.Pins})
	}
	rt.emit(g)
	return check.Measure(g)
}
