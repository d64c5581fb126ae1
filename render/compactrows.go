package render

import (
	"pare/render/check"
	"pare/render/geom"
	"pare/render/layout"
)

// Compact rows. A page of A3 at the 2.5 mm text rule is 136 grid units by
// about 88; over every example and blind-review circuit (review13 to
// review21, reduced and faded views: 629 rows) a row is 36 units tall at
// the median (27 to 42 between the quartiles) and 107 wide (83 to 123):
// two rows stack on a page, three in only 16 of 279 runs of three, and two
// stand side by side in 4 of 454 pairs. The rows' page breaks are already
// the best their heights allow (a search over every break, rows two grid
// steps apart or side by side, finds no page fewer), so a page is saved
// only by a shorter row. A row's height is mostly its columns' blocks
// stacked rowGap apart; stacked a step closer (layout.Options.Compact) a
// row is a unit or a few shorter, which is what the second or third row
// of a small set can lack (review18 b01: a phase-shift oscillator and its
// buffer on two A3 pages, the second a quarter full). Closer on every
// sheet, labels and wires crowd (wire boxes round a title or part rose
// from 299 to 410, the review pages' findings from 5 to 65), so a row is
// laid out compact only where that saves the view a page, and the compact
// row kept only where the checker finds no more on it than on the row it
// replaces.

// compactMost is the most rows a view may have for its rows to be tried
// compact: a small set, the views the review found spread over mostly
// empty pages; a whole set's rows are each laid out once more for it.
const compactMost = balanceMost

// compactGain is the share of a row's height a compact layout may save at
// most, measured over the fixtures (a few grid units of 30 to 50): a view
// whose rows, that much shorter, would still not go on a page fewer is not
// laid out again.
const compactGain = 0.8

// compact is the rows (ends, laid) with rows laid out compact where that
// takes the view a page fewer than pages and keeps every compact row's
// checker findings at most the row's own; laid as it was otherwise.
func (f *flow) compact(ends []int, laid []*layout.Result, cw, avail float64) ([]*layout.Result, error) {
	n := len(ends)
	// the planned page starts of a window of a bigger sheet's rows
	// (balance) are not the view's pages: such a view is left as planned
	if n < 2 || n > compactMost || looseRow(f.bs, ends) >= 0 || len(f.starts) > 0 && len(f.bs) > balanceMost {
		return laid, nil
	}
	pages := f.plannedPages(ends, laid, cw, avail)
	h := -tightGap
	for _, r := range laid {
		h += r.Geom.Bounds.H() + tightGap
	}
	if pages < 2 || compactGain*h > float64(pages-1)*avail {
		return laid, nil
	}
	out := append([]*layout.Result{}, laid...)
	changed := false
	for i := range ends {
		r, err := f.compactRow(start(ends, i), ends[i], laid[i], cw, avail)
		if err != nil {
			return nil, err
		}
		if r != nil {
			out[i], changed = r, true
		}
	}
	if !changed {
		return laid, nil
	}
	was := f.greedyPlan(ends, laid, 0, n, cw, avail, f.rowGap())
	for _, gap := range []float64{rowGap, tightGap} {
		p := f.greedyPlan(ends, out, 0, n, cw, avail, gap)
		if p.pages < pages && p.splits <= was.splits && p.cans <= was.cans {
			f.gap, f.starts, f.beside = gap, nil, nil
			return out, nil
		}
	}
	return laid, nil
}

// plannedPages is the pages the rows take as pageResults stacks them:
// the planned page starts' count where balance chose them, else the
// greedy stacking's.
func (f *flow) plannedPages(ends []int, laid []*layout.Result, cw, avail float64) int {
	if len(f.starts) > 0 {
		n := len(f.starts)
		if !f.starts[0] {
			n++
		}
		return n
	}
	return f.greedyPlan(ends, laid, 0, len(ends), cw, avail, f.rowGap()).pages
}

// compactRow is the row [a, b) laid out compact, when that is shorter than
// was, fits the page, routes every net was routes and leaves the checker
// no more to find; nil otherwise.
func (f *flow) compactRow(a, b int, was *layout.Result, cw, avail float64) (*layout.Result, error) {
	sh := f.sheet(a, b, false)
	if a == 0 && b == len(f.bs) {
		cp := *f.s
		sh = &cp
		sh.placed = nil
	}
	sh.compact = true
	r, err := f.cfg.layout(sh)
	if err != nil {
		return nil, err
	}
	bd, wb := r.Geom.Bounds, was.Geom.Bounds
	if bd.H() >= wb.H() || bd.W() > max(cw, wb.W()) || bd.H() > avail || len(r.Geom.Failed) > len(was.Geom.Failed) {
		return nil, nil
	}
	if findings(&r.Geom) > findings(&was.Geom) {
		return nil, nil
	}
	return r, nil
}

// findings counts what the checker finds on a laid-out row that a reader
// would see: the fatal findings, the misreadings, the crowding, and each
// count the drawing ratchets hold (wire boxes, foreign frames, a part's
// own net beside it, crossings by pins and dots, long wires, ...).
func findings(g *geom.Sheet) int {
	r := check.Measure(g)
	n := len(r.Problems()) + len(r.Misreadings()) + len(r.Crowding())
	for _, l := range [][]string{r.WireBoxes, r.ForeignFrames, r.FrameStrays, r.DotPairs, r.NearPins, r.AlongParts, r.CommonLeads,
		r.LongWires, r.FarTanks, r.MixerOrder, r.FeedOrder, r.FiguresAstray, r.TagsOnParts} {
		n += len(l)
	}
	return n
}
