package layout

import (
	"testing"

	"pare/graph"
	"pare/render/geom"
)

// TestValveLeadsGoRound: a wire of net a runs from a part's pin to a pin
// thirty steps right of it, and net b's wire stands across its way, from
// twenty steps above to twenty below; b is also on a second pin of the
// part. Going round b costs a wire about sixty steps more. Where the part
// is a generic one the search crosses b (a crossing is priced at thirty
// steps); where it is a valve and a and b are its anode and cathode it goes
// round: a reader takes a valve's anode lead across its own cathode lead
// for a tangle round the valve (review19 a04, a05; common practice: the
// leads of one part leave it without crossing each other). The search
// stays the cheapest wire with the price in (TestSearchFindsTheCheapestWire's
// reference search prices it too).
func TestValveLeadsGoRound(t *testing.T) {
	for _, tc := range []struct {
		name  string
		kind  graph.Kind
		cross bool
	}{
		{"generic part", graph.Generic, true},
		{"valve's anode and cathode", graph.Valve, false},
	} {
		ly := handSheet(
			box{"V1", geom.R(-2, -1, 0, 1), []geom.Pin{pinAt("a", 0, 0, geom.Right), pinAt("b", -1, 1, geom.Down)}},
			box{"A2", geom.R(30, -1, 32, 1), []geom.Pin{pinAt("a", 30, 0, geom.Left)}},
			box{"B1", geom.R(14, -22, 16, -20), []geom.Pin{pinAt("b", 15, -20, geom.Down)}},
			box{"B2", geom.R(14, 20, 16, 22), []geom.Pin{pinAt("b", 15, 20, geom.Up)}},
		)
		ly.o.LeadsApart = true // a full or faded sheet
		v := ly.cells[0]
		v.part.Kind = tc.kind
		v.part.Pins[0].Name, v.part.Pins[1].Name = "a", "k"
		v.shape.Pins[0].Name, v.shape.Pins[1].Name = "a", "k"
		rt := newRouter(ly, &scratch{})
		for y := -20; y <= 20; y++ {
			rt.addArm(rt.index(geom.Pt{X: 15, Y: float64(y)}), 2, armN|armS) // nets by name: a 1, b 2
		}
		nr := rt.nets[0]
		from, to := nr.pins[0], nr.pins[1]
		rt.addArm(to.cell, 1, 1<<opposite(int(to.pin.Dir)))
		tree := rt.cellRect(to.cell)
		win := rt.window(tree, from, 1<<20)
		path := rt.search(1, from, tree, win)
		if path == nil {
			t.Fatalf("%s: no wire", tc.name)
		}
		crossed := false
		for _, c := range path {
			crossed = crossed || rt.owns(c, 2)
		}
		if crossed != tc.cross {
			t.Errorf("%s: wire crosses b %v, want %v", tc.name, crossed, tc.cross)
		}
		if got, want := rt.pathCost(1, from, path), rt.dijkstra(1, from, win); got != want {
			t.Errorf("%s: search found a wire of cost %d, the cheapest costs %d", tc.name, got, want)
		}
	}
}
