package render

import (
	"fmt"
	"math"
	"strings"

	"pare/graph"
	"pare/render/geom"
	"pare/render/layout"
	"pare/render/symbol"
)

// draw writes the whole sheet: the page is sized first, because the SVG's
// size and the drawing's offset must be known before anything is written;
// then the header, the drawing's layers in a fixed order (frames behind
// parts, labels on top) and the footer.
func (d *drawer) draw() {
	pg := d.page()
	d.start(pg)
	d.frames()
	d.parts()
	d.locals()
	d.wires()
	d.labels()
	d.footer(pg)
	d.canvas.End()
}

// page is the sheet's size and the text around the drawing, worked out
// before anything is drawn.
type page struct {
	b            geom.Rect // the drawing's bounds, in grid units
	W, H         float64   // the sheet, in grid units
	title        string
	info         []string // header lines under the title
	cautionLines []string // the caution, wrapped
	furn         []string // the info block in the footer
	lineH        float64  // line pitch of small text
	m            float64  // the margin round the sheet
	// a paged sheet (pagedraw.go): the paper, where the footer starts, the
	// title block's width and the text height on paper
	paper         *Paper
	foot          foot
	footY, textMM float64
	// a paged sheet's footer set in the bottom right corner (footcorner.go)
	corner   footCorner
	inCorner bool
}

// page sizes the sheet: wide enough for the drawing, the title and every
// line of furniture, tall enough for header, drawing and footer; it sets
// the drawing's origin so the drawing is centred.
func (d *drawer) page() page {
	b := d.res.Geom.Bounds
	if b == (geom.Rect{}) {
		b = geom.Rect{X1: 10, Y1: 4}
	}
	pg := page{b: b, title: d.title(), info: d.infoLines(), furn: d.sheet.Furniture,
		lineH: symbol.LineH * furnitureW}
	small := symbol.CharW * furnitureW
	width := b.W()
	width = math.Max(width, symbol.TextWidth(pg.title)*titleSize)
	for _, l := range append(append([]string{}, pg.info...), pg.furn...) {
		width = math.Max(width, symbol.TextWidth(l)*furnitureW+1)
	}
	// the caution wraps at the drawing width (at least 60 characters)
	wrapAt := int(math.Max(60, width/small))
	pg.cautionLines = layout.WrapWords(d.caution(), wrapAt)
	for _, l := range pg.cautionLines {
		width = math.Max(width, float64(len([]rune(l)))*small)
	}
	footH := 1.5 + float64(len(pg.cautionLines))*pg.lineH
	if len(pg.furn) > 0 {
		footH += 1 + float64(len(pg.furn))*pg.lineH + 0.6
	}
	pg.m = margin
	pg.W = width + 2*margin
	pg.H = margin + headerH + b.H() + footH + margin
	d.ox = margin - b.X0 + (width-b.W())/2
	d.oy = margin + headerH - b.Y0
	return pg
}

// title is the sheet's title, the circuit's, or a generic one: an SVG
// without a title reads badly in a file browser.
func (d *drawer) title() string {
	if d.sheet.Title != "" {
		return d.sheet.Title
	}
	if d.sheet.Circuit.Title != "" {
		return d.sheet.Circuit.Title
	}
	return "pare sheet"
}

// start opens the SVG with its size, title, description and style sheet,
// paints the white ground and writes the header. The style sheet is scaled
// to the grid so strokes and text keep their proportions at any Grid.
func (d *drawer) start(pg page) {
	k := d.cfg.Grid
	cv := d.canvas
	cv.Decimals = 2
	view := fmt.Sprintf(`viewBox="0 0 %s %s"`, num(pg.W*k), num(pg.H*k))
	desc := "Signal-path sheet drawn by pare, " + d.sheet.View.String() + " view."
	if pg.paper != nil {
		cv.Startunit(pg.paper.W, pg.paper.H, "mm", view)
		desc += fmt.Sprintf(" For %s landscape; smallest text %s mm high printed.", pg.paper.Name, num(pg.textMM))
	} else {
		cv.Start(pg.W*k, pg.H*k, view)
	}
	cv.Title(pg.title)
	cv.Desc(desc)
	sw := 0.15 * k
	cv.Style("text/css", fmt.Sprintf(`
.s{fill:none;stroke:#000;stroke-width:%[1]s;stroke-linecap:round;stroke-linejoin:round}
.t{stroke-width:%[2]s}
.d{stroke-dasharray:%[3]s}
.f{fill:#000}
.g .s{stroke:#a8a8a8}
.g .f{fill:#a8a8a8}
.g text{fill:#a8a8a8}
text{font-family:'DejaVu Sans Mono',monospace;font-size:%[4]spx;fill:#000}
.sm{font-size:%[5]spx}
.ttl{font-size:%[6]spx;font-weight:bold}
.mk{font-style:italic}
.fr{fill:none;stroke:#555;stroke-width:%[7]s;stroke-dasharray:%[8]s}
.lk{fill:none;stroke:#000;stroke-width:%[7]s;stroke-dasharray:%[8]s}
`, num(sw), num(2*sw), num(0.3*k)+" "+num(0.25*k), num(k), num(k*symbol.SmallScale), num(k*titleSize),
		num(0.07*k), num(0.5*k)+" "+num(0.3*k)))
	cv.Rect(0, 0, pg.W*k, pg.H*k, `fill="#fff"`)
	if pg.paper != nil {
		return // the title block holds the title
	}
	// header
	cv.Text(pg.m*k, (pg.m+titleSize)*k, pg.title, `class="ttl"`)
	for i, l := range pg.info {
		cv.Text(pg.m*k, (pg.m+titleSize+1.4+float64(i)*pg.lineH)*k, l, `class="sm"`)
	}
}

