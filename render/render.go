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
	"pare/graph/figure"
	"strconv"
	"strings"

	svg "github.com/ajstarks/svgo/float"

	"pare/graph"
	"pare/graph/safety"
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
	// Places are the stage's drawing templates, its own and its
	// sub-stages', each one's parts round its anchor (layout.Place).
	Places []Place
	// Joined keeps the frame on one stretch with the frame before it: the
	// rows of a page never cut between them (a supply's smoothing filter
	// and its rectifier, drawn as one piece).
	Joined bool
	// Supply marks a power supply's stage (a rectifier, the smoothing
	// section on its output): its parts are laid out along the supply's
	// own flow, mains to rails (layout.Frame.Supply).
	Supply bool
	// Apart marks, on a reduced sheet, a supply filter the reduction kept
	// (a smoothing filter, a decoupler; not a screen feed, which the trade
	// draws at its valve): its stretch goes on rows of its own after the
	// signal's, joined to the stages by off-row connectors (apartLast).
	Apart bool
}

// Legend is one line of a paged sheet's title block and the parts of the
// circuit drawn it concerns (a region's parts, a tuned stage's, a switch
// and its neighbours); none: the line concerns every page (the IF, the
// reduction level).
type Legend struct {
	Text  string
	Parts []string
}

// Place is one part of a stage's drawing template (see layout.Place).
type Place = layout.Place

// StandFlipped stands a device upside down (layout.StandFlipped).
const StandFlipped = layout.StandFlipped

// Sheet is what to draw.
type Sheet struct {
	Circuit *graph.Circuit
	Title   string
	View    View
	Faded   map[string]bool   // refs drawn faded (removed by the reduction)
	Merged  map[string]string // original ref -> ref of the reduced part it went into
	// FadedPins are, per ref of a kept part, the pins the reduction dropped
	// (heaters, static grids): drawn faded with their wires and locals.
	FadedPins map[string]map[string]bool
	// Quiet are the original circuit's nets the reduction tied to AC
	// ground (full and faded views; layout.Options.Quiet).
	Quiet  map[string]bool
	Frames []Frame
	// Caution is the safety line printed under the drawing, as given
	// (graph/safety words it for the set and the view). Empty: the
	// circuit's own caution from graph/safety, so no sheet goes out
	// without one.
	Caution string
	// Furniture holds lines for the sheet's info block: IF, tuning range, level.
	Furniture []string
	// Legend is the furniture line by line with the parts each line
	// concerns, for the title block of a paged sheet: a page lists only the
	// lines about what is drawn on it (pagedraw.go). Nil: every line of
	// Furniture concerns every page.
	Legend []Legend
	// PinVolts holds per ref and pin the DC voltage at an electrode, drawn
	// small beside the pin on the full and faded views (never on a reduced
	// one).
	PinVolts map[string]map[string]string
	// Marks holds per ref the alignment steps turned at it ("align 3, 4"),
	// drawn small in its label on every view.
	Marks map[string]string
	// Ties holds, per ref and pin, where a valve electrode the reduction
	// made static is held: the reduced view keeps its grid line with a stub
	// to that mark. On the full and faded views it holds only the grids
	// wired to their own cathode that are drawn as the internal strap
	// instead of a lead (a push-pull pair's suppressors); every other
	// electrode keeps its lead there.
	Ties map[string]map[string]Tie
	// TieLabels holds, per ref, the line of its label that names the rails
	// its electrodes tied to a rail (TieRail) are held at ("g2, g4 HT via
	// R3 +96.2 V"): the rail bar alone does not say which rail.
	TieLabels map[string]string
	// Presets holds, per ref of the circuit drawn, the trimmers merged into
	// the part: the merged symbol keeps the preset mark.
	Presets map[string][]string
	// continues are a row's off-row connectors when a paged sheet is cut
	// into rows (pages.go).
	continues []layout.Continuation
	// supplyFlow is, on a row of a paged sheet, the whole sheet's supply
	// flow (layout.SupplyFlow), so a row holding part of a supply draws it
	// in the whole supply's order.
	supplyFlow map[string]int
	// returns are, on a row of a paged sheet, the whole sheet's bias
	// returns (layout.Options.Returns): the row may hold a shunt to a
	// bypassed cathode but not its bypass.
	returns map[string]bool
	// fromFirst ranks a row from its first part, not from the nets that
	// come in (layout.Options.RankFromFirst)
	fromFirst bool
	// compact stacks a row's blocks closer (layout.Options.Compact)
	compact bool
	// closeGaps takes back the columns a template left empty
	// (layout.Options.CloseGaps)
	closeGaps bool
	// placed is the sheet placed without routing for its extents or its
	// least box, which its layout takes instead of placing it again
	// (layout.Options.Placed); nil once laid out, and on a copy.
	placed *layout.Placement
	// row is set on a row of a paged sheet (flow.sheet)
	row bool
}

// Tie is where a static valve electrode is held (render/symbol).
type Tie = symbol.Tie

// Ties of a static electrode.
const (
	TieGround  = symbol.TieGround  // at AC ground
	TieCathode = symbol.TieCathode // strapped to the cathode
	TieRail    = symbol.TieRail    // at a supply rail or a line fed from one
)

// Config says how to draw.
type Config struct {
	Style Style
	Grid  float64 // SVG units per grid step; 0 means 10
	// Page is the paper the sheet is printed on (FprintPages): nil draws
	// one sheet as wide as the drawing.
	Page *Paper
	// placed is the sheet's parts placed without routing
	// (layout.Extents), when FprintFitPages has worked it out already:
	// the paged drawing starts from the same placement.
	placed map[string]geom.Rect
}

