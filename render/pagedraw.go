package render

import (
	"fmt"
	"math"
	"sort"
	"strings"

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
	block     [][]string // the title block's columns: the sheet, then the legend
	colW      []float64
	blockW, h float64
}

// The title block of a paged sheet has one size whatever the set: the
// sheet's own column (set, sheet n of m, view and band, symbols) and at
// most legendCols columns of legendRows lines for the legend lines about
// what the page draws. A page whose own list is longer says how many lines
// more, which the repair note lists whole. A block that listed every
// region, tuning and switch of the set on every page took the drawing's
// room on each: at 5,000 parts a page held one row, and the set took
// twenty times the pages.
const (
	legendRows = 4  // the sheet's own column is four lines
	legendCols = 3  // at most; fewer where the paper is narrow
	blockChars = 40 // a legend column's width in characters: a longer line wraps
	titleChars = 60 // the set's title, cut beyond with an ellipsis
	cautionMin = 30 // the narrowest the caution beside the block is wrapped, in characters
)

// footLayout is what every page of the sheet shares: the legend's columns,
// the caution wrapped beside the widest block, and the footer's height.
type footLayout struct {
	cols    int
	caution []string
	h       float64
	// the sheet's own column's width, a legend column's, and the caution
	// unwrapped: what the corner footer is set from (footcorner.go)
	headW, colW float64
	cautionText string
}

// footLayout fits the block to the page's printable width: as many legend
// columns (up to legendCols, and no more than the sheet's whole legend
// fills) as leave cautionMin characters for the caution beside the
// sheet's own column.
func (d *drawer) footLayout() footLayout {
	cw, _ := d.cfg.Page.content()
	small := symbol.CharW * furnitureW
	headW := 0.0
	for _, l := range d.sheetLines(9999, 9999) {
		headW = math.Max(headW, symbol.TextWidth(l)*furnitureW+1)
	}
	colW := blockChars*small + 1
	cols := max(1, min(legendCols, int((cw-headW-cautionMin*small-2)/colW)))
	// no wider than the whole legend needs: the caution takes the rest
	all := d.allLegend()
	items := make([][]string, len(all))
	for i, l := range all {
		items[i] = wrapLegend(l, legendRows)
	}
	need, _ := pack(items, legendCols, legendRows, legendRows)
	cols = min(cols, len(need))
	wrapAt := int(math.Max(cautionMin, (cw-headW-float64(cols)*colW-2)/small))
	caution := layout.WrapWords(d.caution(), wrapAt)
	lineH := symbol.LineH * furnitureW
	return footLayout{cols: cols, caution: caution, h: float64(max(len(caution), legendRows))*lineH + 1.6,
		headW: headW, colW: colW, cautionText: d.caution()}
}