// frames draws the stage frames with their titles, first, so that every
// part and wire is drawn over the dashed edges.
func (d *drawer) frames() {
	k := d.cfg.Grid
	cv := d.canvas
	cv.Group(`id="frames"`)
	for _, f := range d.res.Geom.Frames {
		cv.Rect(d.X(f.Box.X0), d.Y(f.Box.Y0), f.Box.W()*k, f.Box.H()*k, `class="fr"`)
		d.label(f.Title, true)
	}
	cv.Gend()
}

// RailFlag is the ref prefix of the flag a supply's rail, wired along its
// smoothing chain, ends at where it goes on to other stages (the pipeline
// adds it to the full and faded sheets' circuit); "@" cannot begin a
// netlist ref, so it never meets a part of the circuit.
const RailFlag = "@rail:"

// RailText is the tag a rail's pins carry on a sheet: its label, its
// voltage, or both.
func RailText(n *graph.Net) string { return layout.RailText(n) }

// flagTitle is a symbol's hover title: its ref, or for one of the sheet's
// own flags ("@in:NET", "@out:NET", a supply rail's "@rail:NET") the net.
func flagTitle(ref string) string {
	for _, pre := range []string{"@in:", "@out:", RailFlag} {
		if strings.HasPrefix(ref, pre) {
			return ref[len(pre):]
		}
	}
	return ref
}

// parts draws each placed symbol in its own group carrying its ref, so a
// viewer can pick a part out of the SVG; faded parts get the grey class.
func (d *drawer) parts() {
	cv := d.canvas
	cv.Group(`id="parts"`)
	for _, pl := range d.res.Placed {
		cls := "part"
		if pl.Faded {
			cls += " g"
		}
		cv.Group(`class="`+cls+`"`, `data-ref="`+attr(pl.Ref)+`"`)
		cv.Title(flagTitle(pl.Ref))
		for _, pr := range pl.Shape.Prims {
			d.prim(pr)
		}
		cv.Gend()
	}
	cv.Gend()
}

// locals draws the ground, rail and net-name symbols.
func (d *drawer) locals() {
	d.canvas.Group(`id="locals"`)
	for _, l := range d.res.Geom.Locals {
		d.local(l)
	}
	d.canvas.Gend()
}

// wires draws each net's wires as one path (its faded segments as a second,
// grey one), then the junction dots and the dashed links, all in one group.
func (d *drawer) wires() {
	g := &d.res.Geom
	k := d.cfg.Grid
	cv := d.canvas
	cv.Group(`id="wires"`)
	for _, w := range g.Wires {
		var live, faded strings.Builder
		for i, s := range w.Segs {
			sb := &live
			if w.Faded[i] {
				sb = &faded
			}
			sb.WriteString("M" + d.p(s.A) + "L" + d.p(s.B))
		}
		if live.Len() > 0 {
			cv.Path(live.String(), `class="s"`, `data-net="`+attr(w.Net)+`"`)
		}
		if faded.Len() > 0 {
			cv.Group(`class="g"`)
			cv.Path(faded.String(), `class="s"`, `data-net="`+attr(w.Net)+`"`)
			cv.Gend()
		}
	}
	// a junction of faded runs only is faded too: a run ends at every
	// junction, so a dot no live run ends at joins nothing black
	live := map[geom.Pt]bool{}
	for _, w := range g.Wires {
		for i, s := range w.Segs {
			if !w.Faded[i] {
				live[s.A], live[s.B] = true, true
			}
		}
	}
	for _, dot := range g.Dots {
		if live[dot] {
			cv.Circle(d.X(dot.X), d.Y(dot.Y), 0.28*k, `class="f"`)
			continue
		}
		cv.Group(`class="g"`)
		cv.Circle(d.X(dot.X), d.Y(dot.Y), 0.28*k, `class="f"`)
		cv.Gend()
	}
	for _, l := range g.Links {
		var xs, ys []float64
		for _, q := range l.Path {
			xs, ys = append(xs, d.X(q.X)), append(ys, d.Y(q.Y))
		}
		cv.Polyline(xs, ys, `class="lk"`)
	}
	cv.Gend()
}

// labels draws the part and net labels last, on top of everything; frame
// titles were drawn with their frames.
func (d *drawer) labels() {
	d.canvas.Group(`id="labels"`)
	for _, l := range d.res.Geom.Labels {
		if strings.HasPrefix(l.Owner, "frame:") {
			continue
		}
		d.label(l, false)
	}
	d.canvas.Gend()
}

