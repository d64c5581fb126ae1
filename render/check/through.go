package check

import (
	"fmt"
	"math"
	"slices"

	"pare/render/geom"
)

// deviceKinds are the symbol kinds a reader looks through: a valve's or a
// transistor's body is small beside its leads, so a wire coming in on one
// side and another leaving on the same line on the far side read as one
// wire running through the device (review21 a01: a cathode follower's
// output left its valve to the right at the grid line's height, and the
// grid line seemed to run through the valve into the coupling capacitor).
var deviceKinds = map[string]bool{"valve": true, "bjt": true, "fet": true}

// throughReach is how far from a device's box, in grid steps, a wire end
// on its line still reads as the line carried through it: with nothing
// else on the line the eye carries it on well past the in-line gap of two
// bare wire ends (inLineGap), since the device between them reads as a
// joint on the line rather than a break of it; three device widths (a
// valve's or transistor's box is about five steps) is taken as the reach
// (from looking at the sheets: review13 b01's oscillator collector rising
// to its base line 13 steps from the transistor reads as the base line
// carried on).
const throughReach = 15

// ThroughDevices lists the devices of a sheet with two different nets'
// horizontal wires on one line through them: one ending at (or within
// throughReach of) the box's left side, the other starting at (or within
// throughReach of) its right side, one of them at a pin of the device, and
// no other symbol on the line between either end and the box. The list is
// sorted, one line per device and line.
func ThroughDevices(g *geom.Sheet) []string {
	var out []string
	for i, d := range g.Symbols {
		if !deviceKinds[d.Kind] {
			continue
		}
		for _, y := range throughLines(g, i) {
			out = append(out, fmt.Sprintf("%s: wires of %s and %s in line through it at y %g", d.Ref, y.left, y.right, y.at))
		}
	}
	slices.Sort(out)
	return slices.Compact(out)
}

type throughLine struct {
	left, right string
	at          float64
}

// throughLines finds the lines through device g.Symbols[i]: for each
// horizontal segment ending left of the box, inside its height, the
// nearest segment of another net starting right of it on the same line.
func throughLines(g *geom.Sheet, i int) []throughLine {
	d := g.Symbols[i]
	b := d.Box
	var lefts, rights []netSeg
	for _, w := range g.Wires {
		for _, s := range w.Segs {
			if !s.Horizontal() || s.A.Y <= b.Y0+geom.Eps || s.A.Y >= b.Y1-geom.Eps {
				continue
			}
			lo, hi := math.Min(s.A.X, s.B.X), math.Max(s.A.X, s.B.X)
			switch {
			case hi <= b.X0+geom.Eps && hi >= b.X0-throughReach-geom.Eps:
				lefts = append(lefts, netSeg{net: w.Net, seg: geom.Seg{A: geom.Pt{X: lo, Y: s.A.Y}, B: geom.Pt{X: hi, Y: s.A.Y}}})
			case lo >= b.X1-geom.Eps && lo <= b.X1+throughReach+geom.Eps:
				rights = append(rights, netSeg{net: w.Net, seg: geom.Seg{A: geom.Pt{X: lo, Y: s.A.Y}, B: geom.Pt{X: hi, Y: s.A.Y}}})
			}
		}
	}
	var out []throughLine
	for _, l := range lefts {
		for _, r := range rights {
			y := l.seg.A.Y
			if math.Abs(r.seg.A.Y-y) > geom.Eps || l.net == r.net || l.net == notConnected || r.net == notConnected {
				continue
			}
			lp, rp := onPin(d, l.net, l.seg.B), onPin(d, r.net, r.seg.A)
			if !lp && !rp || lp && rp && d.Kind == "valve" && !gridded(d) {
				continue // a wire passing by; a diode drawn in series, as it works
			}
			if parted(g, i, l.seg.B.X, b.X0, y) || parted(g, i, b.X1, r.seg.A.X, y) {
				continue
			}
			out = append(out, throughLine{left: l.net, right: r.net, at: y})
		}
	}
	return out
}

// onPin says whether d has a pin of net at p.
func onPin(d geom.Symbol, net string, p geom.Pt) bool {
	return slices.ContainsFunc(d.Pins, func(q geom.Pin) bool { return q.Net == net && near(q.At, p) })
}

// parted says whether a symbol other than g.Symbols[own] stands across the
// line y between x0 and x1: the eye then sees a part on the line, not one
// wire.
func parted(g *geom.Sheet, own int, x0, x1, y float64) bool {
	if x1-x0 < geom.Eps {
		return false
	}
	for j, s := range g.Symbols {
		if j == own {
			continue
		}
		r := s.Box
		if r.Y0 < y-geom.Eps && y+geom.Eps < r.Y1 && r.X0 < x1-geom.Eps && x0+geom.Eps < r.X1 {
			return true
		}
	}
	return false
}
