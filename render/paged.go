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
	cw, ch := cfg.Page.content()
	bs := blocks(s, layout.Extents(s.Circuit, cfg.options(s)))
	rows := [][]block{bs}
	// a row grows in routing, and its connectors take room at both edges
	if len(bs) > 0 && bs[len(bs)-1].x1-bs[0].x0 > cw-rowSlack {
		rows = splitRows(bs, cw-rowSlack)
	}
	avail := ch - 1 - cfg.footReserve(s)
	laid, err := cfg.layoutRows(s, rows, cw, avail)
	if err != nil {
		return nil, err
	}
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

// layoutRows lays out each row in turn (the sheet itself when there is
// one row), moving a row's last stretch on to the next row while it comes
// out wider or taller than the page and can be cut. A row's connectors
// depend only on which nets the rows before it and after it hold, so
// moving stretches between later rows never changes a row already laid
// out: each row is laid out once plus once per stretch it gives away.
func (cfg Config) layoutRows(s *Sheet, rows [][]block, cw, ch float64) ([]*layout.Result, error) {
	var out []*layout.Result
	for i := 0; i < len(rows); i++ {
		for {
			rs := s
			if len(rows) > 1 {
				rs = rowSheets(s, rowRefs(rows))[i]
			}
			r, err := cfg.layout(rs)
			if err != nil {
				return nil, err
			}
			if b := r.Geom.Bounds; len(rows[i]) == 1 || (b.W() <= cw && b.H() <= ch) {
				out = append(out, r)
				break
			}
			rows = peel(rows, i)
		}
	}
	return out, nil
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
