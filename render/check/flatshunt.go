package check

import (
	"fmt"
	"math"

	"pare/render/geom"
)

// A two-terminal part with one end on a return (chassis, a rail, a bias
// point bypassed to chassis) and the other on a signal net is a shunt. The
// trade draws it standing off the signal row towards its return; drawn
// lying in the row, a wire leaving each end along the row's line, it sits
// in line between two parts and reads as a series part (review21 a03: the
// detector's IF bypasses, returned to the double-diode-triode's bypassed
// cathode, read as series capacitors).

// FlatShunts lists the resistors and capacitors of g with one pin on a net
// isReturn accepts and the other on a net it does not, both pins on one
// horizontal line, and a wire of each pin's net leaving that pin
// horizontally away from the part: the part lies in line in the row.
func FlatShunts(g *geom.Sheet, isReturn func(net string) bool) []string {
	var out []string
	for _, s := range g.Symbols {
		if s.Kind != "resistor" && s.Kind != "capacitor" || len(s.Pins) != 2 {
			// a diode or choke to a rail is a rectifier's or a feed's
			// series part, drawn along its flow
			continue
		}
		a, b := s.Pins[0], s.Pins[1]
		if isReturn(a.Net) == isReturn(b.Net) || math.Abs(a.At.Y-b.At.Y) >= geom.Eps || math.Abs(a.At.X-b.At.X) < geom.Eps {
			continue
		}
		if leavesAlong(g, a, b.At.X) && leavesAlong(g, b, a.At.X) {
			out = append(out, fmt.Sprintf("%s (%s–%s) lies in the row at %s", s.Ref, a.Net, b.Net, pt(a.At)))
		}
	}
	return out
}

// leavesAlong says whether a wire of p's net runs horizontally from p away
// from the part's other pin, at x other.
func leavesAlong(g *geom.Sheet, p geom.Pin, other float64) bool {
	away := 1.0
	if other > p.At.X {
		away = -1
	}
	for _, w := range g.Wires {
		if w.Net != p.Net {
			continue
		}
		for _, sg := range w.Segs {
			if !sg.Horizontal() || degenerate(sg) || math.Abs(sg.A.Y-p.At.Y) >= geom.Eps {
				continue
			}
			lo, hi := math.Min(sg.A.X, sg.B.X), math.Max(sg.A.X, sg.B.X)
			if lo > p.At.X+geom.Eps || hi < p.At.X-geom.Eps {
				continue
			}
			if away > 0 && hi > p.At.X+geom.Eps || away < 0 && lo < p.At.X-geom.Eps {
				return true
			}
		}
	}
	return false
}
