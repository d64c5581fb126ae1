package render

import (
	"bytes"
	"fmt"
	"math"
	"sort"

	svg "github.com/ajstarks/svgo/float"

	"pare/graph"
	"pare/render/geom"
	"pare/render/layout"
)

// FprintPages draws the sheet on cfg.Page: one SVG per page, in order.
// Without a page it is the one sheet Fprint draws.
func (cfg Config) FprintPages(s *Sheet) ([][]byte, error) {
	pages, _, err := cfg.FprintPagesText(s)
	return pages, err
}

// FprintPagesText is FprintPages and the height on paper, in millimetres,
// of each page's smallest text: MinTextMM, less on a page drawn smaller to
// hold a stage too big for it (never cut through), which the caller tells
// its user; 0 for the one sheet drawn without a page.
func (cfg Config) FprintPagesText(s *Sheet) ([][]byte, []float64, error) {
	if cfg.Grid <= 0 {
		cfg.Grid = 10
	}
	if cfg.Page == nil {
		var b bytes.Buffer
		if err := cfg.Fprint(&b, s); err != nil {
			return nil, nil, err
		}
		return [][]byte{b.Bytes()}, []float64{0}, nil
	}
	pages, err := cfg.pageResults(s)
	if err != nil {
		return nil, nil, err
	}
	out := make([][]byte, len(pages))
	mm := make([]float64, len(pages))
	sf := (&drawer{cfg: cfg, sheet: s}).sharedFoot()
	for i, r := range pages {
		var buf bytes.Buffer
		d := &drawer{cfg: cfg, canvas: textSafe{svg.New(&buf)}, sheet: s, res: r, shared: sf}
		mm[i] = d.drawPaged(i+1, len(pages))
		out[i] = buf.Bytes()
	}
	return out, mm, nil
}

// Geometries are the drawn geometry of each page (one without a page),
// for the checker; a page's carries the millimetres a grid unit prints at
// (PageMM), so the checker sees text the page drew smaller than the
// paper's scale.
func (cfg Config) Geometries(s *Sheet) ([]*geom.Sheet, error) {
	if cfg.Page == nil {
		g, err := cfg.Geometry(s)
		return []*geom.Sheet{g}, err
	}
	pages, err := cfg.pageResults(s)
	if err != nil {
		return nil, err
	}
	out := make([]*geom.Sheet, len(pages))
	sf := (&drawer{cfg: cfg, sheet: s}).sharedFoot()
	for i, r := range pages {
		out[i] = &r.Geom
		pg := (&drawer{cfg: cfg, sheet: s, res: r, shared: sf}).pagedPage(i+1, len(pages))
		out[i].PageMM = mmPerUnit() * pg.textMM / MinTextMM
	}
	return out, nil
}

// pageResults lays the sheet out in rows and stacks the rows on pages. A
// sheet that fits a page's width is laid out whole, as without a page.
func (cfg Config) pageResults(s *Sheet) ([]*layout.Result, error) {
	if s == nil || s.Circuit == nil {
		return nil, fmt.Errorf("render: no circuit to draw")
	}
	f, ends, laid, err := cfg.flowRows(s)
	if err != nil {
		return nil, err
	}
	// the flow's memos (every row and sheet laid out while the cuts were
	// chosen, most of them not kept) are not read again, and each row laid
	// is let go once its copy stands on its page: on a whole set both views
	// stack their pages at once, and the memos and the rows beside their
	// copies were the job's peak of memory (docs/performance.md)
	f.laid, f.ahead, f.rows, f.shared, f.sheets = nil, nil, nil, nil, nil
	cw, ch := cfg.Page.content()
	avail := ch - 1 - cfg.footReserve(s)
	loose := looseRow(f.bs, ends)
	var pages []*layout.Result
	var bands []*band       // each page's rows so far (band)
	var stood [][]geom.Rect // where each page's rows stand
	for i, r := range laid {
		if i == loose {
			continue
		}
		b := r.Geom.Bounds
		// a row too big for the page (a stage never cut) has a page of
		// its own, drawn smaller: the rows beside it keep the paper's scale
		big := b.W() > cw || b.H() > avail
		if n := len(bands); n > 0 && !big && !f.starts[i] && bands[n-1].y+b.H() > avail && !mixes(f.bs[start(ends, i):ends[i]]) && f.bs[start(ends, i)].apart {
			if at, ok := atMargin(stood[n-1], b, cw, avail); ok {
				pages[n-1].Add(r.Moved(geom.Pt{X: at.X0 - b.X0, Y: at.Y0 - b.Y0}))
				laid[i] = nil
				stood[n-1] = append(stood[n-1], at)
				bands[n-1].y = max(bands[n-1].y, at.Y1+f.rowGap())
				continue
			}
		}
		var pt geom.Pt
		ok := false
		if n := len(bands); n > 0 && !big && !f.starts[i] {
			if r, pt, ok, err = f.onLastPage(ends, i, r, bands[n-1], cw, avail); err != nil {
				return nil, err
			}
			b = r.Geom.Bounds
		}
		if !ok {
			pages, bands, stood = append(pages, &layout.Result{}), append(bands, f.band(cw, avail, f.rowGap())), append(stood, nil)
			pt = geom.Pt{}
		}
		n := len(bands) - 1
		pages[n].Add(r.Moved(geom.Pt{X: pt.X - b.X0, Y: pt.Y - b.Y0}))
		laid[i] = nil
		stood[n] = append(stood[n], geom.R(pt.X, pt.Y, pt.X+b.W(), pt.Y+b.H()))
		bands[n].put(b, pt)
		if big {
			bands[n].alone()
		}
	}
	ys := make([]float64, len(bands))
	for k, bd := range bands {
		ys[k] = bd.y
	}
	if loose >= 0 {
		pages = stackLoose(pages, ys, laid[loose], cw, avail)
	}
	return pages, nil
}

