package render

import (
	"math"

	"pare/render/geom"
	"pare/render/layout"
)

// looseClear is how far, in grid units, the loose parts placed into a
// page's free room keep from everything already drawn there: two grid
// steps, the distance under which a reader joins unrelated wires
// (render/check's reader rules).
const looseClear = 2.0

// looseSpot finds room on a page for the row of loose parts (a dial lamp, a
// heater bypass: parts on rails and chassis only) among what is drawn
// there, not merely under its rows' boxes: a page whose rows left no band
// under them still has room beside a short stage or under a frame, and the
// loose parts alone made a page with no stage on it (review18 a01's
// faded-2, a lamp and a heater bypass). The spot nearest the page's lower
// right corner wins (out of the signal's way, as the loose row under the
// last row was); none when nothing is clear by looseClear.
func looseSpot(page *layout.Result, b geom.Rect, cw, avail float64) (geom.Pt, bool) {
	var taken []geom.Rect
	g := &page.Geom
	for _, s := range g.Symbols {
		taken = append(taken, s.Box)
	}
	for _, l := range g.Locals {
		taken = append(taken, l.Box)
		for _, st := range l.Stub {
			taken = append(taken, st.Box())
		}
	}
	for _, l := range g.Labels {
		taken = append(taken, l.Box)
	}
	for _, f := range g.Frames {
		taken = append(taken, f.Box, f.Title.Box)
	}
	for _, w := range g.Wires {
		for _, s := range w.Segs {
			taken = append(taken, s.Box())
		}
	}
	for _, lk := range g.Links {
		for k := 0; k+1 < len(lk.Path); k++ {
			taken = append(taken, geom.Seg{A: lk.Path[k], B: lk.Path[k+1]}.Box())
		}
	}
	for y := math.Floor(avail - b.H()); y >= 0; y-- {
		for x := math.Floor(cw - b.W()); x >= 0; x-- {
			at := geom.Rect{X0: x, Y0: y, X1: x + b.W(), Y1: y + b.H()}
			if !hitsAny(at.Inset(looseClear), taken) {
				return geom.Pt{X: x, Y: y}, true
			}
		}
	}
	return geom.Pt{}, false
}

// hitsAny says whether r shares interior with any of the boxes (a wire's
// box is a line, which shares r's interior when it runs through it).
func hitsAny(r geom.Rect, boxes []geom.Rect) bool {
	for _, t := range boxes {
		if r.Overlaps(t) {
			return true
		}
	}
	return false
}
