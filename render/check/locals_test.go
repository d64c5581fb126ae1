package check

import (
	"testing"

	"pare/render/geom"
)

// TestLocalsNear: an earth whose bars end half a step or less from another
// net's junction dot sits on it; one step and more away it is clear; within
// a step it is near. The distances are this checker's own rule (a grid
// step reads as touching at print size, common practice for drawings).
func TestLocalsNear(t *testing.T) {
	cases := []struct {
		name     string
		gap      float64 // from the earth's lowest bar to the other net's wire
		on, near int
	}{
		{"on the dot", 0.45, 1, 0},
		{"touching the wire", 0, 1, 0},
		{"within a step", 0.8, 0, 1},
		{"clear", 1.5, 0, 0},
	}
	for _, c := range cases {
		y := 0.55 + c.gap
		g := &geom.Sheet{
			Locals: []geom.Local{{Kind: geom.LocalGround, Net: "gnd", Owner: "T1", Pin: "h2",
				Stub: []geom.Seg{{A: geom.Pt{X: 0, Y: -1}, B: geom.Pt{X: 0, Y: 0}}}, At: geom.Pt{X: 0, Y: 0}, Box: geom.R(-0.7, 0, 0.7, 0.55), Down: true}},
			Wires: []geom.Wire{{Net: "pri_l", Segs: []geom.Seg{{A: geom.Pt{X: -5, Y: y}, B: geom.Pt{X: 0, Y: y}}, {A: geom.Pt{X: 0, Y: y}, B: geom.Pt{X: 0, Y: y + 3}}, {A: geom.Pt{X: 0, Y: y}, B: geom.Pt{X: 5, Y: y}}}}},
			Dots:  []geom.Pt{{X: 0, Y: y}},
		}
		var r Report
		r.localsNear(g, sheetSegs(g))
		if len(r.LocalsOn) < c.on || (c.on == 0 && len(r.LocalsOn) > 0) || (c.on == 0 && len(r.LocalsNear) < c.near) || (c.near == 0 && c.on == 0 && len(r.LocalsNear) > 0) {
			t.Errorf("%s: on %v, near %v; want %d on, %d near", c.name, r.LocalsOn, r.LocalsNear, c.on, c.near)
		}
	}
}
