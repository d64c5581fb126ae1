package render

import (
	"pare/render/geom"
	"pare/render/layout"
)

// A page's last rows. Stacked in signal order, a row a few grid units too
// tall for the room left under a page's rows opens the next page, and the
// page it leaves is partly empty while the next holds one row more than it
// needs to (review13 b05's faded view: its aerial row and its mixer row,
// 25 and 60 units tall, on two pages of 88, each mostly empty). Laid out
// compact (compactRow: its column's blocks stacked a step closer), such a
// row is a few units shorter and may go on the page after all. Only a row
// of a view whose pages the greedy stacking chooses is tried (the pages
// balance planned stay as planned), only where the row misses the room by
// no more than a compact layout may save (compactGain), and the compact
// row only where compactRow keeps it: no wider than the page, every net
// routed, and the checker finding no more on it than on the row as laid.

// onLastPage is row i of the flow's rows (ends), laid out as r, and where
// it goes on the page whose rows are last: as laid out, else laid out
// compact (tighterRow); ok false when neither goes there.
func (f *flow) onLastPage(ends []int, i int, r *layout.Result, last *band, cw, avail float64) (*layout.Result, geom.Pt, bool, error) {
	if pt, ok := last.at(r.Geom.Bounds, f.beside[i]); ok {
		return r, pt, true, nil
	}
	c, pt, ok, err := f.tighterRow(ends, i, r, last, cw, avail)
	if err != nil || !ok {
		return r, geom.Pt{}, false, err
	}
	return c, pt, true, nil
}

// tighterRow is row i of the flow's rows (ends), laid out as r, laid out
// compact where that row goes on the page whose rows are last, and where
// it goes there: ok false when it does not (the row keeps r and opens a
// page).
func (f *flow) tighterRow(ends []int, i int, r *layout.Result, last *band, cw, avail float64) (*layout.Result, geom.Pt, bool, error) {
	h := r.Geom.Bounds.H()
	if len(f.starts) > 0 || last == nil || last.rows == 0 || last.y+compactGain*h > avail {
		return nil, geom.Pt{}, false, nil
	}
	c, err := f.compactRow(start(ends, i), ends[i], r, cw, avail)
	if err != nil || c == nil {
		return nil, geom.Pt{}, false, err
	}
	pt, ok := last.at(c.Geom.Bounds, f.beside[i])
	if !ok {
		return nil, geom.Pt{}, false, nil
	}
	return c, pt, true, nil
}
