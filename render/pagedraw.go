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
// text prints at MinTextMM (larger only when a row does not fit).
func (d *drawer) drawPaged(n, m int) {
	pg := d.pagedPage(n, m)
	d.start(pg)
	d.frames()
	d.parts()
	d.locals()
	d.wires()
	d.labels()
	d.titleBlock(pg)
	d.canvas.End()
}

// foot is the footer of a paged sheet: the caution wrapped beside the
// title block, and its height.
type foot struct {
	caution   []string
	block     [2][]string // the title block's columns: the sheet, the furniture
	colW      [2]float64
	blockW, h float64
}

// foot lays out the footer of page n of m on the page's printable width.
func (d *drawer) foot(n, m int) foot {
	cw, _ := d.cfg.Page.content()
	f := foot{block: d.blockLines(n, m)}
	for c, col := range f.block {
		for _, l := range col {
			f.colW[c] = math.Max(f.colW[c], symbol.TextWidth(l)*furnitureW+1)
		}
	}
	f.blockW = f.colW[0] + f.colW[1]
	small := symbol.CharW * furnitureW
	wrapAt := int(math.Max(30, (cw-f.blockW-2)/small))
	f.caution = layout.WrapWords(d.caution(), wrapAt)
	lineH := symbol.LineH * furnitureW
	f.h = float64(max(len(f.caution), len(f.block[0]), len(f.block[1])))*lineH + 1.6
	return f
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
	rows := max(len(ft.block[0]), len(ft.block[1]))
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
