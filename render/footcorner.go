package render

import (
	"math"

	"pare/render/geom"
	"pare/render/layout"
	"pare/render/symbol"
)

// The footer of a paged sheet runs the page's whole width: the caution on
// the left, the title block on the right. A page whose lowest row is
// narrow leaves the strip left of the title block empty but for the
// caution, and a row a few grid units too tall for the room above the
// footer opened a page of its own (review20 b01's reduced view: rows 36,
// 36 and 16 units tall against 88, the last one 44 units wide, on two
// pages; review22 b01 and b03 the same). Such a page sets its footer in
// the bottom right corner instead, the caution wrapped to the title
// block's width above the block, and its drawing goes down to the
// printable area's foot left of that corner (common practice: a title
// block sits in the corner, and a drawing may use the room beside it).

// footCorner is the corner a page's footer takes when set above the title
// block: its width (the widest block any page of the sheet has), its
// height, and the caution wrapped to that width.
type footCorner struct {
	w, h    float64
	caution []string
}

// cornerGap is the room, in grid units, between a drawing and the corner
// footer beside or above it: two grid steps, as between the drawing and
// the footer under it (pageResults' avail).
const cornerGap = 2.0

// corner is the sheet's corner footer: the title block as wide as its
// widest page's (the sheet's own column and every legend column full),
// the caution wrapped to that width above it.
func (fl footLayout) corner() footCorner {
	small := symbol.CharW * furnitureW
	lineH := symbol.LineH * furnitureW
	w := fl.headW + float64(fl.cols)*fl.colW
	caution := layout.WrapWords(fl.cautionText, max(1, int((w-1)/small)))
	return footCorner{w: w, caution: caution, h: float64(len(caution)+legendRows)*lineH + 2}
}

// keepOut is the corner a page of printable size cw by ch keeps free for
// its footer, in the page's drawing coordinates (the top left of the
// printable area at 0, 0), widened by cornerGap.
func (c footCorner) keepOut(cw, ch float64) geom.Rect {
	return geom.R(cw-c.w-cornerGap, ch-c.h-cornerGap, cw, ch)
}

// fitsBeside says whether a row of bounds b standing at pt goes on a page
// of printable size cw by ch whose footer takes the corner: within the
// printable area, and left of or above the corner.
func (c footCorner) fitsBeside(pt geom.Pt, b geom.Rect, cw, ch float64) bool {
	if c.w <= 0 {
		return false
	}
	k := c.keepOut(cw, ch)
	x1, y1 := pt.X+b.W(), pt.Y+b.H()
	return x1 <= cw && y1 <= ch-1 && (x1 <= k.X0 || y1 <= k.Y0)
}

// cornerFree says whether the drawing g, its bounds' top left standing at
// the printable area's, keeps the corner k free: no frame, part, label
// or wire in it.
func cornerFree(g *geom.Sheet, k geom.Rect) bool {
	b := g.Bounds
	k = geom.R(k.X0+b.X0, k.Y0+b.Y0, k.X1+b.X0, k.Y1+b.Y0)
	in := func(r geom.Rect) bool {
		return r.X1 > k.X0 && r.X0 < k.X1 && r.Y1 > k.Y0 && r.Y0 < k.Y1
	}
	for _, fr := range g.Frames {
		if in(fr.Box) {
			return false
		}
	}
	for _, s := range g.Symbols {
		if in(s.Box) {
			return false
		}
	}
	for _, l := range g.Labels {
		if in(l.Box) {
			return false
		}
	}
	for _, w := range g.Wires {
		for _, s := range w.Segs {
			if in(s.Box()) {
				return false
			}
		}
	}
	return true
}

// cornerPage says whether page pg, whose drawing is too tall for the room
// above a footer across the page, takes the corner footer instead: the
// drawing fits the printable area at the paper's scale and keeps the
// corner free.
func (d *drawer) cornerPage(b geom.Rect, cw, ch float64) (footCorner, bool) {
	c := d.sharedFoot().layout.corner()
	if b.W() > cw || b.H() > ch-1 || math.IsNaN(b.H()) {
		return c, false
	}
	return c, cornerFree(&d.res.Geom, c.keepOut(cw, ch))
}

// titleCorner writes the caution above the title block in the page's
// bottom right corner (cornerPage).
func (d *drawer) titleCorner(pg page) {
	k := d.cfg.Grid
	cv := d.canvas
	x := pg.W - pg.m - pg.corner.w
	y := pg.footY + pg.lineH
	for _, l := range pg.corner.caution {
		cv.Text(x*k, y*k, l, `class="sm"`)
		y += pg.lineH
	}
	d.block(pg, y-pg.lineH+0.4)
}
