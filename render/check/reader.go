package check

import (
	"fmt"
	"math"

	"pare/render/geom"
)

// A reader takes two lines for one wire, or for a bus, when they are close
// or in line; these are the spacings below which a sheet misleads (common
// drafting practice: unrelated conductors are kept visibly apart, and a
// line is never continued by an unrelated one across a small gap).
const (
	// apartMin is the least distance, in grid steps, between parallel
	// wires of different nets that run beside each other.
	apartMin = 2.0
	// inLineGap is the longest gap, in grid steps, between the facing ends
	// of two collinear wires of different nets with nothing drawn between
	// them that still reads as one wire broken (a supply stub in line with
	// an input line 4.5 steps away was read as joined to it).
	inLineGap = 6.0
	// endGap is the longest gap, in grid steps, across which two
	// collinear wire ends read as one wire even with a part beside the gap
	// (only a part standing across the line parts them).
	endGap = 2.0
	// longWire is how many times its stage's width a net's wire may run
	// before it is reported as a long way round.
	longWire = 3.0
	// endNear is the distance, in grid steps, within which a wire passing
	// a symbol's end reads as joined to it.
	endNear = 1.0
	// dotClear is the least distance, in grid steps, between a crossing
	// and a junction dot of either crossing net: nearer, the crossing reads
	// as part of the junction (a wire crossing a base line a grid step
	// from its dot was read as joined to it).
	dotClear = 2.0
)

// misreadings finds wires a reader would take as joined: parallel wires of
// different nets closer than apartMin that overlap in extent (a bus or one
// thick line), collinear wires of different nets whose facing ends are
// less than inLineGap apart with no symbol between them (one wire), and,
// counted apart, those whose ends are endGap or less apart with a part
// only beside the gap (one wire all the same). Local
// symbols' stubs count as wire: a supply stub in line with a signal wire
// reads as the same line; so do flags and connectors (flagBodies), for
// the wires in line with them only.
func (r *Report) misreadings(segs []netSeg, boxes []box, bix *bucketed) {
	var six bucketed
	for i, s := range segs {
		six.add(i, s.seg.Box().Inset(inLineGap))
	}
	for i, a := range segs {
		for _, j := range six.near(a.seg.Box().Inset(inLineGap)) {
			b := segs[j]
			if j <= i || a.net == b.net || a.net == notConnected || b.net == notConnected || degenerate(a.seg) || degenerate(b.seg) {
				continue
			}
			gap, run := alongside(a.seg, b.seg)
			flag := a.body > 0 || b.body > 0
			switch {
			case !flag && gap > geom.Eps && gap < apartMin-geom.Eps && run > geom.Eps:
				r.Beside = append(r.Beside, fmt.Sprintf("wires of %s %s-%s and %s %s-%s run %g apart for %g", a.net, pt(a.seg.A), pt(a.seg.B), b.net, pt(b.seg.A), pt(b.seg.B), gap, run))
			case gap < geom.Eps && run < -geom.Eps && -run < inLineGap-geom.Eps && a.seg.Horizontal() == b.seg.Horizontal():
				gap := between(a.seg, b.seg)
				own := max(a.body, b.body) - 1 // a flag's own box ends its line, it does not part it
				switch {
				case flag && !atTip(gap, a, b):
					// a flag's pin end is a pin like any part's: the line
					// it draws runs on past its tip only
				case !blocked(gap, boxes, bix, own):
					r.InLine = append(r.InLine, fmt.Sprintf("wires of %s %s-%s and %s %s-%s lie in line %g apart", a.net, pt(a.seg.A), pt(a.seg.B), b.net, pt(b.seg.A), pt(b.seg.B), -run))
				case -run < endGap+geom.Eps && !crossed(gap, boxes, bix, own):
					r.EndsInLine = append(r.EndsInLine, fmt.Sprintf("wires of %s %s-%s and %s %s-%s end in line %g apart beside a part", a.net, pt(a.seg.A), pt(a.seg.B), b.net, pt(b.seg.A), pt(b.seg.B), -run))
				}
			}
		}
	}
}

// degenerate is a segment of no length (a pin tip wired to itself): it has
// no direction to be parallel or in line with anything.
func degenerate(s geom.Seg) bool {
	return math.Abs(s.A.X-s.B.X) < geom.Eps && math.Abs(s.A.Y-s.B.Y) < geom.Eps
}

