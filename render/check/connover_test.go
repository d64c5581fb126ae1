package check

import (
	"testing"

	"pare/render/geom"
)

// Hand-worked geometry (squared paper, one unit a grid step): R1's pin on
// net p at (25,0); a stage frame from x 10 to 20. The counts follow from
// the rule by hand: a frame lying wholly between the connector and its
// run's far end, within overReach (4) steps of the run up or down.
func TestConnectorsOverFrames(t *testing.T) {
	r1 := geom.Symbol{Ref: "R1", Kind: "resistor", Box: geom.Rect{X0: 25, Y0: -0.6, X1: 29, Y1: 0.6}, Pins: []geom.Pin{pin("1", "p", 25, 0, geom.Left)}}
	in := sym(geom.ConnectorFrom+"p", 0, -0.8, 5, 0.8, pin("1", "p", 5, 0, geom.Right))
	out := sym(geom.ConnectorTo+"p", 31, -0.8, 36, 0.8, pin("1", "p", 31, 0, geom.Left))
	frame := func(y0, y1 float64) geom.Frame { return geom.Frame{Box: geom.Rect{X0: 10, Y0: y0, X1: 20, Y1: y1}} }
	cases := []struct {
		name string
		conn geom.Symbol
		w    geom.Wire
		fr   geom.Frame
		want int
	}{
		// review21 b04: the connector at the left margin, its wire over
		// the stage to the part on the right
		{"left connector, wire over the frame", in, wire("p", seg(5, 0, 25, 0)), frame(2, 10), 1},
		{"left connector, wire looped high over it", in, wire("p", seg(5, 0, 7, 0), seg(7, 0, 7, -3), seg(7, -3, 23, -3), seg(23, -3, 23, 0), seg(23, 0, 25, 0)), frame(-1, 10), 1},
		{"the frame well below the wire", in, wire("p", seg(5, 0, 25, 0)), frame(5, 12), 0},
		{"connector beside its pin", out, wire("p", seg(29, 0, 31, 0)), frame(-1, 10), 0},
	}
	for _, c := range cases {
		pinAt := r1
		if c.conn.Ref == out.Ref {
			pinAt.Pins = []geom.Pin{pin("2", "p", 29, 0, geom.Right)}
		}
		g := &geom.Sheet{Symbols: []geom.Symbol{pinAt, c.conn}, Wires: []geom.Wire{c.w}, Frames: []geom.Frame{c.fr}}
		if got := ConnectorsOverFrames(g); len(got) != c.want {
			t.Errorf("%s: %q, want %d findings", c.name, got, c.want)
		}
	}
}
