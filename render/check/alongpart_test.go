package check

import (
	"strings"
	"testing"

	"pare/render/geom"
)

// Hand-worked geometry (squared paper): R1 lies from (0,0) to (4,0), its
// pins on nets a and n, each wired out along y=0; a further wire runs
// beside it or not (review18 b04: the base wire under the feedback
// resistor, read as a strap across it).
func TestWireBesidePartItsOwn(t *testing.T) {
	cases := []struct {
		name  string
		extra geom.Wire
		want  bool
	}{
		{"its own net a step under it, end to end", wire("n", seg(-1, 1, 4, 1), seg(4, 1, 4, 0)), true},
		{"its own net two steps over it, most of it", wire("a", seg(0, -2, 3, -2), seg(0, 0, 0, -2)), true},
		{"its own net three steps under it", wire("n", seg(-1, 3, 4, 3), seg(4, 3, 4, 0)), false},
		{"its own net under a third of it", wire("n", seg(3, 1, 5, 1), seg(5, 1, 5, 0)), false},
		{"another net a step under it (Beside's to count)", wire("m", seg(-1, 1, 5, 1)), false},
		{"its own net at right angles", wire("n", seg(2, 1, 2, 5)), false},
	}
	for _, c := range cases {
		g := &geom.Sheet{
			Symbols: []geom.Symbol{{Ref: "R1", Kind: "resistor", Box: geom.Rect{X0: 0, Y0: -0.6, X1: 4, Y1: 0.6},
				Pins: []geom.Pin{pin("1", "a", 0, 0, geom.Left), pin("2", "n", 4, 0, geom.Right)}}},
			Wires: []geom.Wire{wire("n", seg(4, 0, 10, 0)), wire("a", seg(-3, 0, 0, 0)), c.extra},
		}
		got := Measure(g).AlongParts
		if c.want != (len(got) == 1 && strings.Contains(got[0], "beside R1")) || len(got) > 1 {
			t.Errorf("%s: want a finding %v, got %q", c.name, c.want, got)
		}
	}
}

// Q1's emitter pin at (0,2) is wired down to (0,6) and on right to (4,6);
// a wire of another net crosses the first run (on the lead: a finding) or
// the second (past the lead's bend: none).
func TestCrossingOnCommonLead(t *testing.T) {
	cases := []struct {
		name  string
		cross geom.Wire
		want  bool
	}{
		{"across the emitter's run", wire("mid", seg(-3, 4, 3, 4)), true},
		{"across the run after the bend", wire("mid", seg(2, 3, 2, 9)), false},
	}
	for _, c := range cases {
		g := &geom.Sheet{
			Symbols: []geom.Symbol{{Ref: "Q1", Kind: "bjt", Box: geom.Rect{X0: -2, Y0: -2, X1: 1, Y1: 2},
				Pins: []geom.Pin{pin("b", "b", -2, 0, geom.Left), pin("c", "c", 0, -2, geom.Up), pin("e", "e", 0, 2, geom.Down)}}},
			Wires: []geom.Wire{wire("e", seg(0, 2, 0, 6), seg(0, 6, 4, 6)), c.cross},
		}
		got := Measure(g).CommonLeads
		if c.want != (len(got) == 1 && strings.Contains(got[0], "Q1's e lead")) || len(got) > 1 {
			t.Errorf("%s: want a finding %v, got %q", c.name, c.want, got)
		}
	}
}
