package render

import (
	"pare/graph"
	"pare/render/geom"
	"pare/render/layout"
)

// tightGap is the gap between rows, in grid units (5.9 mm on paper), of a
// small set's pages where rowGap's would take a page more: still two grid
// steps, the least the checker lets unrelated wires run apart.
const tightGap = 2.0

// balanceMost is the most stretches a sheet may have for its rows and
// pages to be chosen by the search below: a small set (one amplifier, an
// IF strip) whose greedy flow left a page of two parts or took a page more
// than it needs. A whole set keeps the greedy flow: the search lays out
// rows the greedy flow never tries, and a set of a hundred stretches would
// lay out thousands.
const balanceMost = 12

// plan is a way to cut a sheet's stretches into rows and the rows onto
// pages, with what it is judged by: fewer pages first, then fewer page
// breaks through a joined stretch, then fewer row breaks between a tuned
// can and the stage it feeds (cancuts.go: balancing the pages of review14
// b03 put its last IF can and the detector on two rows where the greedy
// flow had them on one), then the most parts on its emptiest page (no page
// of leftovers beside full ones), then fewer rows, then later page breaks
// (the first pages the fuller).
type plan struct {
	pages, least, rows int
	splits             int   // page breaks between pieces of one joined stretch (chainBreak)
	cans               int   // row breaks between a can and the stage it feeds (flow.cansCut)
	ends               []int // where each row ends
	starts             []int // the rows, by index, that open a page
	beside             []int // the rows, by index, that stand right of the row before (band)
	ok                 bool
}

// better says whether plan p beats q.
func (p plan) better(q plan) bool {
	switch {
	case !q.ok:
		return p.ok
	case !p.ok:
		return false
	case p.pages != q.pages:
		return p.pages < q.pages
	case p.splits != q.splits:
		return p.splits < q.splits
	case p.cans != q.cans:
		return p.cans < q.cans
	case p.least != q.least:
		return p.least > q.least
	case p.rows != q.rows:
		return p.rows < q.rows
	}
	return lastBreakLater(p.starts, q.starts)
}

// lastBreakLater says whether the last page break of a (row index) comes
// after b's, on plans of the same number of rows.
func lastBreakLater(a, b []int) bool {
	if len(a) == 0 || len(b) == 0 {
		return false
	}
	return a[len(a)-1] > b[len(b)-1]
}

// balance is the greedy flow's rows (ends, laid) replaced, on a small
// sheet of several pages, by the rows and page breaks of the best plan
// (plan.better) when it beats the greedy one: b03 of the blind review
// (an IF strip, detector and audio) had a second page holding a volume
// control and a coupling capacitor, where the strip's two stages fill one
// page and the detector and audio one row of the next. The greedy flow
// fills each row, then each page, and so cannot move a stage from a full
// row to balance the pages. Every row tried is laid out (and kept: a row
// depends only on the stretches it holds and those before and after it),
// so a plan's rows and heights are the ones drawn. starts marks the rows
// that open a page (nil: the greedy stacking of pageResults).
func (f *flow) balance(ends []int, laid []*layout.Result, cw, avail float64) ([]int, []*layout.Result, map[int]bool, error) {
	m, n := len(f.bs), len(ends)
	loose := looseRow(f.bs, ends)
	if loose >= 0 {
		if loose != n-1 {
			return ends, laid, nil, nil
		}
		m, n = m-1, n-1 // the loose parts' row stays last, for hostLoose
	}
	all := f.greedyPlan(ends, laid, 0, n, cw, avail, rowGap)
	stranded := f.stranded(ends[:n])
	if all.pages < 2 && (!stranded || m > balanceMost) {
		return ends, laid, nil, nil
	}
	// the greedy rows themselves, tightGap apart, when that takes fewer
	// pages than the plan chosen below: the rows drawn as laid out, only
	// closer (review20 a01's faded view, two rows a grid unit too tall for
	// one page rowGap apart, had a page each). Never with a row of loose
	// parts, which hostLoose then gives to a row and makes it taller.
	tight := f.greedyPlan(ends, laid, 0, n, cw, avail, tightGap)
	closer := func(pages int) bool {
		if loose >= 0 || tight.pages >= pages || tight.splits > all.splits {
			return false
		}
		f.gap = tightGap
		return true
	}
	// the window searched: the whole sheet when small, else its last two
	// pages (a whole set's last page of one Zobel network)
	w := 0
	if m > balanceMost && all.pages > 1 {
		w = all.starts[len(all.starts)-2]
	}
	lo := start(ends, w)
	greedy := f.greedyPlan(ends, laid, w, n, cw, avail, rowGap)
	if m-lo > balanceMost || greedy.splits == 0 && !stranded && !f.worthSearch(greedy, laid[w:n], lo, m) {
		closer(all.pages)
		return ends, laid, nil, nil
	}
	best, err := f.search(greedy, stranded, lo, m, cw, avail)
	if err != nil {
		return ends, laid, nil, err
	}
	// rows cut afresh for the tighter gap (the search's) come only after
	// the greedy rows closer: cut afresh, review15 a05's decoupler went to
	// the rectifier's row and its line's wires looped back to connectors
	if !best.ok || !stranded && closer(all.pages-greedy.pages+best.pages) {
		closer(all.pages)
		return ends, laid, nil, nil
	}
	nends := append(append([]int{}, ends[:w]...), best.ends...)
	out := append([]*layout.Result{}, laid[:w]...)
	for i := w; i < len(nends); i++ {
		r, err := f.layout(start(nends, i), nends[i])
		if err != nil {
			return nil, nil, nil, err
		}
		out = append(out, r)
	}
	if loose >= 0 {
		nends = append(nends, len(f.bs))
		out = append(out, laid[loose])
	}
	// the window's first row may still go under the last row before it,
	// as the greedy stacking puts it where it fits: never a page more
	starts := map[int]bool{}
	for _, r := range best.starts {
		if w == 0 || r > 0 {
			starts[w+r] = true
		}
	}
	f.beside = map[int]bool{}
	for _, r := range best.beside {
		f.beside[w+r] = true
	}
	return nends, out, starts, nil
}

