package check

import (
	"testing"

	"pare/render/geom"
)

// Hand-worked geometry (squared paper): two outgoing connectors at a right
// edge, x = 20, their pins facing left; R1's pin on net p at (10,0), R2's
// on net q at (10,6).
func TestConnectorWires(t *testing.T) {
	conn := func(net string, y float64) geom.Symbol {
		return sym(geom.ConnectorTo+net, 20, y-0.8, 25, y+0.8, pin("1", net, 20, y, geom.Left))
	}
	parts := []geom.Symbol{
		{Ref: "R1", Kind: "resistor", Box: geom.Rect{X0: 6, Y0: -0.6, X1: 10, Y1: 0.6}, Pins: []geom.Pin{pin("2", "p", 10, 0, geom.Right)}},
		{Ref: "R2", Kind: "resistor", Box: geom.Rect{X0: 6, Y0: 5.4, X1: 10, Y1: 6.6}, Pins: []geom.Pin{pin("2", "q", 10, 6, geom.Right)}},
	}
	cases := []struct {
		name             string
		pyConn, qyConn   float64
		p, q             geom.Wire
		crossings, loops int
	}{
		{"each straight to its own level", 0, 6,
			wire("p", seg(10, 0, 20, 0)), wire("q", seg(10, 6, 20, 6)), 0, 0},
		// stacked in the wrong order: p's connector under q's, the wires
		// cross on the way (review16 b03's right edge)
		{"stacked against their nets' order", 6, 0,
			wire("p", seg(10, 0, 15, 0), seg(15, 0, 15, 6), seg(15, 6, 20, 6)),
			wire("q", seg(10, 6, 14, 6), seg(14, 6, 14, 3), seg(14, 3, 16, 3), seg(16, 3, 16, 0), seg(16, 0, 20, 0)), 1, 0},
		// p's wire runs out past its connector to x = 27 and back in
		// (review16 a04's grid wire round the connector above)
		{"a wire round its connector", 0, 6,
			wire("p", seg(10, 0, 12, 0), seg(12, 0, 12, -3), seg(12, -3, 27, -3), seg(27, -3, 27, -1), seg(27, -1, 21, -1), seg(21, -1, 21, 0), seg(21, 0, 20, 0)),
			wire("q", seg(10, 6, 20, 6)), 0, 1},
	}
	for _, c := range cases {
		g := &geom.Sheet{Symbols: append(append([]geom.Symbol{}, parts...), conn("p", c.pyConn), conn("q", c.qyConn)), Wires: []geom.Wire{c.p, c.q}}
		xs, ls := ConnectorWires(g)
		if len(xs) != c.crossings || len(ls) != c.loops {
			t.Errorf("%s: %d crossings, %d loops (%q, %q); want %d and %d", c.name, len(xs), len(ls), xs, ls, c.crossings, c.loops)
		}
	}
}
