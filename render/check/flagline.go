package check

import (
	"math"

	"pare/render/geom"
)

// flagBodies are the sheet's flags, ports and off-row connectors (one-pin
// symbols of kind port or of no part kind) as the line a reader sees them draw: from the pin to the
// tip, on the pin's axis, of the pin's net. A flag is drawn as a lead of
// its net running on to its point, so a wire of another net starting a
// step or two beyond the tip, in line, reads as the flag's net carried on
// (review19 b05: the tone control's feed began two steps past the
// extension speaker socket's flag, in line with it, and read as fed by
// it). Each carries its symbol's index (body) so that its own box does
// not count as a part parting the line.
func flagBodies(g *geom.Sheet) []netSeg {
	var out []netSeg
	for i, s := range g.Symbols {
		if s.Kind != "" && s.Kind != "port" || len(s.Pins) != 1 {
			continue
		}
		p, b := s.Pins[0], s.Box
		tip := geom.Pt{X: p.At.X, Y: b.Y0} // the pin points down: the tip is up
		switch p.Dir {
		case geom.Left:
			tip = geom.Pt{X: b.X1, Y: p.At.Y}
		case geom.Right:
			tip = geom.Pt{X: b.X0, Y: p.At.Y}
		case geom.Up:
			tip = geom.Pt{X: p.At.X, Y: b.Y1}
		}
		out = append(out, netSeg{net: p.Net, seg: geom.Seg{A: p.At, B: tip}, local: -1, body: i + 1})
	}
	return out
}

// atTip says whether the gap between two in-line segments opens at the tip
// of the flag among them (flagBodies draws a flag from its pin to its tip).
func atTip(gap geom.Seg, a, b netSeg) bool {
	for _, s := range []netSeg{a, b} {
		if s.body > 0 && (near(gap.A, s.seg.B) || near(gap.B, s.seg.B)) {
			return true
		}
	}
	return false
}

func near(p, q geom.Pt) bool { return math.Abs(p.X-q.X) < geom.Eps && math.Abs(p.Y-q.Y) < geom.Eps }