// search is the best plan of the stretches [lo, m) that beats greedy's:
// with the rows rowGap apart, one with fewer pages or a fuller emptiest
// page; with them tightGap apart, only one with fewer pages; and only
// then, with rows side by side (band), one with fewer pages: a fuller
// emptiest page bought by rows side by side emptied the page before it
// (the example IF strip's detector row went over to the volume control's
// page). It sets the flow's gap to the plan's.
func (f *flow) search(greedy plan, stranded bool, lo, m int, cw, avail float64) (plan, error) {
	rows := map[[2]int]rowFit{}
	var least plan // with stranded rows: the plan of fewest pages the search found
	leastGap := rowGap
	for _, sides := range []bool{false, true} {
		for _, gap := range []float64{rowGap, tightGap} {
			s := &search{f: f, lo: lo, m: m, cw: cw, avail: avail, gap: gap, rows: rows, sides: sides}
			p, err := s.best()
			if err != nil {
				return plan{}, err
			}
			same := p.pages == greedy.pages && p.splits == greedy.splits
			fewer := p.pages < greedy.pages && p.splits <= greedy.splits
			// the greedy rows strand a part away from its stages
			// (strand.go), which no row of the search does
			fewer = fewer || stranded && p.pages <= greedy.pages && p.splits <= greedy.splits
			if stranded && p.ok && (!least.ok || p.pages < least.pages) {
				least, leastGap = p, gap
			}
			if p.ok && (fewer || !sides && (p.pages < greedy.pages || p.pages == greedy.pages && p.splits < greedy.splits ||
				gap == rowGap && same && (p.cans < greedy.cans || p.cans == greedy.cans && p.least > greedy.least))) {
				f.gap = gap
				return p, nil
			}
		}
	}
	// rows that strand a part are refused even at a page more
	f.gap = leastGap
	return least, nil
}

// greedyPlan judges the greedy flow's rows [w, n) as pageResults stacks
// them, gap apart; its starts count rows from w.
func (f *flow) greedyPlan(ends []int, laid []*layout.Result, w, n int, cw, avail, gap float64) plan {
	p := plan{ok: true, least: -1}
	var pg *band
	parts := 0
	for i := w; i < n; i++ {
		b := laid[i].Geom.Bounds
		big := b.W() > cw || b.H() > avail
		pt, ok := geom.Pt{}, false
		if pg != nil && !big {
			pt, ok = pg.at(b, false)
		}
		if !ok {
			if p.pages > 0 {
				p.least = leastOf(p.least, parts)
				if f.chainBreak(start(ends, i)) {
					p.splits++
				}
			}
			p.pages, pg, parts = p.pages+1, f.band(cw, avail, gap), 0
			p.starts = append(p.starts, p.rows)
		}
		pg.put(b, pt)
		if big {
			pg.alone() // a page of its own
		}
		parts += f.partsIn(start(ends, i), ends[i])
		p.rows++
		if i+1 < n {
			p.cans += f.cansCut(ends[i])
		}
	}
	p.least = leastOf(p.least, parts)
	return p
}

// worthSearch says whether the greedy plan may be beaten, so the rows it
// never tried are worth laying out: its rows' heights stacked would go on
// a page fewer, or its emptiest page holds less than a third of the parts
// a page holds on average (a volume control and a coupling capacitor
// after a page of IF stages). Rows side by side are tried only then: the
// search lays out rows the greedy flow never did, and a chain of stages
// whose rows' areas would go on a page fewer but never pair had every
// row laid out again for nothing.
func (f *flow) worthSearch(p plan, laid []*layout.Result, lo, m int) bool {
	h := -tightGap
	for _, r := range laid {
		h += r.Geom.Bounds.H() + tightGap
	}
	if h <= float64(p.pages-1)*f.ch {
		return true
	}
	return 3*p.least*p.pages < f.partsIn(lo, m)
}

// chainBreak says whether a page opening at stretch c parts two pieces of
// one joined stretch cut apart (a bridge rectifier and its smoothing
// filter, review16 a05: the supply chain read across a page break while
// it fitted one page).
func (f *flow) chainBreak(c int) bool {
	return c > 0 && c < len(f.bs) && f.bs[c].chain != 0 && f.bs[c].chain == f.bs[c-1].chain
}

// leastOf is the smaller count, a = -1 standing for none yet.
func leastOf(a, b int) int {
	if a < 0 || b < a {
		return b
	}
	return a
}

// partsIn counts the parts (sockets aside) of the stretches [a, b).
func (f *flow) partsIn(a, b int) int {
	n := 0
	for _, bl := range f.bs[a:b] {
		for _, r := range bl.refs {
			if p := f.part[r]; p != nil && p.Kind != graph.Port {
				n++
			}
		}
	}
	return n
}
