package check

import (
	"testing"

	"pare/render/geom"
)

// TestLooseEnds: a pin alone on its net is a loose end unless a wire leaves
// it or a local symbol of its net ends its lead; a pin on "nc" is a bare
// lead the format asks for. Hand-drawn cases, counted by eye.
func TestLooseEnds(t *testing.T) {
	gnd := geom.Local{Kind: geom.LocalGround, Net: "gnd", Owner: "T1", Pin: "s2",
		Stub: []geom.Seg{seg(14, 0, 14, 1)}, At: geom.Pt{X: 14, Y: 1}, Box: geom.R(13.3, 1, 14.7, 1.55), Down: true}
	cases := []struct {
		name   string
		net    string
		wires  []geom.Wire
		locals []geom.Local
		want   int
	}{
		{"alone, nothing drawn", "free", nil, nil, 1},
		{"alone, a wire to nowhere", "free", []geom.Wire{wire("free", seg(14, 0, 16, 0))}, nil, 0},
		{"alone on ground, its earth drawn", "gnd", nil, []geom.Local{gnd}, 0},
		{"not connected", "nc", nil, nil, 0},
	}
	for _, c := range cases {
		g := clean()
		g.Symbols[0].Pins[0].Net = notConnected // R1's far end out of the way
		g.Symbols[1].Pins[1].Net = c.net
		g.Wires = append(g.Wires, c.wires...)
		g.Locals = c.locals
		if got := len(Measure(g).LooseEnds); got != c.want {
			t.Errorf("%s: %d loose ends, want %d: %v", c.name, got, c.want, Measure(g).LooseEnds)
		}
	}
}

// TestEarthsFacing: an earth whose bars stop less than a grid step short
// of another net's wire, across their width, faces it; a wire beside the
// bars, a step or more past them, or of the earth's own net does not.
func TestEarthsFacing(t *testing.T) {
	cases := []struct {
		name string
		net  string
		wire geom.Seg
		want int
	}{
		{"wire on the next grid line under the bars", "hot", seg(-5, 1, 5, 1), 1},
		{"wire end on under the bars", "hot", seg(0, 1, 0, 4), 1},
		{"wire two grid lines down", "hot", seg(-5, 2, 5, 2), 0},
		{"wire beside the bars", "hot", seg(2, -1, 2, 4), 0},
		{"its own net", "gnd", seg(-5, 1, 5, 1), 0},
	}
	for _, c := range cases {
		g := &geom.Sheet{
			Locals: []geom.Local{{Kind: geom.LocalGround, Net: "gnd", Owner: "T1", Pin: "l2",
				Stub: []geom.Seg{seg(3, -1, 0, -1), seg(0, -1, 0, 0)}, At: geom.Pt{}, Box: geom.R(-0.7, 0, 0.7, 0.55), Down: true}},
			Wires: []geom.Wire{wire(c.net, c.wire)},
		}
		var r Report
		r.earthsFacing(g, sheetSegs(g))
		if len(r.EarthsFacing) != c.want {
			t.Errorf("%s: %v, want %d", c.name, r.EarthsFacing, c.want)
		}
	}
}
