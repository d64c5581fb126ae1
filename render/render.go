// Package render draws pare's signal-path sheet: a circuit (reduced, full, or
// the original with the removed parts faded) laid out along the signal flow
// with IEC 60617 or IEEE 315 symbols, local ground and rail symbols, stage
// frames and the sheet's furniture, written as a self-contained SVG.
//
// It knows only the circuit model; the command fills a Sheet from the
// reduction log and the stages it found. The geometry that is drawn is the
// geometry package check measures (Config.Geometry).
package render

import (
	"bytes"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	svg "github.com/ajstarks/svgo/float"

	"pare/graph"
	"pare/graph/safety"
	"pare/graph/value"
	"pare/render/geom"
	"pare/render/layout"
	"pare/render/symbol"
)

// Style is the symbol convention of a sheet.
type Style int

// Symbol conventions.
const (
	IEC  Style = iota // IEC 60617: rectangle resistor (the default)
	IEEE              // IEEE 315: zig-zag resistor
)

// ParseStyle reads "iec" or "ieee".
func ParseStyle(s string) (Style, error) {
	switch strings.ToLower(s) {
	case "iec", "":
		return IEC, nil
	case "ieee":
		return IEEE, nil
	}
	return IEC, fmt.Errorf("unknown symbol style %q (want iec or ieee)", s)
}

func (s Style) String() string {
	if s == IEEE {
		return "ieee"
	}
	return "iec"
}

// View says which circuit a sheet shows.
type View int

// Views.
const (
	Reduced View = iota // the reduced circuit (default)
	Full                // the original circuit
	Faded               // the original, with removed parts faded and merged parts marked
)

// ParseView reads "reduced", "full" or "faded".
func ParseView(s string) (View, error) {
	switch strings.ToLower(s) {
	case "reduced", "":
		return Reduced, nil
	case "full":
		return Full, nil
	case "faded":
		return Faded, nil
	}
	return Reduced, fmt.Errorf("unknown view %q (want reduced, full or faded)", s)
}

func (v View) String() string {
	switch v {
	case Full:
		return "full"
	case Faded:
		return "faded"
	}
	return "reduced"
}

// Frame is a stage frame: title, a line of key figures, and its parts.
type Frame struct {
	Title, Subtitle string
	Parts           []string
}

// Sheet is what to draw.
type Sheet struct {
	Circuit *graph.Circuit
	Title   string
	View    View
	Faded   map[string]bool   // refs drawn faded (removed by the reduction)
	Merged  map[string]string // original ref -> ref of the reduced part it went into
	Frames  []Frame
	// Caution is the safety line printed under the drawing, as given
	// (graph/safety words it for the set and the view). Empty: the
	// circuit's own caution from graph/safety, so no sheet goes out
	// without one.
	Caution string
	// Furniture holds lines for the sheet's info block: IF, tuning range, level.
	Furniture []string
	// Volts holds per ref the DC voltages at its electrodes, drawn small in
	// its label on the full and faded views (never on a reduced one).
	Volts map[string]string
}

// Config says how to draw.
type Config struct {
	Style Style
	Grid  float64 // SVG units per grid step; 0 means 10
}

// Geometry lays the sheet out and returns the geometry that Fprint draws.
func (cfg Config) Geometry(s *Sheet) (*geom.Sheet, error) {
	r, err := cfg.layout(s)
	if err != nil {
		return nil, err
	}
	return &r.Geom, nil
}

func (cfg Config) layout(s *Sheet) (*layout.Result, error) {
	if s == nil || s.Circuit == nil {
		return nil, fmt.Errorf("render: no circuit to draw")
	}
	o := layout.Options{Style: symbol.Style(cfg.Style), Links: s.View != Reduced, Untangle: s.View == Reduced,
		HideUnconnected: s.View == Reduced}
	if s.View == Faded {
		o.Faded, o.Merged = s.Faded, s.Merged
	}
	if s.View != Reduced {
		o.Volts = s.Volts
	}
	for _, f := range s.Frames {
		o.Frames = append(o.Frames, layout.Frame{Title: f.Title, Subtitle: f.Subtitle, Parts: f.Parts})
	}
	r, err := layout.Layout(s.Circuit, o)
	if err != nil {
		return nil, fmt.Errorf("render: %w", err)
	}
	return r, nil
}