// between is the open stretch between two collinear segments' facing ends,
// from a's end to b's.
func between(a, b geom.Seg) geom.Seg {
	ab, bb := a.Box(), b.Box()
	if a.Horizontal() {
		if ab.X1 < bb.X0 {
			return geom.Seg{A: geom.Pt{X: ab.X1, Y: ab.Y0}, B: geom.Pt{X: bb.X0, Y: ab.Y0}}
		}
		return geom.Seg{A: geom.Pt{X: ab.X0, Y: ab.Y0}, B: geom.Pt{X: bb.X1, Y: ab.Y0}}
	}
	if ab.Y1 < bb.Y0 {
		return geom.Seg{A: geom.Pt{X: ab.X0, Y: ab.Y1}, B: geom.Pt{X: ab.X0, Y: bb.Y0}}
	}
	return geom.Seg{A: geom.Pt{X: ab.X0, Y: ab.Y0}, B: geom.Pt{X: ab.X0, Y: bb.Y1}}
}

// blocked reports whether a symbol or local symbol stands in the gap (or at
// either end of it, as a part between two wires does): the eye then sees
// two wires meeting a part, not one wire. A part beside the gap, within a
// grid step, counts too: the wire ends read as its leads, unless the gap is
// short (crossed, below).
func blocked(gap geom.Seg, boxes []box, bix *bucketed, own int) bool {
	near := gap.Box().Inset(1)
	for _, j := range bix.near(near) {
		if j == own {
			continue
		}
		if b := boxes[j].r; near.X0 <= b.X1+geom.Eps && b.X0 <= near.X1+geom.Eps && near.Y0 <= b.Y1+geom.Eps && b.Y0 <= near.Y1+geom.Eps {
			return true
		}
	}
	return false
}

// crossed reports whether a symbol or local symbol stands across the gap's
// line inside the gap (a part between two wires, its leads ending them),
// or lies against the line along the whole gap (a transformer whose two
// windings' top leads end the wires). Across a gap of endGap steps or less
// nothing else parts the two wires: a capacitor hanging below the corner
// where one wire turns to it, or an earth symbol under a stub's end, does
// not stop the line reading on into a wire that starts a step or two
// further along (the blind reviewers read a screen line and a decoupling
// line meeting end to end at such a capacitor as one wire, and an earth
// stub as running on into the wire beyond it).
func crossed(gap geom.Seg, boxes []box, bix *bucketed, own int) bool {
	g := gap.Box()
	for _, j := range bix.near(g.Inset(geom.Eps)) {
		if j == own {
			continue
		}
		b := boxes[j].r
		lo, hi, at, b0, b1 := g.X0, g.X1, g.Y0, b.Y0, b.Y1 // along the gap; across it
		blo, bhi := b.X0, b.X1
		if !gap.Horizontal() {
			lo, hi, at, b0, b1, blo, bhi = g.Y0, g.Y1, g.X0, b.X0, b.X1, b.Y0, b.Y1
		}
		if blo > hi+geom.Eps || bhi < lo-geom.Eps || b0 > at+geom.Eps || b1 < at-geom.Eps {
			continue // off the gap
		}
		if (b0 < at-geom.Eps && at+geom.Eps < b1) || (blo <= lo+geom.Eps && hi <= bhi+geom.Eps) {
			return true
		}
	}
	return false
}

// longWires reports nets whose wire is more than longWire times as long as
// the widest stage frame holding one of the parts it joins: a wire taking
// a long way round a sheet (reported, not a fault: a feedback or a supply
// may have to).
func (r *Report) longWires(g *geom.Sheet) {
	width := map[string]float64{} // ref: the widest frame holding it
	for _, f := range g.Frames {
		for _, p := range f.Parts {
			width[p] = math.Max(width[p], f.Box.W())
		}
	}
	joins := map[string]float64{} // net: the widest frame of its parts
	for _, s := range g.Symbols {
		for _, p := range s.Pins {
			joins[p.Net] = math.Max(joins[p.Net], width[s.Ref])
		}
	}
	for _, w := range g.Wires {
		n := 0.0
		for _, s := range w.Segs {
			n += math.Abs(s.A.X-s.B.X) + math.Abs(s.A.Y-s.B.Y)
		}
		if wd := joins[w.Net]; wd > 0 && n > longWire*wd {
			r.LongWires = append(r.LongWires, fmt.Sprintf("wire of %s runs %g, %.1f times its stage's width %g", w.Net, n, n/wd, wd))
		}
	}
}

// MinTextMM is the smallest text height on paper, in millimetres: the
// smallest character height IEC 61082-1 and ISO 3098 allow on a drawing
// (taken as the font size).
const MinTextMM = 2.5

