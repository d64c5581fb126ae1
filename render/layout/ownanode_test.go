package layout

import (
	"testing"

	"pare/graph"
	"pare/render/geom"
)

// TestConnectorPastOwnAnode: a valve's injector grid (g3) leads to an
// off-row connector at the right edge, level with its pin; the valve's
// anode leaves upward and comes down to its load (T1) right of the valve.
// A run level with the grid's pin would cross the anode lead (common
// practice, from memory: the leads of one valve leave it without crossing
// each other), so the connector's level goes below the foot of every part
// between the pin and the edge; when the load stands above the run, the
// pin is the anode itself, the part no valve, or the edge the left one
// (nothing of the anode's between), the level stays.
func TestConnectorPastOwnAnode(t *testing.T) {
	for _, tc := range []struct {
		name  string
		kind  graph.Kind
		pin   string  // the V1 pin on the connector's net
		loadY float64 // the level of the load's pin on the anode's net
		left  bool
		moved bool
	}{
		{"grid, load below the run", graph.Valve, "g3", 2, false, true},
		{"grid, load above the run", graph.Valve, "g3", -2, false, false},
		{"anode's own connector", graph.Valve, "a", 2, false, false},
		{"generic part", graph.Generic, "g3", 2, false, false},
		{"left edge, load on the right", graph.Valve, "g3", 2, true, false},
	} {
		ly := handSheet(
			box{"V1", geom.R(-2, -4, 0, 3), []geom.Pin{pinAt("a", -1, -4, geom.Up), pinAt("x", 0, 0, geom.Right)}},
			box{"T1", geom.R(8, 2, 10, 9), []geom.Pin{pinAt("a", 9, tc.loadY, geom.Up)}},
		)
		v := ly.cells[0]
		v.part.Kind = tc.kind
		v.part.Pins[0].Name, v.shape.Pins[0].Name = "a", "a"
		v.part.Pins[1].Name, v.shape.Pins[1].Name = "g3", "g3"
		net, y := "x", 0.0
		if tc.pin == "a" {
			net, y = "a", -5
		}
		got := ly.pastOwnAnode(net, y, tc.left)
		if moved := got != y; moved != tc.moved {
			t.Errorf("%s: level %v from %v, want moved %v", tc.name, got, y, tc.moved)
		}
		if tc.moved && got < 9+rowGap {
			t.Errorf("%s: level %v not below the load's foot 9", tc.name, got)
		}
	}
}