// Fprint draws the sheet as SVG on w. Nothing is written if the sheet cannot
// be drawn.
func (cfg Config) Fprint(w io.Writer, s *Sheet) error {
	if cfg.Grid <= 0 {
		cfg.Grid = 10
	}
	r, err := cfg.layout(s)
	if err != nil {
		return err
	}
	var buf bytes.Buffer
	d := &drawer{cfg: cfg, canvas: textSafe{svg.New(&buf)}, sheet: s, res: r}
	d.draw()
	_, err = w.Write(buf.Bytes())
	return err
}

type drawer struct {
	cfg    Config
	canvas textSafe
	sheet  *Sheet
	res    *layout.Result
	ox, oy float64 // sheet position of grid origin, in grid units
}

// Sheet furniture sizes, in grid units.
const (
	margin     = 2.0
	titleSize  = 1.6
	headerH    = 5.0
	furnitureW = 0.85
)

func num(v float64) string {
	s := strconv.FormatFloat(math.Round(v*100)/100, 'f', -1, 64)
	if s == "-0" {
		return "0"
	}
	return s
}

// X and Y map grid coordinates to SVG units.
func (d *drawer) X(x float64) float64 { return (x + d.ox) * d.cfg.Grid }
func (d *drawer) Y(y float64) float64 { return (y + d.oy) * d.cfg.Grid }

func (d *drawer) p(q geom.Pt) string { return num(d.X(q.X)) + " " + num(d.Y(q.Y)) }

// attr keeps only characters that are safe inside an XML attribute and a
// CSS or id token; user strings never reach an attribute otherwise.
func attr(s string) string {
	var b strings.Builder
	for _, r := range s {
		switch {
		case r >= 'a' && r <= 'z', r >= 'A' && r <= 'Z', r >= '0' && r <= '9', r == '-', r == '_', r == '.':
			b.WriteRune(r)
		default:
			b.WriteByte('_')
		}
	}
	return b.String()
}

func (d *drawer) caution() string {
	if d.sheet.Caution != "" {
		return d.sheet.Caution
	}
	return safety.For(d.sheet.Circuit).Sheet(d.sheet.View == Reduced)
}

func (d *drawer) infoLines() []string {
	c := d.sheet.Circuit
	lines := []string{"view: " + d.sheet.View.String() + ", " + d.cfg.Style.String() + " symbols"}
	if c.Band.Max > 0 {
		lines[0] += ", band " + value.FormatRange(c.Band, value.Hertz, value.Symbol)
	}
	return lines
}

