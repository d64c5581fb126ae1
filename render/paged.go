package render

import (
	"bytes"
	"fmt"
	"strings"

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

// layoutRows lays out each row (the sheet itself when there is one row)
// and moves a row's last stretch on to the next row while it comes out
// wider or taller than the page and can be cut. That changes no other
// row's connectors (a net still runs on before and after it as it did),
// so the other rows are not laid out again.
func (cfg Config) layoutRows(s *Sheet, rows [][]block, cw, ch float64) ([]*layout.Result, error) {
	done := map[string]*layout.Result{}
	for {
		sheets := []*Sheet{s}
		if len(rows) > 1 {
			sheets = rowSheets(s, rowRefs(rows))
		}
		out := make([]*layout.Result, len(sheets))
		cut := -1
		for i, rs := range sheets {
			key := rowKey(rows, i)
			r, ok := done[key]
			if !ok {
				var err error
				if r, err = cfg.layout(rs); err != nil {
					return nil, err
				}
				done[key] = r
			}
			out[i] = r
			if b := r.Geom.Bounds; cut < 0 && len(rows[i]) > 1 && (b.W() > cw || b.H() > ch) {
				cut = i
			}
		}
		if cut < 0 {
			return out, nil
		}
		rows = peel(rows, cut)
	}
}

// rowKey names a row by its parts, and whether it is the whole sheet.
func rowKey(rows [][]block, i int) string {
	var b strings.Builder
	fmt.Fprintf(&b, "%d", min(len(rows), 2))
	for _, k := range rows[i] {
		for _, r := range k.refs {
			b.WriteString("\x00" + r)
		}
	}
	return b.String()
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
