package check

import (
	"fmt"
	"math"

	"pare/render/geom"
)

// tagClear is how far, in grid steps, a rail tag (its bar and its text)
// keeps from every part's body and pins: a "+HT" set against a capacitor's
// plate reads as the plate's own label, or as the plate tied to the rail
// (review18 a04's C8, b05's C20). Half a step is where the eye stops
// joining them at print size (common practice: a label clear of a symbol
// by at least half the lettering height).
const tagClear = 0.5

// tagsOnParts reports each rail tag whose box comes within tagClear of a
// part's box (the body with its leads; the pins lie on its edge). The tag's
// own part counts too, except along the stub: a tag stands at the end of
// its owner's lead, so only its text reaching back beside the body is a
// finding, which the box test on the owner measures from the tag's bar
// end, not from the pin it hangs from.
func (r *Report) tagsOnParts(g *geom.Sheet) {
	var six bucketed
	for i, s := range g.Symbols {
		six.add(i, s.Box)
	}
	for _, l := range g.Locals {
		if l.Kind != geom.LocalRail {
			continue
		}
		for _, j := range six.near(l.Box.Inset(tagClear)) {
			s := g.Symbols[j]
			if s.Kind == "" {
				continue // the sheet's own flags and connectors are not parts
			}
			box := l.Box
			if s.Ref == l.Owner {
				box = ownTagBox(l, s)
			}
			if d := rectRect(box, s.Box); d < tagClear-geom.Eps {
				r.TagsOnParts = append(r.TagsOnParts, fmt.Sprintf("rail tag %q of %s.%s is %.2g from %s", l.Text, l.Owner, l.Pin, d, s.Ref))
			}
		}
	}
}

// ownTagBox is the part of a tag that must keep clear of its own part: the
// box less the strip its stub's end enters by, so the bar's line where the
// lead joins it is not a finding while text running back beside the body is.
func ownTagBox(l geom.Local, s geom.Symbol) geom.Rect {
	b := l.Box
	switch {
	case l.At.Y <= s.Box.Y0: // the tag stands above its part
		b.Y1 = math.Min(b.Y1, l.At.Y-tagClear)
	case l.At.Y >= s.Box.Y1:
		b.Y0 = math.Max(b.Y0, l.At.Y+tagClear)
	case l.At.X <= s.Box.X0:
		b.X1 = math.Min(b.X1, l.At.X-tagClear)
	case l.At.X >= s.Box.X1:
		b.X0 = math.Max(b.X0, l.At.X+tagClear)
	}
	return b
}

// rectRect is the gap between two boxes (0 when they touch or overlap).
func rectRect(a, b geom.Rect) float64 {
	dx := math.Max(0, math.Max(a.X0-b.X1, b.X0-a.X1))
	dy := math.Max(0, math.Max(a.Y0-b.Y1, b.Y0-a.Y1))
	return math.Hypot(dx, dy)
}