// footer writes the caution under the drawing, then the info block in its
// own box.
func (d *drawer) footer(pg page) {
	k := d.cfg.Grid
	cv := d.canvas
	y := margin + headerH + pg.b.H() + 1.5
	for _, l := range pg.cautionLines {
		cv.Text(margin*k, y*k, l, `class="sm"`)
		y += pg.lineH
	}
	if len(pg.furn) == 0 {
		return
	}
	y += 0.4
	tw := 0.0
	for _, l := range pg.furn {
		tw = math.Max(tw, symbol.TextWidth(l)*furnitureW)
	}
	top := y - pg.lineH + 0.1
	cv.Rect(margin*k, top*k, (tw+1)*k, (float64(len(pg.furn))*pg.lineH+0.6)*k, `class="fr"`)
	y += 0.3
	for _, l := range pg.furn {
		cv.Text((margin+0.5)*k, y*k, l, `class="sm"`)
		y += pg.lineH
	}
}

func (d *drawer) label(l geom.Label, frame bool) {
	cv := d.canvas
	if l.Faded {
		cv.Group(`class="g"`)
	}
	y := l.Box.Y0
	for i, line := range l.Lines {
		y += symbol.LineH
		cls := ""
		switch {
		case frame && i < l.Head:
			cls = `class="mk"`
		case frame || i > 0 || l.Small:
			cls = `class="sm"`
		}
		if i > 0 && !frame && !l.Small && l.Faded {
			// markers stay black on faded parts: they say where the part went
			cv.Gend()
			cv.Text(d.X(l.Box.X0), d.Y(y-0.3), line, `class="sm mk"`)
			cv.Group(`class="g"`)
			continue
		}
		if cls == "" {
			cv.Text(d.X(l.Box.X0), d.Y(y-0.3), line)
		} else {
			cv.Text(d.X(l.Box.X0), d.Y(y-0.3), line, cls)
		}
	}
	if l.Faded {
		cv.Gend()
	}
}

func (d *drawer) prim(pr symbol.Prim) {
	cv := d.canvas
	k := d.cfg.Grid
	cls := "s"
	if pr.Thick {
		cls += " t"
	}
	if pr.Dash {
		cls += " d"
	}
	if pr.Fill {
		cls += " f"
	}
	c := `class="` + cls + `"`
	switch pr.Kind {
	case symbol.Line:
		var sb strings.Builder
		for i, q := range pr.Pts {
			if i == 0 {
				sb.WriteString("M")
			} else {
				sb.WriteString("L")
			}
			sb.WriteString(d.p(q))
		}
		if pr.Closed {
			sb.WriteString("Z")
		}
		cv.Path(sb.String(), c)
	case symbol.Circle:
		cv.Circle(d.X(pr.Pts[0].X), d.Y(pr.Pts[0].Y), pr.R*k, c)
	case symbol.Arc:
		sweep := "0"
		if pr.Sweep {
			sweep = "1"
		}
		r := num(pr.R * k)
		cv.Path("M"+d.p(pr.Pts[0])+"A"+r+" "+r+" 0 0 "+sweep+" "+d.p(pr.Pts[1]), c)
	case symbol.Text:
		cv.Text(d.X(pr.Pts[0].X), d.Y(pr.Pts[0].Y+0.3), pr.Text, `class="sm"`)
	}
}

func (d *drawer) local(l geom.Local) {
	cv := d.canvas
	if l.Faded {
		cv.Group(`class="g"`)
	}
	var sb strings.Builder
	for _, s := range l.Stub {
		sb.WriteString("M" + d.p(s.A) + "L" + d.p(s.B))
	}
	cv.Path(sb.String(), `class="s"`)
	switch l.Kind {
	case geom.LocalGround:
		ps, _ := symbol.Ground(l.At, !l.Down, symbol.Style(d.cfg.Style))
		for _, p := range ps {
			d.prim(p)
		}
	case geom.LocalRail:
		// the bar lies across the stub's last run (a tank winding's tag
		// may turn down beside its capacitor)
		last := l.Stub[len(l.Stub)-1]
		horizontal := last.A.X == last.B.X
		for _, p := range symbol.RailBar(l.At, horizontal) {
			d.prim(p)
		}
		d.text(l.TextBox, l.Text)
	case geom.LocalFlag:
		d.text(l.TextBox, l.Text)
		r := l.TextBox
		cv.Rect(d.X(r.X0), d.Y(r.Y0), r.W()*d.cfg.Grid, r.H()*d.cfg.Grid, `class="s"`)
	}
	if l.Faded {
		cv.Gend()
	}
}

// text sets small text in its box, left-aligned on the box's baseline.
func (d *drawer) text(r geom.Rect, s string) {
	h := symbol.LineH * symbol.SmallScale
	d.canvas.Text(d.X(r.X0+0.15), d.Y(r.Y0+h-0.3*symbol.SmallScale), s, `class="sm"`)
}
