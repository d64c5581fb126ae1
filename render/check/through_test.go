package check

import (
	"testing"

	"pare/render/geom"
)

// Hand-worked geometry (squared paper, one unit a grid step): a triode V1
// boxed (10,-3)-(15,3), grid pin g on net "g" at its left side (10,0),
// anode on "a" at the top (12.5,-3), cathode on "k" at the bottom
// (12.5,3). The cases place the cathode's wire (or another net's) on the
// grid's line on the far side; the expected counts are worked by hand
// from the rule (throughReach 15 steps, nothing else on the line).
func TestThroughDevices(t *testing.T) {
	triode := geom.Symbol{Ref: "V1", Kind: "valve", Box: geom.Rect{X0: 10, Y0: -3, X1: 15, Y1: 3}, Pins: []geom.Pin{
		pin("g", "g", 10, 0, geom.Left), pin("a", "a", 12.5, -3, geom.Up), pin("k", "k", 12.5, 3, geom.Down)}}
	diode := geom.Symbol{Ref: "V2", Kind: "valve", Box: geom.Rect{X0: 10, Y0: -3, X1: 15, Y1: 3}, Pins: []geom.Pin{
		pin("a", "g", 10, 0, geom.Left), pin("k", "k", 15, 0, geom.Right)}}
	grid := wire("g", seg(0, 0, 10, 0))
	cap1 := sym("C1", 17, -1, 19, 1)
	cases := []struct {
		name  string
		dev   geom.Symbol
		more  []geom.Symbol
		wires []geom.Wire
		want  int
	}{
		// review21 a01: the cathode wire comes up to the grid's height six
		// steps right of the valve and runs on right
		{"cathode out on the grid's line", triode, nil,
			[]geom.Wire{grid, wire("k", seg(12.5, 3, 12.5, 5), seg(12.5, 5, 21, 5), seg(21, 5, 21, 0), seg(21, 0, 40, 0))}, 1},
		{"cathode out a step lower", triode, nil,
			[]geom.Wire{grid, wire("k", seg(12.5, 3, 12.5, 5), seg(12.5, 5, 21, 5), seg(21, 5, 21, 1), seg(21, 1, 40, 1))}, 0},
		{"cathode wire beyond the reach", triode, nil,
			[]geom.Wire{grid, wire("k", seg(12.5, 3, 12.5, 5), seg(12.5, 5, 31, 5), seg(31, 5, 31, 0), seg(31, 0, 40, 0))}, 0},
		{"a capacitor stands on the line between", triode, []geom.Symbol{cap1},
			[]geom.Wire{grid, wire("k", seg(12.5, 3, 12.5, 5), seg(12.5, 5, 21, 5), seg(21, 5, 21, 0), seg(21, 0, 40, 0))}, 0},
		// neither wire is V1's lead: two nets passing its sides
		{"no lead of the device on the line", triode, nil,
			[]geom.Wire{wire("x", seg(0, 1, 9, 1)), wire("y", seg(16, 1, 30, 1))}, 0},
		// a diode in series reads as it works: anode in, cathode out
		{"a diode drawn in series", diode, nil,
			[]geom.Wire{grid, wire("k", seg(15, 0, 30, 0))}, 0},
	}
	for _, c := range cases {
		g := &geom.Sheet{Symbols: append([]geom.Symbol{c.dev}, c.more...), Wires: c.wires}
		if got := ThroughDevices(g); len(got) != c.want {
			t.Errorf("%s: %d lines through a device (%q), want %d", c.name, len(got), got, c.want)
		}
	}
}
