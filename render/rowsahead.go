package render

import (
	"pare/internal/par"
	"pare/render/layout"
)

// layoutAhead lays out, on the processors free (par.Ahead), the rows ends
// cuts the sheet into as they stand, before layoutRows walks them one by
// one: each row's layout reads only the sheet and the row's own stretches
// (flow.layout remembers it by its stretches for that reason), so laid out
// ahead it is the one the walk would make, and the walk finds it in
// flow.ahead (moved to flow.laid when asked for, so flow.laid still holds
// only the layouts the walk asked for, and a row it has not asked for is
// judged by its placement first, as before). A row the walk cuts or grows is laid out again as before;
// its guess cost a free processor only. With none free nothing is done.
//
// Each row is laid out on a flow of its own (the sheet's read-only parts
// shared, its memos its own), and what they laid out is merged back in the
// rows' order once all have finished.
func (f *flow) layoutAhead(ends []int) {
	var rows [][2]int
	for i := range ends {
		k := [2]int{start(ends, i), ends[i]}
		_, laid := f.laid[k]
		if _, ahead := f.ahead[k]; !laid && !ahead && k[1]-k[0] > 0 {
			rows = append(rows, k)
		}
	}
	if len(rows) < 2 {
		return
	}
	f.s.Circuit.Index() // built on first use, which is not safe side by side
	own := make([]*flow, len(rows))
	for i := range own {
		g := *f
		// the rows so far are read through shared, not copied: a copy
		// per row ahead, each of every row laid out so far, held 50 MB
		// at once on a 10,000-part sheet (docs/performance.md); no one
		// writes f.rows while the rows ahead are laid out
		g.laid, g.rows, g.shared, g.sheets = map[[2]int]*layout.Result{}, map[string]*layout.Result{}, f.rows, map[[2]int][2]*Sheet{}
		g.ahead = nil
		own[i] = &g
	}
	ok := par.Ahead(len(rows), func(i int) {
		if _, err := own[i].layout(rows[i][0], rows[i][1]); err != nil {
			own[i] = nil // the walk meets the error itself
		}
	})
	if !ok {
		return
	}
	for _, g := range own {
		if g == nil {
			continue
		}
		if f.ahead == nil {
			f.ahead = map[[2]int]*layout.Result{}
		}
		for k, r := range g.laid {
			if _, have := f.laid[k]; !have {
				f.ahead[k] = r
			}
		}
		for k, s := range g.sheets {
			if _, have := f.sheets[k]; !have {
				f.sheets[k] = s
			}
		}
		for k, r := range g.rows {
			if _, have := f.rows[k]; !have {
				f.rows[k] = r
			}
		}
	}
}
