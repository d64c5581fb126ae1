package render

import (
	"bytes"
	"fmt"

	svg "github.com/ajstarks/svgo/float"

	"pare/render/geom"
	"pare/render/layout"
)

// FprintPages draws the sheet on cfg.Page: one SVG per page, in order.
// Without a page it is the one sheet Fprint draws.
func (cfg Config) FprintPages(s *Sheet) ([][]byte, error) {
	if cfg.Grid <= 0 {
		cfg.Grid = 10
	}
	if cfg.Page == nil {
		var b bytes.Buffer
		if err := cfg.Fprint(&b, s); err != nil {
			return nil, err
		}
		return [][]byte{b.Bytes()}, nil
	}
	pages, err := cfg.pageResults(s)
	if err != nil {
		return nil, err
	}
	out := make([][]byte, len(pages))
	for i, r := range pages {
		var buf bytes.Buffer
		d := &drawer{cfg: cfg, canvas: textSafe{svg.New(&buf)}, sheet: s, res: r}
		d.drawPaged(i+1, len(pages))
		out[i] = buf.Bytes()
	}
	return out, nil
}

// Geometries are the drawn geometry of each page (one without a page),
// for the checker.
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
	for i, r := range pages {
		out[i] = &r.Geom
	}
	return out, nil
}

// pageResults lays the sheet out in rows and stacks the rows on pages. A
// sheet that fits a page's width is laid out whole, as without a page.
func (cfg Config) pageResults(s *Sheet) ([]*layout.Result, error) {
	if s == nil || s.Circuit == nil {
		return nil, fmt.Errorf("render: no circuit to draw")
	}
	_, laid, err := cfg.flowRows(s)
	if err != nil {
		return nil, err
	}
	_, ch := cfg.Page.content()
	avail := ch - 1 - cfg.footReserve(s)
	var pages []*layout.Result
	y := 0.0
	for _, r := range laid {
		b := r.Geom.Bounds
		if len(pages) == 0 || y+b.H() > avail {
			pages = append(pages, &layout.Result{})
			y = 0
		}
		pages[len(pages)-1].Add(r.Moved(geom.Pt{X: -b.X0, Y: y - b.Y0}))
		y += b.H() + rowGap
	}
	return pages, nil
}

// flowRows cuts the sheet into rows that fill the page's width in signal
// order and lays each out: the rows and their layouts.
func (cfg Config) flowRows(s *Sheet) ([][]block, []*layout.Result, error) {
	cw, ch := cfg.Page.content()
	bs := blocks(s, layout.Extents(s.Circuit, cfg.options(s)))
	rows := [][]block{bs}
	// a row grows in routing, and its connectors take room at both edges
	if len(bs) > 0 && bs[len(bs)-1].x1-bs[0].x0 > cw-rowSlack {
		rows = splitRows(bs, cw-rowSlack)
	}
	return cfg.layoutRows(s, rows, cw, ch-1-cfg.footReserve(s))
}

// layoutRows lays out each row in turn (the sheet itself when there is
// one row), moving a row's last stretch on to the next row while it comes
// out wider or taller than the page and can be cut, and taking the next
// row's first stretch while the row still has room for it: the placement
// without routing overstates a row's width (the gaps of the whole sheet),
// so only a routed row says whether the next stage fits beside it. A row's
// connectors depend only on which nets the rows before it and after it
// hold, so moving stretches between later rows never changes a row already
// laid out: each row is laid out once plus once per stretch it gives away
// or tries to take.
func (cfg Config) layoutRows(s *Sheet, rows [][]block, cw, ch float64) ([][]block, []*layout.Result, error) {
	var out []*layout.Result
	for i := 0; i < len(rows); i++ {
		var r *layout.Result
		peeled := false
		for {
			var err error
			if r, err = cfg.layoutRow(s, rows, i); err != nil {
				return nil, nil, err
			}
			if len(rows[i]) == 1 || fits(r, cw, ch) {
				break
			}
			rows, peeled = peel(rows, i), true
		}
		for !peeled && i+1 < len(rows) && fits(r, cw, ch) {
			grown := pull(rows, i)
			if span(grown[i]) > cw {
				break
			}
			g, err := cfg.layoutRow(s, grown, i)
			if err != nil {
				return nil, nil, err
			}
			if !fits(g, cw, ch) {
				break
			}
			rows, r = grown, g
		}
		out = append(out, r)
	}
	return rows, out, nil
}

// layoutRow lays out row i of rows: the sheet itself when it is the only row.
func (cfg Config) layoutRow(s *Sheet, rows [][]block, i int) (*layout.Result, error) {
	if len(rows) == 1 {
		return cfg.layout(s)
	}
	return cfg.layout(rowSheets(s, rowRefs(rows))[i])
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
// block or the caution, whichever is taller.
func (cfg Config) footReserve(s *Sheet) float64 {
	d := &drawer{cfg: cfg, sheet: s}
	return d.foot(1, 1).h
}