// TextHeights lists the labels of a sheet whose text would print smaller
// than minMM at mmPerUnit millimetres per grid unit (labels are set one
// grid unit high, small lines at smallScale of that), for a sheet put on
// paper.
func TextHeights(g *geom.Sheet, mmPerUnit, smallScale, minMM float64) []string {
	var out []string
	for _, l := range g.Labels {
		h := mmPerUnit
		if l.Small || len(l.Lines) > 1 {
			h *= smallScale // a second line is set small
		}
		if h < minMM-geom.Eps {
			out = append(out, fmt.Sprintf("label %q prints %.2f mm high, under %g mm", first(l.Lines), h, minMM))
		}
	}
	return out
}

// endsNear finds a symbol's end within a grid step of a wire of a net the
// symbol has no pin on: the eye joins a lead, a flag's tip or a body's side
// to a wire that close (a socket's flag whose tip stopped one step short of
// the tone control's wire read as feeding it). A symbol's ends are its pins
// and, on a side of its box with no pin, that side's middle (a flag's tip).
func (r *Report) endsNear(g *geom.Sheet, segs []netSeg) {
	var six bucketed
	for i, s := range segs {
		six.add(i, s.seg.Box())
	}
	for _, s := range g.Symbols {
		mine := map[string]bool{}
		for _, p := range s.Pins {
			mine[p.Net] = true
		}
		for _, e := range symbolEnds(s) {
			for _, j := range six.near(geom.Rect{X0: e.X, Y0: e.Y, X1: e.X, Y1: e.Y}.Inset(endNear)) {
				w := segs[j]
				if mine[w.net] || w.net == notConnected {
					continue
				}
				if d := pointSeg(e, w.seg); d > geom.Eps && d < endNear+geom.Eps {
					r.EndsNear = append(r.EndsNear, fmt.Sprintf("%s's end %s is %g from a wire of %s %s-%s", s.Ref, pt(e), d, w.net, pt(w.seg.A), pt(w.seg.B)))
					break
				}
			}
		}
	}
}

// symbolEnds are a symbol's pins and the middles of its box's sides that
// hold no pin.
func symbolEnds(s geom.Symbol) []geom.Pt {
	b := s.Box
	mid := []geom.Pt{{X: b.X0, Y: (b.Y0 + b.Y1) / 2}, {X: b.X1, Y: (b.Y0 + b.Y1) / 2}, {X: (b.X0 + b.X1) / 2, Y: b.Y0}, {X: (b.X0 + b.X1) / 2, Y: b.Y1}}
	side := func(p geom.Pt) int {
		switch {
		case math.Abs(p.X-b.X0) < geom.Eps:
			return 0
		case math.Abs(p.X-b.X1) < geom.Eps:
			return 1
		case math.Abs(p.Y-b.Y0) < geom.Eps:
			return 2
		case math.Abs(p.Y-b.Y1) < geom.Eps:
			return 3
		}
		return -1
	}
	pinned := [4]bool{}
	var out []geom.Pt
	for _, p := range s.Pins {
		out = append(out, p.At)
		if k := side(p.At); k >= 0 {
			pinned[k] = true
		}
	}
	for k, m := range mid {
		if !pinned[k] {
			out = append(out, m)
		}
	}
	return out
}

// pointSeg is the distance from p to the segment s.
func pointSeg(p geom.Pt, s geom.Seg) float64 {
	b := s.Box()
	x := math.Max(b.X0, math.Min(p.X, b.X1))
	y := math.Max(b.Y0, math.Min(p.Y, b.Y1))
	return math.Hypot(p.X-x, p.Y-y)
}

// nearDots finds crossings closer than dotClear to a junction dot of either
// crossing net.
func (r *Report) nearDots(g *geom.Sheet, segs []netSeg, xs []crossing) {
	var six, dix bucketed
	for i, s := range segs {
		six.add(i, s.seg.Box())
	}
	nets := make([]map[string]bool, len(g.Dots)) // the nets through each dot
	for i, d := range g.Dots {
		here := geom.Rect{X0: d.X, Y0: d.Y, X1: d.X, Y1: d.Y}
		dix.add(i, here)
		nets[i] = map[string]bool{}
		for _, j := range six.near(here) {
			if pointSeg(d, segs[j].seg) < geom.Eps {
				nets[i][segs[j].net] = true
			}
		}
	}
	for _, x := range xs {
		for _, i := range dix.near(geom.Rect{X0: x.at.X, Y0: x.at.Y, X1: x.at.X, Y1: x.at.Y}.Inset(dotClear)) {
			d := g.Dots[i]
			if dd := math.Hypot(d.X-x.at.X, d.Y-x.at.Y); dd < dotClear-geom.Eps && (nets[i][x.a] || nets[i][x.b]) {
				r.NearDots = append(r.NearDots, fmt.Sprintf("wires of %s and %s cross at %s, %g from a junction dot at %s", x.a, x.b, pt(x.at), dd, pt(d)))
				break
			}
		}
	}
}
