package render

import (
	"fmt"
	"math"
	"pare/graph/figure"

	"pare/render/layout"
	"pare/render/symbol"
)

// drawPaged writes page n of m: the drawing at the top left under the
// header, the caution at the foot on the left and the title block at the
// foot on the right, on a sheet of the page's proportions sized so that the
// text prints at MinTextMM (larger only when a row does not fit). It
// returns the height of the page's smallest text on paper.
func (d *drawer) drawPaged(n, m int) float64 {
	pg := d.pagedPage(n, m)
	d.start(pg)
	d.frames()
	d.parts()
	d.locals()
	d.wires()
	d.labels()
	d.titleBlock(pg)
	d.canvas.End()
	return pg.textMM
}

// foot is the footer of a paged sheet: the caution wrapped beside the
// title block, and its height.
type foot struct {
	caution   []string
	block     [][]string // the title block's columns: the sheet, then the furniture
	colW      []float64
	blockW, h float64
}

// cautionMin is the narrowest the caution beside the title block is
// wrapped, in characters.
const cautionMin = 30

// foot lays out the footer of page n of m on the page's printable width.
// The furniture (regions, tuning, switch positions) is set in as many
// columns as the width leaves beside a caution of cautionMin characters,
// no taller than it must be: every line of footer is a line the drawing
// cannot use, and a page holds another row only where the footer is short.
func (d *drawer) foot(n, m int) foot {
	cw, _ := d.cfg.Page.content()
	small := symbol.CharW * furnitureW
	lines := d.blockLines(n, m)
	var f foot
	for k := 1; ; k++ {
		g := foot{block: append([][]string{lines[0]}, split(lines[1], k)...)}
		g.colW = make([]float64, len(g.block))
		for c, col := range g.block {
			for _, l := range col {
				g.colW[c] = math.Max(g.colW[c], symbol.TextWidth(l)*furnitureW+1)
			}
			g.blockW += g.colW[c]
		}
		if k > 1 && (g.blockW > cw-cautionMin*small-2 || g.rows() >= f.rows()) {
			break
		}
		f = g
		if k >= len(lines[1]) {
			break
		}
	}
	wrapAt := int(math.Max(cautionMin, (cw-f.blockW-2)/small))
	f.caution = layout.WrapWords(d.caution(), wrapAt)
	lineH := symbol.LineH * furnitureW
	f.h = float64(max(len(f.caution), f.rows()))*lineH + 1.6
	return f
}

// rows is the title block's height in lines.
func (f foot) rows() int {
	n := 0
	for _, col := range f.block {
		n = max(n, len(col))
	}
	return n
}

// split cuts lines into k columns of equal length, in reading order down
// each column.
func split(lines []string, k int) [][]string {
	per := (len(lines) + k - 1) / max(k, 1)
	var out [][]string
	for i := 0; i < len(lines); i += per {
		out = append(out, lines[i:min(i+per, len(lines))])
	}
	return out
}

// blockLines are the title block: the set, the sheet's number, the view
// with the band of interest and the symbol style; beside them the sheet's furniture (bands, IF,
// tuning, level).
func (d *drawer) blockLines(n, m int) [2][]string {
	style := "IEC 60617"
	if d.cfg.Style == IEEE {
		style = "IEEE 315"
	}
	view := "view: " + d.sheet.View.String()
	if b := d.sheet.Circuit.Band; b.Max > 0 {
		view += ", band " + figure.FormatRange(b, figure.Hertz, figure.Sheet)
	}
	return [2][]string{{d.title(), fmt.Sprintf("sheet %d of %d", n, m), view, "symbols: " + style}, d.sheet.Furniture}
}

// pagedPage sizes page n of m: the paper's proportions, one grid unit
// mmPerUnit on paper unless the drawing needs more room, when the whole
// sheet scales down (and its text with it). The title block holds the
// title, so there is no header.
func (d *drawer) pagedPage(n, m int) page {
	p := d.cfg.Page
	b := d.res.Geom.Bounds
	cw, ch := p.content()
	ft := d.foot(n, m)
	pg := page{b: b, title: d.title(), lineH: symbol.LineH * furnitureW, cautionLines: ft.caution, paper: p, foot: ft}
	needH := b.H() + 1 + ft.h
	f := math.Max(1, math.Max(b.W()/cw, needH/ch))
	k := mmPerUnit()
	pg.W, pg.H, pg.m = p.W/k*f, p.H/k*f, marginMM/k*f
	pg.footY = pg.m + ch*f - ft.h + 1
	pg.textMM = MinTextMM / f
	d.ox = pg.m - b.X0
	d.oy = pg.m - b.Y0
	return pg
}

// titleBlock writes the caution at the foot on the left and the title
// block, boxed, at the foot on the right.
func (d *drawer) titleBlock(pg page) {
	k := d.cfg.Grid
	cv := d.canvas
	y := pg.footY + pg.lineH
	for _, l := range pg.cautionLines {
		cv.Text(pg.m*k, y*k, l, `class="sm"`)
		y += pg.lineH
	}
	ft := pg.foot
	x := pg.W - pg.m - ft.blockW
	rows := ft.rows()
	cv.Rect(x*k, pg.footY*k, ft.blockW*k, (float64(rows)*pg.lineH+0.6)*k, `class="fr"`)
	for c, col := range ft.block {
		y = pg.footY + pg.lineH
		for _, l := range col {
			cv.Text((x+0.5)*k, y*k, l, `class="sm"`)
			y += pg.lineH
		}
		x += ft.colW[c]
	}
}