// Geometry lays the sheet out and returns the geometry that Fprint draws.
func (cfg Config) Geometry(s *Sheet) (*geom.Sheet, error) {
	r, err := cfg.layout(s)
	if err != nil {
		return nil, err
	}
	return &r.Geom, nil
}

// placementsOff makes every layout place its sheet afresh (the test that
// proves a placement kept for a layout, or let go, changes nothing).
var placementsOff bool

func (cfg Config) layout(s *Sheet) (*layout.Result, error) {
	if s == nil || s.Circuit == nil {
		return nil, fmt.Errorf("render: no circuit to draw")
	}
	o := cfg.options(s)
	o.Placed, s.placed = s.placed, nil // a placement is laid out once
	if placementsOff {
		o.Placed = nil
	}
	r, err := layout.Layout(s.Circuit, o)
	if err != nil {
		return nil, fmt.Errorf("render: %w", err)
	}
	return r, nil
}

// options are the layout options of a sheet.
func (cfg Config) options(s *Sheet) layout.Options {
	// the gang link is drawn on every view: it is how the trade shows that
	// the sections turn together, reduced or not
	o := layout.Options{Style: symbol.Style(cfg.Style), Links: true, Untangle: untangles(s),
		HideUnconnected: s.View == Reduced, Ties: s.Ties, TieLabels: s.TieLabels, Presets: s.Presets}
	// The full and the faded view are one layout (the full sheet carries
	// the reduction's faded and merged parts too): the full view draws it
	// in plain ink, so the two show the same geometry.
	if s.View != Reduced {
		o.Faded, o.Merged, o.FadedPins, o.Quiet = s.Faded, s.Merged, s.FadedPins, s.Quiet
		o.Plain = s.View == Full
		o.LeadsApart = true
	}
	if s.View != Reduced {
		o.PinVolts = s.PinVolts
	}
	o.Marks = s.Marks
	o.Returns = s.returns
	o.Continues = s.continues
	o.SupplyFlow = s.supplyFlow
	o.RankFromFirst = s.fromFirst
	o.Compact = s.compact
	o.CloseGaps = s.closeGaps
	o.DeviceStages = s.row
	for _, f := range s.Frames {
		o.Frames = append(o.Frames, layout.Frame{Title: f.Title, Subtitle: f.Subtitle, Parts: f.Parts, Places: f.Places, Supply: f.Supply})
	}
	return o
}

// untangles says whether sheet s is laid out with the untangle search
// (options): asked alone, it need not build the whole sheet's options,
// whose frames grow with the set, for every row the flow tries.
func untangles(s *Sheet) bool { return s.View == Reduced }

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

// FprintFit draws the sheet as one piece, as Fprint does, and reports
// whether that piece, printed with its smallest text MinTextMM high, is no
// taller than paper p's printable area and no wider than widths of it side
// by side: a caller that cuts a sheet onto p only when it is too big lays
// it out once for both answers.
func (cfg Config) FprintFit(s *Sheet, p *Paper, widths float64) ([]byte, bool, error) {
	if cfg.Grid <= 0 {
		cfg.Grid = 10
	}
	if s != nil && s.Circuit != nil && placedTooBig(cfg.extents(s), p, widths) {
		return nil, false, nil
	}
	r, err := cfg.layout(s)
	if err != nil {
		return nil, false, err
	}
	var buf bytes.Buffer
	d := &drawer{cfg: cfg, canvas: textSafe{svg.New(&buf)}, sheet: s, res: r}
	pg := d.page()
	cw, ch := p.content()
	d.draw()
	return buf.Bytes(), pg.W <= widths*cw && pg.H <= ch, nil
}

// placedTooBig says whether the sheet's parts, placed but not yet routed,
// already take more than widths of paper p side by side or more than its
// height, by more than rowSlack: routing only adds to a sheet, so it could
// not fit, and a whole set's sheet (hundreds of parts, routed only to be
// cut into rows after) is not routed at all.
func placedTooBig(placed map[string]geom.Rect, p *Paper, widths float64) bool {
	b := geom.Rect{}
	for _, r := range placed {
		b = b.Union(r) // min and max: the map's order does not matter
	}
	cw, ch := p.content()
	return b.W() > widths*cw+rowSlack || b.H() > ch+rowSlack
}

// FprintFitPages is FprintFit and, for a sheet that does not fit, the
// pages FprintPagesText cuts it into on p (paged true): both start from
// the sheet's parts placed without routing, which a whole set's sheet
// takes a good part of its drawing time to work out, so it is worked out
// once.
func (cfg Config) FprintFitPages(s *Sheet, p *Paper, widths float64) (pages [][]byte, mm []float64, paged bool, err error) {
	if s != nil && s.Circuit != nil {
		cfg.placed, s.placed = layout.ExtentsPlaced(s.Circuit, cfg.options(s))
	}
	one, fits, err := cfg.FprintFit(s, p, widths)
	if err != nil || fits {
		return [][]byte{one}, []float64{0}, false, err
	}
	cfg.Page = p
	pages, mm, err = cfg.FprintPagesText(s)
	return pages, mm, true, err
}

// extents is the sheet's parts placed without routing: the one
// FprintFitPages worked out, else worked out here.
func (cfg Config) extents(s *Sheet) map[string]geom.Rect {
	if cfg.placed != nil {
		return cfg.placed
	}
	return layout.Extents(s.Circuit, cfg.options(s))
}

type drawer struct {
	cfg    Config
	canvas textSafe
	sheet  *Sheet
	res    *layout.Result
	ox, oy float64 // sheet position of grid origin, in grid units
	// shared is what every page of a paged sheet's footer shares, worked
	// out once for the sheet (nil: worked out on demand)
	shared *sharedFoot
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
		lines[0] += ", band " + figure.FormatRange(c.Band, figure.Hertz, figure.Sheet)
	}
	return lines
}