// stackLoose puts the row of loose parts (hostLoose found no row to take
// them) under the rows of the last page with room for it, else in the free
// room of a page among what it holds (looseSpot), and only short of both
// on a page of its own: out of signal order it costs nothing, a page of
// its own a sheet with no stage on it.
func stackLoose(pages []*layout.Result, ys []float64, r *layout.Result, cw, avail float64) []*layout.Result {
	b := r.Geom.Bounds
	k := len(pages) - 1
	for k >= 0 && ys[k]+b.H() > avail {
		k--
	}
	if k < 0 {
		// no band under any page's rows: room among what a page holds,
		// from the last page (the supply's) back
		for j := len(pages) - 1; j >= 0; j-- {
			if math.IsInf(ys[j], 1) {
				continue // a page kept alone for a row too big, drawn smaller
			}
			if at, ok := looseSpot(pages[j], b, cw, avail); ok {
				pages[j].Add(r.Moved(geom.Pt{X: at.X - b.X0, Y: at.Y - b.Y0}))
				return pages
			}
		}

		pages, ys, k = append(pages, &layout.Result{}), append(ys, 0), len(pages)
	}
	pages[k].Add(r.Moved(geom.Pt{X: -b.X0, Y: ys[k] - b.Y0}))
	return pages
}

// flowRows cuts the sheet into rows that fill the page's width in signal
// order and lays each out: the flow, where each row ends, and the rows'
// layouts.
//
// A stretch joined from several (a smoothing frame after its rectifier,
// frames overlapping in the whole sheet's placement) that is a row of its
// own and still too big for the page is cut into its pieces, and the sheet
// flowed afresh: a cut between two frames there is the price of text at
// MinTextMM, which a row drawn smaller than the page's scale would lose.
func (cfg Config) flowRows(s *Sheet) (*flow, []int, []*layout.Result, error) {
	cw, ch := cfg.Page.content()
	ch -= 1 + cfg.footReserve(s)
	ext := cfg.extents(s)
	bs := detectorsNext(s.Circuit, blocks(s, ext), cw-rowSlack)
	if len(bs) > 0 && bs[len(bs)-1].x1-bs[0].x0 > 2*cw {
		// the whole sheet's placement (FprintFitPages) is read by a
		// layout of the whole sheet as one row, which one twice the
		// page's width never is (were it, it is placed again, the same
		// way): let it go rather than hold it through the rows' layouts,
		// 25 MB on a 10,000-part sheet (docs/performance.md)
		s.placed = nil
	}
	var rows map[string]*layout.Result // every flow's rows, by what they hold
	for {
		f := newFlow(cfg, s, bs, rows)
		rows = f.rows
		ends := []int{len(bs)}
		// a row grows in routing, and its connectors take room at both edges
		if len(bs) > 0 && (bs[len(bs)-1].x1-bs[0].x0 > cw-rowSlack || mixes(bs)) {
			ends = splitRows(bs, cw-rowSlack)
		}
		ends, laid, err := f.canRows(ends, cw, ch)
		if err != nil {
			return nil, nil, nil, err
		}
		more := pieceOut(s.Circuit, bs, ends, laid, ext, cw, ch)
		if more == nil {
			if ends, laid, f.starts, err = f.balance(ends, laid, cw, ch); err != nil {
				return nil, nil, nil, err
			}
			if laid, err = f.compact(ends, laid, cw, ch); err != nil {
				return nil, nil, nil, err
			}
			return cfg.hostLoose(f, ends, laid, cw, ch)
		}
		bs = more
	}
}

