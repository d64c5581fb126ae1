package check

import (
	"fmt"
	"math"

	"pare/render/geom"
)

// A wire of one of a two-terminal part's own nets drawn beside the part,
// parallel and close, over most of its length, reads as a strap across it:
// the part looks shorted (review18 b04: the base wire of the driver ran
// under the feedback resistor R2 from its far end to its near one, and the
// reviewer read R2 as shunted by a wire).

// alongReach is how near, in grid steps, to the line through a part's two
// pins such a wire runs (beside the body, not on the lead), and alongCover
// how much of the span between the pins it runs along.
const (
	alongReach = 2.0
	alongCover = 0.6
)

// alongParts finds, for every two-terminal part whose pins lie on one
// horizontal or vertical line and on two nets, a wire of either net running
// parallel to that line within alongReach of it along alongCover of the
// span between the pins. One finding per part.
func (r *Report) alongParts(g *geom.Sheet) {
	for _, s := range g.Symbols {
		if s.Kind == "" || len(s.Pins) != 2 || s.Pins[0].Net == s.Pins[1].Net {
			continue
		}
		a, b := s.Pins[0].At, s.Pins[1].At
		horiz := math.Abs(a.Y-b.Y) < geom.Eps
		if !horiz && math.Abs(a.X-b.X) >= geom.Eps {
			continue
		}
		lo, hi, at := math.Min(a.X, b.X), math.Max(a.X, b.X), a.Y
		if !horiz {
			lo, hi, at = math.Min(a.Y, b.Y), math.Max(a.Y, b.Y), a.X
		}
		if hi-lo < geom.Eps {
			continue
		}
		if w, ok := alongWire(g, s, horiz, lo, hi, at); ok {
			r.AlongParts = append(r.AlongParts, fmt.Sprintf("wire of %s runs beside %s (%s–%s) along %s", w, s.Ref, s.Pins[0].Net, s.Pins[1].Net, pt(geom.Pt{X: (a.X + b.X) / 2, Y: (a.Y + b.Y) / 2})))
		}
	}
}

// alongWire is the net of the first wire of the part's own nets that runs
// beside it (see alongParts).
func alongWire(g *geom.Sheet, s geom.Symbol, horiz bool, lo, hi, at float64) (string, bool) {
	for _, w := range g.Wires {
		if w.Net != s.Pins[0].Net && w.Net != s.Pins[1].Net {
			continue
		}
		for _, sg := range w.Segs {
			if sg.Horizontal() != horiz || degenerate(sg) {
				continue
			}
			bx := sg.Box()
			off, a0, a1 := bx.Y0, bx.X0, bx.X1
			if !horiz {
				off, a0, a1 = bx.X0, bx.Y0, bx.Y1
			}
			d := math.Abs(off - at)
			if d > geom.Eps && d <= alongReach+geom.Eps && geom.Overlap(a0, a1, lo, hi) >= alongCover*(hi-lo) {
				return w.Net, true
			}
		}
	}
	return "", false
}