func (d *drawer) draw() {
	g := &d.res.Geom
	b := g.Bounds
	if b == (geom.Rect{}) {
		b = geom.Rect{X1: 10, Y1: 4}
	}
	title := d.sheet.Title
	if title == "" {
		title = d.sheet.Circuit.Title
	}
	if title == "" {
		title = "pare sheet"
	}
	caution := d.caution()
	info := d.infoLines()
	furn := d.sheet.Furniture
	small := symbol.CharW * furnitureW
	width := b.W()
	width = math.Max(width, symbol.TextWidth(title)*titleSize)
	for _, l := range append(append([]string{}, info...), furn...) {
		width = math.Max(width, symbol.TextWidth(l)*furnitureW+1)
	}
	// the caution wraps at the drawing width (at least 60 characters)
	wrapAt := int(math.Max(60, width/small))
	cautionLines := layout.WrapWords(caution, wrapAt)
	for _, l := range cautionLines {
		width = math.Max(width, float64(len([]rune(l)))*small)
	}
	lineH := symbol.LineH * furnitureW
	footH := 1.5 + float64(len(cautionLines))*lineH
	if len(furn) > 0 {
		footH += 1 + float64(len(furn))*lineH + 0.6
	}
	W := width + 2*margin
	H := margin + headerH + b.H() + footH + margin
	d.ox = margin - b.X0 + (width-b.W())/2
	d.oy = margin + headerH - b.Y0
	k := d.cfg.Grid
	cv := d.canvas
	cv.Decimals = 2
	cv.Start(W*k, H*k, fmt.Sprintf(`viewBox="0 0 %s %s"`, num(W*k), num(H*k)))
	cv.Title(title)
	cv.Desc("Signal-path sheet drawn by pare, " + d.sheet.View.String() + " view.")
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
	cv.Rect(0, 0, W*k, H*k, `fill="#fff"`)
	// header
	cv.Text(margin*k, (margin+titleSize)*k, title, `class="ttl"`)
	for i, l := range info {
		cv.Text(margin*k, (margin+titleSize+1.4+float64(i)*lineH)*k, l, `class="sm"`)
	}
	cv.Group(`id="frames"`)
	for _, f := range g.Frames {
		cv.Rect(d.X(f.Box.X0), d.Y(f.Box.Y0), f.Box.W()*k, f.Box.H()*k, `class="fr"`)
		d.label(f.Title, true)
	}
	cv.Gend()
	cv.Group(`id="parts"`)
	for _, pl := range d.res.Placed {
		cls := "part"
		if pl.Faded {
			cls += " g"
		}
		cv.Group(`class="`+cls+`"`, `data-ref="`+attr(pl.Ref)+`"`)
		cv.Title(strings.TrimPrefix(strings.TrimPrefix(pl.Ref, "@in:"), "@out:"))
		for _, pr := range pl.Shape.Prims {
			d.prim(pr)
		}
		cv.Gend()
	}
	cv.Gend()
	cv.Group(`id="locals"`)
	for _, l := range g.Locals {
		d.local(l)
	}
	cv.Gend()
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
	for _, dot := range g.Dots {
		cv.Circle(d.X(dot.X), d.Y(dot.Y), 0.28*k, `class="f"`)
	}
	for _, l := range g.Links {
		var xs, ys []float64
		for _, q := range l.Path {
			xs, ys = append(xs, d.X(q.X)), append(ys, d.Y(q.Y))
		}
		cv.Polyline(xs, ys, `class="lk"`)
	}
	cv.Gend()
	cv.Group(`id="labels"`)
	for _, l := range g.Labels {
		if strings.HasPrefix(l.Owner, "frame:") {
			continue
		}
		d.label(l, false)
	}
	cv.Gend()
	// footer: caution, then the info block
	y := margin + headerH + b.H() + 1.5
	for _, l := range cautionLines {
		cv.Text(margin*k, y*k, l, `class="sm"`)
		y += lineH
	}
	if len(furn) > 0 {
		y += 0.4
		tw := 0.0
		for _, l := range furn {
			tw = math.Max(tw, symbol.TextWidth(l)*furnitureW)
		}
		top := y - lineH + 0.1
		cv.Rect(margin*k, top*k, (tw+1)*k, (float64(len(furn))*lineH+0.6)*k, `class="fr"`)
		y += 0.3
		for _, l := range furn {
			cv.Text((margin+0.5)*k, y*k, l, `class="sm"`)
			y += lineH
		}
	}
	cv.End()
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
		case frame || i > 0:
			cls = `class="sm"`
		}
		if i > 0 && !frame && l.Faded {
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
		ps, _ := symbol.Ground(l.At, !l.Down)
		for _, p := range ps {
			d.prim(p)
		}
	case geom.LocalRail:
		horizontal := l.Stub[0].A.X == l.Stub[0].B.X
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
