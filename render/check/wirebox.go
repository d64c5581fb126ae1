package check

import (
	"fmt"
	"math"
	"sort"
	"strings"

	"pare/render/geom"
)

// A frame tells the reader "these parts are one stage": a wire of a net with
// no pin inside it that runs through it reads as part of that stage. And a
// wire running on three sides of a stage title or a part draws a box round
// it: the title reads as a part, the part as sitting in a loop of its own.

// boxReach is how far (grid steps) from a title's or part's box a wire may
// run and still count as running along that side, and boxCover how much of
// the side it must run along.
const (
	boxReach = 3.5
	boxCover = 0.5
)

// foreignFrames finds wires running through the interior of a frame that
// holds no pin of their net: one finding per net and frame.
func (r *Report) foreignFrames(g *geom.Sheet) {
	for k, f := range g.Frames {
		home := map[string]bool{}
		for _, s := range g.Symbols {
			for _, p := range s.Pins {
				if f.Box.Contains(p.At) {
					home[p.Net] = true
				}
			}
		}
		for _, l := range g.Locals {
			if f.Box.Contains(l.At) {
				home[l.Net] = true
			}
		}
		in := f.Box.Inset(-0.25) // the interior, clear of wires hugging the edge
		name := fmt.Sprintf("frame %d %q", k+1, first(f.Title.Lines))
		for _, w := range g.Wires {
			if home[w.Net] {
				continue
			}
			for _, s := range w.Segs {
				if s.Touches(in) && through(s, in) {
					r.ForeignFrames = append(r.ForeignFrames, fmt.Sprintf("wire of %s runs through %s, which holds none of its pins", w.Net, name))
					break
				}
			}
		}
	}
}

// through says whether the segment overlaps the rectangle's interior by
// more than a point.
func through(s geom.Seg, r geom.Rect) bool {
	b := s.Box()
	x0, x1 := math.Max(b.X0, r.X0), math.Min(b.X1, r.X1)
	y0, y1 := math.Max(b.Y0, r.Y0), math.Min(b.Y1, r.Y1)
	return x0 <= x1 && y0 <= y1 && (x1-x0 > geom.Eps || y1-y0 > geom.Eps)
}

// wireBoxes finds nets whose wires run along three or four sides of a stage
// title or of a part's symbol.
func (r *Report) wireBoxes(g *geom.Sheet) {
	type target struct {
		what string
		box  geom.Rect
		ends geom.Rect // the box with the part's own earth and rail symbols
	}
	var ts []target
	for k, f := range g.Frames {
		ts = append(ts, target{fmt.Sprintf("the title of frame %d %q", k+1, first(f.Title.Lines)), f.Title.Box, f.Title.Box})
	}
	labels := map[string]geom.Rect{}
	for _, l := range g.Labels {
		unionInto(labels, l.Owner, l.Box)
	}
	// a part's own earth and rail symbols are drawn as its ends: a wire
	// round the part and its earth reads as a frame round the part
	// (review19 b02: VC1b's hot lead ran up its side, over its top and
	// under its earth symbol, four steps below its body). The part is
	// measured both with and without them: with them its sides are longer,
	// and a wire along half of its own side would be missed
	locals := map[string]geom.Rect{}
	for _, l := range g.Locals {
		unionInto(locals, l.Owner, l.Box)
	}
	for _, s := range g.Symbols {
		if s.Kind == "" {
			continue
		}
		b := s.Box
		if l, ok := labels[s.Ref]; ok {
			b = b.Union(l)
		}
		ends := b
		if l, ok := locals[s.Ref]; ok {
			ends = b.Union(l)
		}
		ts = append(ts, target{"part " + s.Ref + " and its label", b, ends})
	}
	for _, t := range ts {
		for _, w := range g.Wires {
			sides := boxSides(w.Segs, t.box)
			if len(sides) < 3 && t.ends != t.box {
				sides = boxSides(w.Segs, t.ends)
			}
			if len(sides) >= 3 {
				r.WireBoxes = append(r.WireBoxes, fmt.Sprintf("wire of %s runs on the %s of %s", w.Net, strings.Join(sides, ", "), t.what))
			}
		}
	}
}

// boxSides lists the sides of b along which the segments run, outside b and
// within boxReach of it, over at least boxCover of the side's length.
func boxSides(segs []geom.Seg, b geom.Rect) []string {
	cover := geom.SideCover(segs, b, boxReach)
	names := [4]string{"top", "right", "bottom", "left"}
	lens := [4]float64{b.W(), b.H(), b.W(), b.H()}
	var out []string
	for i, c := range cover {
		if lens[i] > geom.Eps && c >= boxCover*lens[i] {
			out = append(out, names[i])
		}
	}
	sort.Strings(out)
	return out
}

// unionInto grows the box kept for owner by r (r itself for a new owner:
// a zero box must not stretch it to the origin).
func unionInto(boxes map[string]geom.Rect, owner string, r geom.Rect) {
	if b, ok := boxes[owner]; ok {
		r = b.Union(r)
	}
	boxes[owner] = r
}
