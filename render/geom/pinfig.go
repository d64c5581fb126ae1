package geom

import (
	"fmt"
	"math"
)

// A pin figure (an electrode's DC voltage printed small by its pin) is read
// as belonging to whatever wire it sits by. Two placements mislead a
// reader even when the text clears every wire: a figure in line with
// another net's wire, just past its end (review20 b01: Q1's base volts
// printed in the gap between the emitter's off-row connector and the base
// wire, read as the emitter fed to the base), and a figure with another net's wire
// between it and its own pin (it reads as that wire's). The layout refuses
// such spots and the checker counts them, by this one rule.

// figInLine is how far past another net's wire end, in grid units, a
// figure still reads as continuing that wire (two grid steps: the reader's
// gap of render/check's InLine, from memory of the reviews' complaints).
const figInLine = 2.0

// NetSeg is a drawn segment with the net it belongs to.
type NetSeg struct {
	Net string
	Seg
}

// NetSegs lists every wire segment and local symbol stub of g with its
// net, in drawing order.
func NetSegs(g *Sheet) []NetSeg {
	var out []NetSeg
	for _, w := range g.Wires {
		for _, s := range w.Segs {
			out = append(out, NetSeg{w.Net, s})
		}
	}
	for _, l := range g.Locals {
		for _, s := range l.Stub {
			out = append(out, NetSeg{l.Net, s})
		}
	}
	return out
}

// FigureAstray reports why a figure set in r for the pin whose tip is at
// tip, on net, reads as another wire's: in line past another net's wire
// end, or behind another net's wire crossing the straight way from the tip
// to the figure (the message names which); "" when it reads as its own
// pin's.
func FigureAstray(r Rect, tip Pt, net string, segs []NetSeg) string {
	q := Pt{math.Max(r.X0, math.Min(tip.X, r.X1)), math.Max(r.Y0, math.Min(tip.Y, r.Y1))}
	for _, s := range segs {
		if s.Net != net && endsTowards(s, r, segs) {
			return fmt.Sprintf("in line past the end of %s's wire %v", s.Net, s.Seg)
		}
		if crossesWay(s, tip, q, net) {
			return fmt.Sprintf("behind %s's wire %v", s.Net, s.Seg)
		}
	}
	return ""
}

// endsTowards reports whether r lies on the line of s, within figInLine
// past one of its ends, an end where the run stops (free, at a pin or at a
// junction), not a corner where it turns (the eye follows the bend).
func endsTowards(s NetSeg, r Rect, segs []NetSeg) bool {
	for _, e := range [2][2]Pt{{s.A, s.B}, {s.B, s.A}} {
		end, from := e[0], e[1]
		var gap float64
		switch {
		case isCorner(s, end, segs):
			continue
		case s.Horizontal() && (end.Y <= r.Y0+Eps || end.Y >= r.Y1-Eps):
			continue
		case !s.Horizontal() && (end.X <= r.X0+Eps || end.X >= r.X1-Eps):
			continue
		case end.X > from.X+Eps:
			gap = r.X0 - end.X
		case end.X < from.X-Eps:
			gap = end.X - r.X1
		case end.Y > from.Y+Eps:
			gap = r.Y0 - end.Y
		case end.Y < from.Y-Eps:
			gap = end.Y - r.Y1
		default: // a point: no direction to continue in
			continue
		}
		if gap >= -Eps && gap <= figInLine {
			return true
		}
	}
	return false
}

// crossesWay reports whether a wire of another net than the pin's meets
// the straight way from tip to q away from the tip, across it or along it
// (a wire of the pin's own net between them still reads as the pin's).
func crossesWay(s NetSeg, tip, q Pt, net string) bool {
	const atTip = 0.05
	b := s.Box()
	way := R(tip.X, tip.Y, q.X, q.Y)
	if s.Net == net || !s.Touches(way) {
		return false
	}
	if s.Horizontal() {
		if math.Abs(q.Y-tip.Y) < Eps { // the way runs along the wire's line
			return Overlap(b.X0, b.X1, way.X0, way.X1) > atTip
		}
		t := (b.Y0 - tip.Y) / (q.Y - tip.Y)
		x := tip.X + t*(q.X-tip.X)
		return x >= b.X0-Eps && x <= b.X1+Eps && math.Hypot(x-tip.X, b.Y0-tip.Y) > atTip
	}
	if math.Abs(q.X-tip.X) < Eps {
		return Overlap(b.Y0, b.Y1, way.Y0, way.Y1) > atTip
	}
	t := (b.X0 - tip.X) / (q.X - tip.X)
	y := tip.Y + t*(q.Y-tip.Y)
	return y >= b.Y0-Eps && y <= b.Y1+Eps && math.Hypot(b.X0-tip.X, y-tip.Y) > atTip
}

// isCorner reports whether the only other segment of s's net at end is
// one at right angles that ends there too: the wire bends at end.
func isCorner(s NetSeg, end Pt, segs []NetSeg) bool {
	others, bend := 0, false
	for _, o := range segs {
		if o.Net != s.Net || o.Seg == s.Seg || !o.HasPoint(end) {
			continue
		}
		others++
		bend = o.Horizontal() != s.Horizontal() && (o.A == end || o.B == end)
	}
	return others == 1 && bend
}
