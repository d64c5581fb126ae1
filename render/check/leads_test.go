package check

import (
	"strings"
	"testing"

	"pare/render/geom"
)

// Hand-worked geometry (squared paper): R1 lies from (0,0) to (4,0) with
// its pins on nets a and n; a wire of a runs along y=0 to its left pin and
// on down; a wire crosses net n's wire at x = 4 + d.
func TestCrossingNearAPin(t *testing.T) {
	cases := []struct {
		name  string
		cross geom.Wire
		want  string // "" for no finding
	}{
		// the triode's anode wire across its anode load's HT lead a step
		// from the resistor (review16 a03)
		{"the part's other net a step from its pin", wire("a", seg(5, -3, 5, 3)), "R1 reads as shorted"},
		{"another net a step from its pin", wire("m", seg(5, -3, 5, 3)), "R1 reads as joined there"},
		{"two steps from its pin", wire("a", seg(6, -3, 6, 3)), "R1 reads as shorted"},
		{"three steps from its pin", wire("a", seg(7, -3, 7, 3)), ""},
	}
	for _, c := range cases {
		g := &geom.Sheet{
			Symbols: []geom.Symbol{{Ref: "R1", Kind: "resistor", Box: geom.Rect{X0: 0, Y0: -0.6, X1: 4, Y1: 0.6},
				Pins: []geom.Pin{pin("1", "a", 0, 0, geom.Left), pin("2", "n", 4, 0, geom.Right)}}},
			Wires: []geom.Wire{wire("n", seg(4, 0, 10, 0)), wire("a", seg(-3, 0, 0, 0)), c.cross},
		}
		got := Measure(g).NearPins
		switch {
		case c.want == "" && len(got) != 0:
			t.Errorf("%s: want no finding, got %q", c.name, got)
		case c.want != "" && (len(got) != 1 || !strings.Contains(got[0], c.want)):
			t.Errorf("%s: want one finding with %q, got %q", c.name, c.want, got)
		}
	}
}