// pieceOut is the stretches with every one that is a row of its own too
// big for the page and has pieces, or riders to cut off (riderPieces),
// replaced by them; nil when there is none.
func pieceOut(c *graph.Circuit, bs []block, ends []int, laid []*layout.Result, ext map[string]geom.Rect, cw, ch float64) []block {
	var out []block
	cut := false
	chain := 0
	for _, b := range bs {
		chain = max(chain, b.chain)
	}
	for i := range ends {
		a, b := start(ends, i), ends[i]
		if b-a != 1 || fits(laid[i], cw, ch) {
			out = append(out, bs[a:b]...)
			continue
		}
		ps := riderPieces(c, bs, a, ext)
		if ps == nil && len(bs[a].pieces) > 1 && !onlyPortsHelp(bs[a], laid[i], cw) {
			ps = bs[a].pieces
		}
		if ps != nil {
			// left to right as placed: a port joined by overlap goes
			// with the piece it stands after
			ps := append([]block{}, ps...)
			sort.SliceStable(ps, func(i, j int) bool { return ps[i].x0 < ps[j].x0 })
			chain++
			for k := range ps {
				ps[k].chain = chain
			}
			out = append(out, ps...)
			cut = true
			continue
		}
		out = append(out, bs[a:b]...)
	}
	if !cut {
		return nil
	}
	return out
}

// onlyPortsHelp says whether cutting a stretch into its pieces would only
// take ports off a frame that, by the stretch's placed widths scaled by
// what routing made of it, is still wider than the page: the sockets
// would stand alone on a row of their own, and the frame be drawn smaller
// all the same.
func onlyPortsHelp(b block, r *layout.Result, cw float64) bool {
	rest, ports := 0, 0.0
	for _, p := range b.pieces {
		if p.port {
			ports += p.x1 - p.x0
		} else {
			rest++
		}
	}
	w, placed := r.Geom.Bounds.W(), b.x1-b.x0
	return rest == 1 && placed > 0 && w-ports*w/placed > cw
}

// splitRows packs the blocks into rows no wider than width, in signal
// order, and returns where each row ends; a block wider than a row gets a
// row of its own, and the supply filters' stretches rows of their own
// (mixes).
func splitRows(bs []block, width float64) []int {
	var ends []int
	x0 := 0.0
	for i, b := range bs {
		if i == 0 || (b.x1-x0 > width && !b.port) || b.apart != bs[i-1].apart {
			if i > 0 {
				ends = append(ends, i)
			}
			x0 = b.x0
		}
	}
	return append(ends, len(bs))
}

// start is where row i begins, given where each row ends.
func start(ends []int, i int) int {
	if i == 0 {
		return 0
	}
	return ends[i-1]
}

