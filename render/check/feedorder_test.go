package check

import (
	"testing"

	"pare/render/geom"
)

// feedSheet is one valve V1 (grid on in, anode on a) at x 10 and a
// transformer T1 with its primary on the anode net at (tx, ty); tuned puts
// a gang section VC1 on T1's secondary; diode makes V1 a diode (no grid).
func feedSheet(tx, ty float64, tuned, diode bool) *geom.Sheet {
	return feedSheetOn("a", tx, ty, tuned, diode)
}

// feedSheetOn is feedSheet with the anode and T1's primary on net out.
func feedSheetOn(anode string, tx, ty float64, tuned, diode bool) *geom.Sheet {
	sym := func(ref, kind string, x, y float64, pins ...string) geom.Symbol {
		s := geom.Symbol{Ref: ref, Kind: kind, Box: geom.R(x-2, y-2, x+2, y+2)}
		for i := 0; i+1 < len(pins); i += 2 {
			s.Pins = append(s.Pins, geom.Pin{Name: pins[i], Net: pins[i+1], At: geom.Pt{X: x, Y: y}})
		}
		return s
	}
	v := sym("V1", "valve", 10, 0, "a", anode, "g1", "in", "k", "gnd")
	if diode {
		v = sym("V1", "valve", 10, 0, "a", anode, "k", "gnd")
	}
	g := &geom.Sheet{
		Symbols: []geom.Symbol{v, sym("T1", "transformer", tx, ty, "p1", anode, "p2", "ht", "s1", "out", "s2", "gnd")},
		Locals:  []geom.Local{{Kind: geom.LocalGround, Net: "gnd"}, {Kind: geom.LocalRail, Net: "ht"}},
	}
	if tuned {
		g.Symbols = append(g.Symbols, geom.Symbol{Ref: "VC1", Kind: "capacitor", Type: "variable",
			Pins: []geom.Pin{{Name: "1", Net: "out"}, {Name: "2", Net: "gnd"}}})
	}
	return g
}

// TestFeedOrder: signal flows left to right, so a transformer fed by a
// device's output stands right of it (common practice); FeedOrder names one
// drawn left or over it, level with it, and leaves out a gang-tuned coil
// (an oscillator's, drawn below), a diode's anode (an input) and a part on
// another row.
func TestFeedOrder(t *testing.T) {
	cases := []struct {
		name         string
		tx, ty       float64
		tuned, diode bool
		want         int
	}{
		{"right of the valve", 30, 0, false, false, 0},
		{"left of the valve", -10, 0, false, false, 1},
		{"over the valve", 11, 0, false, false, 1},
		{"left, a little lower", -10, 5, false, false, 1},
		{"left, on another row", -10, 40, false, false, 0},
		{"left, gang-tuned", -10, 0, true, false, 0},
		{"left of a diode", -10, 0, false, true, 0},
	}
	// an output on a rail feeds every part there: no order to read
	r := &Report{}
	r.feedOrder(feedSheetOn("ht", -10, 0, false, false))
	if len(r.FeedOrder) != 0 {
		t.Errorf("output on a rail: %v, want none", r.FeedOrder)
	}
	for _, c := range cases {
		r := &Report{}
		r.feedOrder(feedSheet(c.tx, c.ty, c.tuned, c.diode))
		if len(r.FeedOrder) != c.want {
			t.Errorf("%s: %d findings %v, want %d", c.name, len(r.FeedOrder), r.FeedOrder, c.want)
		}
	}
}
