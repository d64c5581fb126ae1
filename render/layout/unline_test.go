package layout

import (
	"testing"

	"pare/render/check"
	"pare/render/geom"
)

// TestUnlineClearsEndsInLine: net a wired along a line that stops three steps
// short of net b's corner on the same line (what the search leaves when a
// detour costs more) reads as one wire (render/check's in-line test, from
// common drafting practice); the unline pass wires a again so that no run
// ends in line with b's, and the sheet stays connected and uncrossed.
func TestUnlineClearsEndsInLine(t *testing.T) {
	ly := handSheet(
		box{"A1", geom.R(0, -1, 2, 1), []geom.Pin{pinAt("a", 2, 0, geom.Right)}},
		box{"A2", geom.R(4, 5, 6, 7), []geom.Pin{pinAt("a", 5, 5, geom.Up)}},
		box{"B1", geom.R(14, -1, 16, 1), []geom.Pin{pinAt("b", 14, 0, geom.Left)}},
		box{"B2", geom.R(7, 5, 9, 7), []geom.Pin{pinAt("b", 8, 5, geom.Up)}},
	)
	rt := newRouter(ly, &scratch{})
	rt.routeNets()
	a := -1
	for id, nr := range rt.nets {
		if nr.name == "a" {
			a = id
		}
	}
	// a along y=0 to x=5, then down to its pin: its run ends at (5,0)
	// heading right, b's wire turning at (8,0) three steps on
	rt.ripUp(a)
	rt.lay(a, geom.Pt{X: 2, Y: 0}, geom.Pt{X: 5, Y: 0}, geom.Pt{X: 5, Y: 5})
	if rt.inLineEnds() == 0 {
		t.Fatalf("the hand-laid wire should end in line with b's: %v", rt.nets[a].cells)
	}
	rt.unline(false)
	if n := rt.inLineEnds(); n != 0 {
		t.Errorf("after unline %d run ends still in line", n)
	}
	g := &geom.Sheet{}
	for _, cl := range ly.cells {
		g.Symbols = append(g.Symbols, geom.Symbol{Ref: cl.ref, Box: cl.shape.Box, Pins: cl.shape.Pins})
	}
	rt.emit(g)
	r := check.Measure(g)
	if len(r.InLine)+len(r.EndsInLine) > 0 || r.Crossings > 0 || len(r.Connectivity) > 0 {
		t.Errorf("after unline: %s %v %v", r.Summary(), r.InLine, r.EndsInLine)
	}
}

// lay wires net id along the corners given, one straight run between each
// two (a test's hand-made wiring).
func (rt *router) lay(id int, corners ...geom.Pt) {
	net := int32(id + 1)
	nr := rt.nets[id]
	for i := 0; i+1 < len(corners); i++ {
		a, b := rt.index(corners[i]), rt.index(corners[i+1])
		for a != b {
			d := rt.dirBetween(a, rt.stepToward(a, b))
			n := rt.neighbour(a, d)
			rt.addArm(a, net, 1<<d)
			rt.addArm(n, net, 1<<opposite(d))
			nr.cells = append(nr.cells, a)
			a = n
		}
		nr.cells = append(nr.cells, b)
	}
	for _, p := range nr.pins {
		rt.addArm(p.cell, net, 1<<opposite(int(p.pin.Dir)))
	}
	nr.ok = true
}

// stepToward is the neighbour of a one step toward b on the same line.
func (rt *router) stepToward(a, b int) int {
	ax, ay, bx, by := a%rt.w, a/rt.w, b%rt.w, b/rt.w
	switch {
	case bx > ax:
		return a + 1
	case bx < ax:
		return a - 1
	case by > ay:
		return a + rt.w
	}
	return a - rt.w
}