// layoutRows lays out each row in turn (the sheet itself when there is
// one row), cutting a row's last stretches off to the next row while it
// comes out wider or taller than the page and can be cut, and taking the
// next row's first stretch while the row still has room for it: the
// placement without routing overstates a row's width (the gaps of the
// whole sheet), so only a routed row says whether the next stage fits
// beside it. A row's connectors depend only on which stretches come before
// and after it, so moving stretches between later rows never changes a
// row already laid out.
//
// A row too wide is cut where its stretches' placed widths, scaled by what
// routing made of the whole row, say it fits: several stretches at once on
// a row the first cut overfilled, where cutting one at a time laid the row
// out once per stretch. A row cut by more than one stretch then takes
// stretches back while they fit, so every row still ends only where the
// next stretch does not fit beside it.
func (f *flow) layoutRows(ends []int, cw, ch float64) ([]int, []*layout.Result, error) {
	f.layoutAhead(ends)
	var out []*layout.Result
	for i := 0; i < len(ends); i++ {
		var r *layout.Result
		known := false // the row with one more stretch is known not to fit
		for {
			a, b := start(ends, i), ends[i]
			var err error
			if r, err = f.layout(a, b); err != nil {
				return nil, nil, err
			}
			if b-a == 1 || fits(r, cw, ch) {
				break
			}
			c, scale := f.cut(a, b, r, cw)
			known = c == peelCut(f.bs, a, b)
			ends = moveEnd(ends, i, c)
			if scale > 0 {
				// the rows after start afresh from the same measure,
				// rather than each taking the last one's overflow
				for k, e := range splitRows(f.bs[c:], cw/scale) {
					ends = append(ends[:i+1+k], c+e)
				}
			}
		}
		for !known && i+1 < len(ends) && fits(r, cw, ch) {
			a, grown := start(ends, i), pullEnd(f.bs, ends, i)
			if span(f.bs[a:grown]) > cw || mixes(f.bs[a:grown]) || f.tooBig(a, grown, cw, ch) {
				break
			}
			g, err := f.layout(a, grown)
			if err != nil {
				return nil, nil, err
			}
			if !fits(g, cw, ch) {
				break
			}
			ends, r = moveEnd(ends, i, grown), g
		}
		var err error
		if ends, r, err = f.canEnd(ends, i, r); err != nil {
			return nil, nil, err
		}
		out = append(out, r)
	}
	return ends, out, nil
}

// peelCut is where the row [a, b) ends once its last stretch goes to the
// next row: a port stays with the stretch before it.
func peelCut(bs []block, a, b int) int {
	c := b - 1
	for c > a+1 && bs[c].port {
		c--
	}
	return c
}

// pullEnd is where row i ends once it takes the next row's first stretch
// and the ports that follow it.
func pullEnd(bs []block, ends []int, i int) int {
	e := ends[i] + 1
	for e < ends[i+1] && bs[e].port {
		e++
	}
	return e
}

// cut is where the row [a, b), laid out as r and too big for the page,
// is cut, and the scale from placed to routed width it judged by: when too
// wide, the last cut whose stretches' placed extent, scaled by how much
// wider routing made the whole row than its placed extent, fits the
// page's width; else one stretch off (a row too tall), and no scale.
func (f *flow) cut(a, b int, r *layout.Result, cw float64) (int, float64) {
	one := peelCut(f.bs, a, b)
	w := r.Geom.Bounds.W()
	est := f.bs[b-1].x1 - f.bs[a].x0
	if w <= cw || est <= 0 {
		return one, 0
	}
	scale := w / est
	for c := one; c > a+1; c-- {
		if !f.bs[c].port && (f.bs[c-1].x1-f.bs[a].x0)*scale <= cw {
			return c, scale
		}
	}
	return a + 1, scale
}

// moveEnd ends row i at e: stretches cut off go to the start of the next
// row (a new row after the last), stretches taken come from it, and a next
// row left empty is dropped.
func moveEnd(ends []int, i, e int) []int {
	old := ends[i]
	out := append([]int{}, ends...)
	out[i] = e
	switch {
	case e < old && i+1 == len(ends):
		out = append(out, old)
	case e > old && i+1 < len(ends) && out[i+1] == e:
		out = append(out[:i+1], out[i+2:]...)
	}
	return out
}

// fits says whether a laid-out row goes on a page's printable area.
func fits(r *layout.Result, cw, ch float64) bool {
	b := r.Geom.Bounds
	return b.W() <= cw && b.H() <= ch
}

// span is the width a row's stretches take side by side without the gaps
// between them: less than the row needs once routed, so a row whose span
// is wider than the page need not be tried.
func span(r []block) float64 {
	w := 0.0
	for _, b := range r {
		w += b.x1 - b.x0
	}
	return w
}

// rowSlack is the width, in grid units, a row keeps free of its parts'
// placed extent: routing widens a row by a few steps, and each off-row
// connector adds its flag at an edge.
const rowSlack = 16

// footReserve is the height the footer of a paged sheet takes: the title
// block or the caution, whichever is taller, the same on every page.
func (cfg Config) footReserve(s *Sheet) float64 {
	d := &drawer{cfg: cfg, sheet: s}
	return d.sharedFoot().layout.h
}