// foot lays out the footer of page n of m: the shared layout with the
// page's own legend in its columns.
func (d *drawer) foot(n, m int) foot {
	fl := d.sharedFoot().layout
	legend := fitLegend(d.pageLegend(), fl.cols, legendRows)
	f := foot{caution: fl.caution, h: fl.h, block: append([][]string{d.sheetLines(n, m)}, legend...)}
	f.colW = make([]float64, len(f.block))
	for c, col := range f.block {
		for _, l := range col {
			f.colW[c] = math.Max(f.colW[c], symbol.TextWidth(l)*furnitureW+1)
		}
		f.blockW += f.colW[c]
	}
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

// allLegend is every legend line of the sheet.
func (d *drawer) allLegend() []string {
	if d.sheet.Legend == nil {
		return d.sheet.Furniture
	}
	out := make([]string, len(d.sheet.Legend))
	for i, l := range d.sheet.Legend {
		out[i] = l.Text
	}
	return out
}

// sharedFoot is what every page's footer of a paged sheet shares: the
// layout, and per ref the legend lines about it, so that a page finds its
// lines from its own parts (work growing with the page, not the set).
type sharedFoot struct {
	layout footLayout
	at     map[string][]int // ref -> indexes into Sheet.Legend
}

// sharedFoot is the drawer's shared footer, worked out when not given.
func (d *drawer) sharedFoot() *sharedFoot {
	if d.shared != nil {
		return d.shared
	}
	sf := &sharedFoot{layout: d.footLayout(), at: map[string][]int{}}
	for i, l := range d.sheet.Legend {
		for _, r := range l.Parts {
			sf.at[r] = append(sf.at[r], i)
		}
	}
	d.shared = sf
	return sf
}

// pageLegend is the legend lines about what the page draws: first those
// about every page (the IF, the reduction level), then each whose parts
// include one drawn here, in the sheet's order. A sheet without a legend
// has its furniture on every page.
func (d *drawer) pageLegend() []string {
	if d.sheet.Legend == nil {
		return d.sheet.Furniture
	}
	var out []string
	for _, l := range d.sheet.Legend {
		if len(l.Parts) == 0 {
			out = append(out, l.Text)
		}
	}
	seen := map[int]bool{}
	var own []int
	if d.res != nil {
		at := d.sharedFoot().at
		for _, p := range d.res.Placed {
			for _, i := range at[p.Ref] {
				if !seen[i] {
					seen[i] = true
					own = append(own, i)
				}
			}
		}
	}
	sort.Ints(own)
	for _, i := range own {
		out = append(out, d.sheet.Legend[i].Text)
	}
	return out
}

// fitLegend sets the legend lines in at most cols columns of rows lines:
// a line wider than a column wraps, never from one column into the next;
// when they do not all fit, the last row says how many are left out (the
// repair note lists them all).
func fitLegend(lines []string, cols, rows int) [][]string {
	items := make([][]string, len(lines))
	for i, l := range lines {
		items[i] = wrapLegend(l, rows)
	}
	out, n := pack(items, cols, rows, rows)
	if n == len(items) {
		return out
	}
	out, n = pack(items, cols, rows, rows-1)
	more := fmt.Sprintf("+%d more in the repair note's Legend", len(items)-n)
	if len(out) < cols {
		return append(out, []string{more})
	}
	out[len(out)-1] = append(out[len(out)-1], more)
	return out
}

// pack fills up to cols columns of rows lines (the last of last lines)
// with the items in order, an item whole in one column, and says how many
// it placed. An item taller than an empty column is cut to it.
func pack(items [][]string, cols, rows, last int) ([][]string, int) {
	var out [][]string
	var col []string
	n := 0
	for n < len(items) && len(out) < cols {
		limit := rows
		if len(out) == cols-1 {
			limit = last
		}
		it := items[n]
		if len(col) == 0 && len(it) > limit {
			it = it[:limit]
		}
		if len(col)+len(it) > limit {
			out, col = append(out, col), nil
			continue
		}
		col = append(col, it...)
		n++
	}
	if len(col) > 0 {
		out = append(out, col)
	}
	return out, n
}

// wrapLegend wraps a legend line at blockChars in at most rows rows (kept
// in one column, so the rows read on); what is left over, or a word longer
// than a row, is cut with an ellipsis.
func wrapLegend(l string, rows int) []string {
	out := layout.WrapWords(l, blockChars)
	if len(out) > rows {
		out[rows-1] += "…"
		out = out[:rows]
	}
	for i := range out {
		out[i] = cut(out[i], blockChars)
	}
	return out
}

// cut shortens s to n characters, the last an ellipsis.
func cut(s string, n int) string {
	r := []rune(s)
	if len(r) <= n {
		return s
	}
	return string(r[:n-1]) + "…"
}

// sheetLines are the title block's own column: the set, the sheet's
// number, the view with the band of interest and the symbol style.
func (d *drawer) sheetLines(n, m int) []string {
	style := "IEC 60617"
	if d.cfg.Style == IEEE {
		style = "IEEE 315"
	}
	view := "view: " + d.sheet.View.String()
	if b := d.sheet.Circuit.Band; b.Max > 0 {
		view += ", band " + figure.FormatRange(b, figure.Hertz, figure.Sheet)
	}
	num := fmt.Sprintf("sheet %d of %d", n, m)
	title := layout.WrapWords(d.title(), titleChars)
	if len(title) <= 1 {
		return []string{cut(d.title(), titleChars), num, view, "symbols: " + style}
	}
	// a longer title takes two lines, the sheet's number and the symbols
	// sharing one, so the block keeps its four: review16 a04's title was
	// cut with an ellipsis and a reader took the block for clipped
	if len(title) > 2 {
		title[1] += " " + strings.Join(title[2:], " ")
	}
	return []string{title[0], cut(title[1], titleChars), num + ", symbols: " + style, view}
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
	if needH > ch {
		pg.corner, pg.inCorner = d.cornerPage(b, cw, ch)
	}
	f := math.Max(1, math.Max(b.W()/cw, needH/ch))
	if pg.inCorner {
		f = 1
	}
	k := mmPerUnit()
	pg.W, pg.H, pg.m = p.W/k*f, p.H/k*f, marginMM/k*f
	pg.footY = pg.m + ch*f - ft.h + 1
	if pg.inCorner {
		pg.footY = pg.m + ch - pg.corner.h + 1
	}
	pg.textMM = MinTextMM / f
	d.ox = pg.m - b.X0
	d.oy = pg.m - b.Y0
	return pg
}

// titleBlock writes the caution at the foot on the left and the title
// block, boxed, at the foot on the right.
func (d *drawer) titleBlock(pg page) {
	if pg.inCorner {
		d.titleCorner(pg)
		return
	}
	k := d.cfg.Grid
	cv := d.canvas
	y := pg.footY + pg.lineH
	for _, l := range pg.cautionLines {
		cv.Text(pg.m*k, y*k, l, `class="sm"`)
		y += pg.lineH
	}
	d.block(pg, pg.footY)
}

// block writes the title block, boxed, at the page's right margin from
// height top down.
func (d *drawer) block(pg page, top float64) {
	k := d.cfg.Grid
	cv := d.canvas
	ft := pg.foot
	x := pg.W - pg.m - ft.blockW
	rows := ft.rows()
	cv.Rect(x*k, top*k, ft.blockW*k, (float64(rows)*pg.lineH+0.6)*k, `class="fr"`)
	for c, col := range ft.block {
		y := top + pg.lineH
		for _, l := range col {
			cv.Text((x+0.5)*k, y*k, l, `class="sm"`)
			y += pg.lineH
		}
		x += ft.colW[c]
	}
}
