package render

import (
	"math"

	"pare/render/geom"
)

// band stacks a page's rows: each under the last while it fits, else
// beside the last (to its right, level with its top) while both fit the
// page's width. A short row after a short row then shares the page with
// it, where stacking alone opened a page for it: review20 a02's faded
// view had rows 42, 54 and 39 units tall against 88 units of page, one
// page each, each mostly empty. The signal still reads as a service sheet
// is read, left to right, then top to bottom: row B right of row A follows
// it, and the next row goes under both. The rows keep their off-row
// connectors: A's outgoing ones face B's incoming ones across the gap, as
// at a row break.
type band struct {
	cw, avail, gap float64
	y              float64 // where the next row goes under the rows so far; +Inf on a page kept alone
	top, right     float64 // the last band's top and right edge
	rows           int     // rows on the page
	// the page's printable height and its footer set in the corner: a
	// row too tall for the room above the footer goes down beside it
	// where it keeps left of or above the corner (footcorner.go)
	ch     float64
	corner footCorner
}

// sideGap is the gap, in grid units, between two rows side by side: the
// gap atMargin keeps round a supply row, wide enough that the two rows'
// connectors read as two ends, not one wire.
const sideGap = channelGap

// newBand is an empty page of printable width cw and height avail, rows
// gap apart.
func newBand(cw, avail, gap float64) *band {
	return &band{cw: cw, avail: avail, gap: gap}
}

// at is where a row of bounds b goes on the page, and whether it goes
// there at all: under the rows so far, else beside the last; beside the
// last only, where the rows were chosen with their pages (flow.beside).
func (p *band) at(b geom.Rect, beside bool) (geom.Pt, bool) {
	if math.IsInf(p.y, 1) {
		return geom.Pt{}, false
	}
	if under := (geom.Pt{X: 0, Y: p.y}); !beside && (p.rows == 0 || p.y+b.H() <= p.avail || p.corner.fitsBeside(under, b, p.cw, p.ch)) {
		return under, true
	}
	if x := p.right + sideGap; p.rows > 0 && (x+b.W() <= p.cw && p.top+b.H() <= p.avail || p.corner.fitsBeside(geom.Pt{X: x, Y: p.top}, b, p.cw, p.ch)) {
		return geom.Pt{X: x, Y: p.top}, true
	}
	return geom.Pt{}, false
}

// put stands a row of bounds b at pt (from at).
func (p *band) put(b geom.Rect, pt geom.Pt) {
	if p.rows > 0 && pt.Y == p.top && pt.X > 0 {
		p.right = pt.X + b.W()
		p.y = max(p.y, p.top+b.H()+p.gap)
	} else {
		p.top, p.right = pt.Y, b.W()
		p.y = pt.Y + b.H() + p.gap
	}
	p.rows++
}

// band is an empty page of the flow's paper, rows gap apart, whose
// footer may take the corner (footcorner.go).
func (f *flow) band(cw, avail, gap float64) *band {
	p := newBand(cw, avail, gap)
	p.ch, p.corner = f.pageH, f.corner
	return p
}

// alone keeps the page for the row on it (a row too big, drawn smaller).
func (p *band) alone() { p.y = math.Inf(1) }
