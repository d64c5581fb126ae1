package render

import (
	"slices"

	"pare/render/layout"
)

// A stage template that stands blocks from right of its device to its
// left (an oscillator's grid leak, grid capacitor and gang section) leaves
// their columns empty, and the stages after it stood right of those
// columns: review21 a05's reduced mixer came out 142 units wide for 107
// placed, its page printed at 2.39 mm. Taking those columns back
// (layout.Options.CloseGaps) changes the widths of rows, and so which
// stages share a row, all over a sheet; it is done only where a row of
// one stretch is too big for its page, which else is drawn smaller than
// the text rule allows.

// orCloser is the row [a, b), laid out as r, or the same row laid out
// again with the columns its templates left empty taken back, as drawn
// (orFromFirst) and ranked from its first part, where r is a row of one
// stretch too big for the page: the one that fails no more nets and is
// the least over the page.
func (f *flow) orCloser(a, b int, r *layout.Result) (*layout.Result, error) {
	over := func(r *layout.Result) float64 {
		bd := r.Geom.Bounds
		return max(bd.W()/f.cw, bd.H()/f.ch)
	}
	if b-a != 1 || f.cw <= 0 || f.ch <= 0 || over(r) <= 1 {
		return r, nil
	}
	for _, first := range []bool{false, true} {
		sh := f.sheet(a, b, false)
		if first && !slices.ContainsFunc(sh.continues, func(k layout.Continuation) bool { return k.In }) {
			continue
		}
		sh.fromFirst, sh.closeGaps = first, true
		o, err := f.cfg.layout(sh)
		if err != nil {
			return nil, err
		}
		if len(o.Geom.Failed) <= len(r.Geom.Failed) && over(o) < over(r) {
			r = o
		}
	}
	return r, nil
}
