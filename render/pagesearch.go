package render

import "pare/render/geom"

// rowFit is a row tried by the search: its height, whether it goes on a
// page beside others (fits), and whether it may be drawn at all (a row of
// several stretches must fit the page; a lone stretch too big for it has
// a page of its own).
type rowFit struct {
	w, h       float64
	ok, shares bool
}

// search is the choice of rows and pages for the stretches [0, m).
type search struct {
	f              *flow
	lo, m          int     // the stretches [lo, m)
	cw, avail, gap float64 // gap: between rows on a page
	rows           map[[2]int]rowFit
	sides          bool // a page's band may hold two rows side by side
}

// cutAt says whether a row may start at stretch c: never at a port, which
// stays with the stretch before it.
func (s *search) cutAt(c int) bool { return c == s.lo || c == s.m || !s.f.bs[c].port }

// row lays out (or recalls) the row [a, b) and says how it fits.
func (s *search) row(a, b int) (rowFit, error) {
	k := [2]int{a, b}
	if r, ok := s.rows[k]; ok {
		return r, nil
	}
	var fit rowFit
	if mixes(s.f.bs[a:b]) || s.f.strands(a, b) {
		// a supply filter never shares a signal stage's row, nor does a
		// part no frame holds stand on a row away from every stage it
		// is wired to (strand.go)
		s.rows[k] = fit
		return fit, nil
	}
	if b-a == 1 || span(s.f.bs[a:b]) <= s.cw && !s.f.tooBig(a, b, s.cw, s.avail) {
		r, err := s.f.layout(a, b)
		if err != nil {
			return fit, err
		}
		fit = rowFit{w: r.Geom.Bounds.W(), h: r.Geom.Bounds.H(), shares: fits(r, s.cw, s.avail)}
		fit.ok = fit.shares || b-a == 1
	}
	s.rows[k] = fit
	return fit, nil
}

// page is the best way to stack the stretches [a, b) as rows on one page:
// the rows' ends and the fewest rows of least height, ok false when they
// do not go on one page. A band of the page is one row, or two rows side
// by side where both fit the page's width (band): the rows of a small set
// each too tall to share a page under another share it beside another.
func (s *search) page(a, b int, memo map[[2]int]stack) (stack, error) {
	k := [2]int{a, b}
	if st, ok := memo[k]; ok {
		return st, nil
	}
	best := stack{}
	for c := a + 1; c <= b; c++ {
		if !s.cutAt(c) {
			continue
		}
		if c > a+1 && span(s.f.bs[a:c]) > s.cw {
			break
		}
		r, err := s.row(a, c)
		if err != nil {
			return best, err
		}
		if !r.ok {
			continue
		}
		st := stack{ok: true, h: r.h, ends: []int{c}, sides: []bool{false}, lowW: r.w, lowH: r.h}
		if !r.shares {
			st.alone = true // a page of its own: nothing after it on the page
		}
		if err := s.under(st, c, b, memo, &best); err != nil {
			return best, err
		}
		if st.alone || c == b || !s.sides {
			continue
		}
		for d := c + 1; d <= b; d++ {
			if !s.cutAt(d) {
				continue
			}
			if span(s.f.bs[a:c])+span(s.f.bs[c:d]) > s.cw {
				break
			}
			r2, err := s.row(c, d)
			if err != nil {
				return best, err
			}
			if !r2.shares || r.w+sideGap+r2.w > s.cw {
				continue
			}
			two := stack{ok: true, h: max(r.h, r2.h), ends: []int{c, d}, sides: []bool{false, true}, beside: 1, lowW: r.w + sideGap + r2.w, lowH: max(r.h, r2.h)}
			if err := s.under(two, d, b, memo, &best); err != nil {
				return best, err
			}
		}
	}
	memo[k] = best
	return best, nil
}

// under completes the page's first band st, ending at stretch c, with the
// best stack of [c, b) under it, and keeps it in best when it beats it.
func (s *search) under(st stack, c, b int, memo map[[2]int]stack, best *stack) error {
	if c < b {
		if st.alone {
			return nil
		}
		rest, err := s.page(c, b, memo)
		if err != nil {
			return err
		}
		if !rest.ok || rest.alone {
			return nil
		}
		st.h += s.gap + rest.h
		st.ends = append(append([]int{}, st.ends...), rest.ends...)
		st.sides = append(append([]bool{}, st.sides...), rest.sides...)
		st.beside += rest.beside
		st.lowW, st.lowH = rest.lowW, rest.lowH
	}
	if !st.alone && st.h > s.avail && !s.besideCorner(st) {
		return nil
	}
	if st.before(*best) {
		*best = st
	}
	return nil
}

// stack is the rows of one page: sides marks, per row, one standing
// right of the row before; beside counts them.
type stack struct {
	ok, alone  bool
	h          float64
	ends       []int
	sides      []bool
	beside     int
	lowW, lowH float64 // the lowest band's width and height
}

// besideCorner says whether the stack st, too tall for the room above a
// footer across the page, goes on it with the footer in the corner
// (footcorner.go): its lowest band left of the corner and within the
// printable area, every band above it in the room above the footer, as
// the page's band (sidebyside.go) then stacks them.
func (s *search) besideCorner(st stack) bool {
	f := s.f
	if f.corner.w <= 0 || st.h-st.lowH-s.gap > s.avail {
		return false
	}
	return f.corner.fitsBeside(geom.Pt{X: 0, Y: st.h - st.lowH}, geom.R(0, 0, st.lowW, st.lowH), s.cw, f.pageH)
}

// before says whether stack p beats q: fewer rows, then fewer rows side
// by side (a row under another reads on as a page is read), then less
// height.
func (p stack) before(q stack) bool {
	switch {
	case !q.ok:
		return p.ok
	case !p.ok:
		return false
	case len(p.ends) != len(q.ends):
		return len(p.ends) < len(q.ends)
	case p.beside != q.beside:
		return p.beside < q.beside
	}
	return p.h < q.h
}

// best is the best plan for the stretches [lo, m): pages in turn, each
// the best stack of its stretches (page).
func (s *search) best() (plan, error) {
	memo := map[[2]int]stack{}
	at := make([]plan, s.m+1) // at[b]: the best plan of [lo, b) with a page ending at b
	at[s.lo] = plan{ok: true, least: -1}
	for b := s.lo + 1; b <= s.m; b++ {
		if !s.cutAt(b) {
			continue
		}
		for a := s.lo; a < b; a++ {
			if !at[a].ok || !s.cutAt(a) {
				continue
			}
			st, err := s.page(a, b, memo)
			if err != nil {
				return plan{}, err
			}
			if !st.ok {
				continue
			}
			p := plan{ok: true, pages: at[a].pages + 1, least: leastOf(at[a].least, s.f.partsIn(a, b)),
				splits: at[a].splits, cans: at[a].cans,
				rows:   at[a].rows + len(st.ends),
				ends:   append(append([]int{}, at[a].ends...), st.ends...),
				starts: append(append([]int{}, at[a].starts...), at[a].rows),
				beside: append([]int{}, at[a].beside...)}
			for k, side := range st.sides {
				if side {
					p.beside = append(p.beside, at[a].rows+k)
				}
			}
			if a > s.lo && s.f.chainBreak(a) {
				p.splits++
			}
			for _, e := range st.ends {
				if e < s.m {
					p.cans += s.f.cansCut(e)
				}
			}
			if p.better(at[b]) {
				at[b] = p
			}
		}
	}
	return at[s.m], nil
}
