// Package symbol holds pare's drawing symbols: one Go table entry per part
// kind, each a list of strokes in grid units with its pins on whole grid
// points, in the IEC 60617 style (rectangle resistor) or the IEEE 315 style
// (zig-zag resistor). The drawings are pare's own; only the conventions of the
// two standards are followed.
package symbol

import (
	"math"
	"sort"
	"strings"

	"pare/graph"
	"pare/render/geom"
)

// Style is the symbol convention of a sheet; one per sheet.
type Style int

// Symbol conventions.
const (
	IEC  Style = iota // IEC 60617
	IEEE              // IEEE 315
)

// Prim is one stroke of a symbol, in the symbol's own coordinates.
type Prim struct {
	Kind   PrimKind
	Pts    []geom.Pt // polyline points; circle centre; arc start and end; text anchor
	R      float64   // circle or arc radius
	Sweep  bool      // arc direction (SVG sweep flag)
	Closed bool
	Fill   bool
	Dash   bool
	Thick  bool   // plates and bars that are drawn heavier
	Text   string // for text prims
}

// PrimKind says how a Prim is drawn.
type PrimKind int

// Primitive kinds.
const (
	Line PrimKind = iota
	Circle
	Arc
	Text
)

// Shape is a symbol ready to be placed: strokes, pins and the body box.
type Shape struct {
	Prims []Prim
	Pins  []geom.Pin // Net filled in by For
	Box   geom.Rect
	// Turns lists the orientations the layout may choose from; the first is
	// the natural one.
	Turns []Orient
}

// Orient is a placement of a symbol: mirrored left–right first, then turned
// clockwise by Quarter quarter-turns.
type Orient struct {
	Mirror  bool
	Quarter int
}

// Apply maps a point of the symbol into its oriented position.
func (o Orient) Apply(p geom.Pt) geom.Pt {
	if o.Mirror {
		p.X = -p.X
	}
	for i := 0; i < o.Quarter%4; i++ {
		p = geom.Pt{X: -p.Y, Y: p.X}
	}
	return geom.Pt{X: clean(p.X), Y: clean(p.Y)}
}

func clean(v float64) float64 {
	if v == 0 {
		return 0 // no negative zero in the output
	}
	return v
}

// ApplyDir maps a pin direction.
func (o Orient) ApplyDir(d geom.Dir) geom.Dir {
	s := o.Apply(d.Step())
	switch {
	case s.X < -0.5:
		return geom.Left
	case s.X > 0.5:
		return geom.Right
	case s.Y < -0.5:
		return geom.Up
	}
	return geom.Down
}

// Oriented returns the shape with o applied to every stroke, pin and box.
func (s Shape) Oriented(o Orient) Shape {
	out := Shape{Turns: s.Turns}
	for _, p := range s.Prims {
		q := p
		q.Pts = make([]geom.Pt, len(p.Pts))
		for i, pt := range p.Pts {
			q.Pts[i] = o.Apply(pt)
		}
		if p.Kind == Arc && o.Mirror {
			q.Sweep = !p.Sweep
		}
		out.Prims = append(out.Prims, q)
	}
	for _, pin := range s.Pins {
		pin.At = o.Apply(pin.At)
		pin.Dir = o.ApplyDir(pin.Dir)
		out.Pins = append(out.Pins, pin)
	}
	a, b := o.Apply(geom.Pt{X: s.Box.X0, Y: s.Box.Y0}), o.Apply(geom.Pt{X: s.Box.X1, Y: s.Box.Y1})
	out.Box = geom.R(a.X, a.Y, b.X, b.Y)
	return out
}

// Moved returns the shape shifted by d.
func (s Shape) Moved(d geom.Pt) Shape {
	out := Shape{Turns: s.Turns, Box: s.Box.Move(d)}
	for _, p := range s.Prims {
		q := p
		q.Pts = make([]geom.Pt, len(p.Pts))
		for i, pt := range p.Pts {
			q.Pts[i] = pt.Add(d)
		}
		out.Prims = append(out.Prims, q)
	}
	for _, pin := range s.Pins {
		pin.At = pin.At.Add(d)
		out.Pins = append(out.Pins, pin)
	}
	return out
}

// Pin returns the named pin, or nil.
func (s *Shape) Pin(name string) *geom.Pin {
	for i := range s.Pins {
		if s.Pins[i].Name == name {
			return &s.Pins[i]
		}
	}
	return nil
}

var (
	allTurns = []Orient{{false, 0}, {false, 1}, {false, 2}, {false, 3}, {true, 0}, {true, 1}, {true, 2}, {true, 3}}
	flipOnly = []Orient{{false, 0}, {true, 0}, {false, 2}, {true, 2}}
	fixed    = []Orient{{false, 0}}
)

// Text metrics shared by the layout and the renderer: the sheet's text is set
// in a monospaced face so that boxes measured here hold what is drawn.
const (
	CharW      = 0.62 // grid units per character at the label size
	LineH      = 1.2  // grid units per text line at the label size
	SmallScale = 0.85 // small text (markers, furniture) relative to labels
)

// TextWidth is the width of s at the label size, in grid units.
func TextWidth(s string) float64 { return float64(len([]rune(s))) * CharW }

func pt(x, y float64) geom.Pt { return geom.Pt{X: x, Y: y} }

func line(pts ...geom.Pt) Prim { return Prim{Kind: Line, Pts: pts} }

func thick(pts ...geom.Pt) Prim { return Prim{Kind: Line, Pts: pts, Thick: true} }

func poly(fill bool, pts ...geom.Pt) Prim {
	return Prim{Kind: Line, Pts: pts, Closed: true, Fill: fill}
}

func circle(c geom.Pt, r float64) Prim { return Prim{Kind: Circle, Pts: []geom.Pt{c}, R: r} }

func arc(a, b geom.Pt, r float64, sweep bool) Prim {
	return Prim{Kind: Arc, Pts: []geom.Pt{a, b}, R: r, Sweep: sweep}
}

func pin(name string, x, y float64, d geom.Dir) geom.Pin {
	return geom.Pin{Name: name, At: pt(x, y), Dir: d}
}

// builder is one entry of the symbol table.
type builder func(p *graph.Part, st Style) Shape

// table maps a part kind to its symbol builder: the single place that says
// how each kind is drawn.
var table = map[graph.Kind]builder{
	graph.Resistor:    resistor,
	graph.Capacitor:   capacitor,
	graph.Inductor:    inductor,
	graph.Transformer: transformer,
	graph.Valve:       valve,
	graph.BJT:         bjt,
	graph.FET:         fet,
	graph.Diode:       diode,
	graph.Crystal:     crystal,
	graph.Pot:         pot,
	graph.Switch:      switchSym,
	graph.Port:        func(p *graph.Part, st Style) Shape { return Flag(p.Label, true) },
	graph.Generic:     generic,
}

// For returns the symbol of a part in its natural orientation with each pin's
// net filled in. Pins the part does not have are not drawn (a reduced valve
// without its screen is drawn without a screen).
func For(p *graph.Part, st Style) Shape {
	b, ok := table[p.Kind]
	if !ok {
		b = generic
	}
	s := b(p, st)
	for i := range s.Pins {
		s.Pins[i].Net = p.NetOf(s.Pins[i].Name)
	}
	// Pins of the part the symbol did not place (a terminal name it does not
	// know) would vanish from the drawing: fall back to the generic box.
	for _, pn := range p.Pins {
		if s.Pin(pn.Name) == nil {
			s = generic(p, st)
			for i := range s.Pins {
				s.Pins[i].Net = p.NetOf(s.Pins[i].Name)
			}
			break
		}
	}
	return s
}

// leads draws the two leads of a horizontal two-terminal symbol from the pins
// at ±2 to the body edges at ±inner.
func leads(inner float64) []Prim {
	return []Prim{line(pt(-2, 0), pt(-inner, 0)), line(pt(inner, 0), pt(2, 0))}
}

func twoPins(p *graph.Part) []geom.Pin {
	names := []string{"1", "2"}
	if len(p.Pins) == 2 {
		names = []string{p.Pins[0].Name, p.Pins[1].Name}
		// keep the kind's canonical order: 1/2, a/k, +/-
		if order := graph.Terminals(p.Kind, p.Type); len(order) >= 2 {
			if names[0] == order[1] && names[1] == order[0] {
				names[0], names[1] = names[1], names[0]
			}
		}
	}
	return []geom.Pin{pin(names[0], -2, 0, geom.Left), pin(names[1], 2, 0, geom.Right)}
}

func resistor(p *graph.Part, st Style) Shape {
	s := Shape{Pins: twoPins(p), Box: geom.R(-2, -0.6, 2, 0.6), Turns: allTurns}
	s.Prims = append(s.Prims, resistorBody(st)...)
	return s
}

func resistorBody(st Style) []Prim {
	if st == IEEE {
		pts := []geom.Pt{pt(-2, 0), pt(-1.2, 0)}
		for i := 0; i < 6; i++ {
			y := -0.45
			if i%2 == 1 {
				y = 0.45
			}
			pts = append(pts, pt(-1.2+0.4*float64(i)+0.2, y))
		}
		pts = append(pts, pt(1.2, 0), pt(2, 0))
		return []Prim{line(pts...)}
	}
	return append(leads(1.2), poly(false, pt(-1.2, -0.4), pt(1.2, -0.4), pt(1.2, 0.4), pt(-1.2, 0.4)))
}

func capacitor(p *graph.Part, st Style) Shape {
	s := Shape{Pins: twoPins(p), Box: geom.R(-2, -0.9, 2, 0.9), Turns: allTurns}
	s.Prims = leads(0.25)
	switch {
	case p.Type == graph.CapElectrolytic && st == IEEE:
		s.Prims = append(s.Prims, thick(pt(-0.25, -0.8), pt(-0.25, 0.8)),
			arc(pt(0.45, -0.8), pt(0.45, 0.8), 1.2, false), line(pt(0.25, 0), pt(0.3, 0)),
			line(pt(-0.95, -0.75), pt(-0.55, -0.75)), line(pt(-0.75, -0.95), pt(-0.75, -0.55)))
	case p.Type == graph.CapElectrolytic:
		s.Prims = append(s.Prims, poly(false, pt(-0.25, -0.8), pt(-0.05, -0.8), pt(-0.05, 0.8), pt(-0.25, 0.8)),
			Prim{Kind: Line, Pts: []geom.Pt{pt(0.25, -0.8), pt(0.25, -0.8), pt(0.25, 0.8)}, Thick: true},
			line(pt(-0.95, -0.75), pt(-0.55, -0.75)), line(pt(-0.75, -0.95), pt(-0.75, -0.55)))
		s.Prims[0] = line(pt(-2, 0), pt(-0.25, 0))
	default:
		s.Prims = append(s.Prims, thick(pt(-0.25, -0.8), pt(-0.25, 0.8)), thick(pt(0.25, -0.8), pt(0.25, 0.8)))
	}
	switch p.Type {
	case graph.CapVariable:
		s.Prims = append(s.Prims, line(pt(-0.9, 0.85), pt(0.9, -0.85)),
			poly(true, pt(0.9, -0.85), pt(0.45, -0.7), pt(0.75, -0.4)))
	case graph.CapTrimmer:
		s.Prims = append(s.Prims, line(pt(-0.9, 0.85), pt(0.8, -0.75)), thick(pt(0.5, -1.0), pt(1.1, -0.45)))
	}
	return s
}

// coilHumps draws n half-turns from x0 to x1 along y=0, bulging to negative y.
func coilHumps(x0, x1 float64, n int) []Prim {
	w := (x1 - x0) / float64(n)
	var out []Prim
	for i := 0; i < n; i++ {
		a := x0 + w*float64(i)
		out = append(out, arc(pt(a, 0), pt(a+w, 0), w/2, true))
	}
	return out
}

// ironCored says whether a coil is drawn with a core: smoothing and audio
// chokes of a henry or more and power or output transformers with k ≥ 0.95
// are iron-cored in practice; RF and IF coils are air or dust-slug cored.
func ironCored(p *graph.Part) bool {
	if p.Kind == graph.Transformer {
		for _, c := range p.Coupling {
			if c.K < 0.95 {
				return false
			}
		}
		return len(p.Coupling) > 0
	}
	return p.Inductance() >= 1
}

func inductor(p *graph.Part, st Style) Shape {
	s := Shape{Box: geom.R(-2, -0.9, 2, 0.9), Turns: allTurns}
	s.Prims = append(leads(1.6), coilHumps(-1.6, 1.6, 4)...)
	if ironCored(p) {
		s.Prims = append(s.Prims, thick(pt(-1.6, -0.85), pt(1.6, -0.85)))
		s.Box.Y0 = -1.1
	}
	if p.Pin("t") == nil {
		s.Pins = twoPins(p)
		return s
	}
	frac := 0.5
	if w := p.Winding("1t"); w != nil {
		if tot := p.Inductance(); tot > 0 {
			// tap position along the coil, by turns: √(L1t/L) for coupled halves
			frac = math.Sqrt(w.L / tot)
		}
	}
	tx := math.Round(-1.6 + 3.2*frac)
	tx = math.Max(-1, math.Min(1, tx))
	s.Pins = []geom.Pin{pin("1", -2, 0, geom.Left), pin("t", tx, 1, geom.Down), pin("2", 2, 0, geom.Right)}
	s.Prims = append(s.Prims, line(pt(tx, 0), pt(tx, 1)))
	s.Box.Y1 = 1
	return s
}

func diode(p *graph.Part, st Style) Shape {
	s := Shape{Pins: twoPins(p), Box: geom.R(-2, -0.9, 2, 0.9), Turns: allTurns}
	s.Prims = append(leads(0.6), poly(true, pt(-0.6, -0.6), pt(-0.6, 0.6), pt(0.6, 0)))
	switch p.Type {
	case "zener":
		s.Prims = append(s.Prims, thick(pt(0.35, -0.8), pt(0.6, -0.6), pt(0.6, 0.6), pt(0.85, 0.8)))
	case "varicap":
		s.Prims = append(s.Prims, thick(pt(0.6, -0.6), pt(0.6, 0.6)), thick(pt(0.95, -0.6), pt(0.95, 0.6)))
		s.Prims[1] = line(pt(0.95, 0), pt(2, 0))
	default:
		s.Prims = append(s.Prims, thick(pt(0.6, -0.6), pt(0.6, 0.6)))
	}
	return s
}

func crystal(p *graph.Part, st Style) Shape {
	s := Shape{Pins: twoPins(p), Box: geom.R(-2, -0.9, 2, 0.9), Turns: allTurns}
	s.Prims = append(leads(0.7), thick(pt(-0.7, -0.7), pt(-0.7, 0.7)), thick(pt(0.7, -0.7), pt(0.7, 0.7)),
		poly(false, pt(-0.4, -0.8), pt(0.4, -0.8), pt(0.4, 0.8), pt(-0.4, 0.8)))
	return s
}

func pot(p *graph.Part, st Style) Shape {
	s := Shape{Box: geom.R(-2, -2, 2, 0.6), Turns: allTurns}
	s.Pins = []geom.Pin{pin("1", -2, 0, geom.Left), pin("w", 0, -2, geom.Up), pin("2", 2, 0, geom.Right)}
	s.Prims = append(resistorBody(st), line(pt(0, -2), pt(0, -0.7)), poly(true, pt(0, -0.45), pt(-0.3, -0.95), pt(0.3, -0.95)))
	return s
}

// Flag is a connector to the rest of the set: a pentagon holding its text.
// An input flag (in) has its pin at the point, on the right, and feeds the
// sheet from its left edge; an output flag takes the signal on its left and
// points off the sheet to the right.
func Flag(text string, in bool) Shape {
	w := math.Ceil(TextWidth(text)*SmallScale + 1.6)
	s := Shape{Turns: fixed}
	body := func(x0 float64) []geom.Pt {
		return []geom.Pt{pt(x0, -0.7), pt(x0+w-0.8, -0.7), pt(x0+w, 0), pt(x0+w-0.8, 0.7), pt(x0, 0.7)}
	}
	if in {
		s.Prims = []Prim{poly(false, body(-w)...), {Kind: Text, Pts: []geom.Pt{pt(-w+0.5, 0)}, Text: text}}
		s.Pins = []geom.Pin{pin("1", 0, 0, geom.Right)}
		s.Box = geom.R(-w, -0.8, 0, 0.8)
		return s
	}
	s.Prims = []Prim{poly(false, body(0)...), {Kind: Text, Pts: []geom.Pt{pt(0.5, 0)}, Text: text}}
	s.Pins = []geom.Pin{pin("1", 0, 0, geom.Left)}
	s.Box = geom.R(0, -0.8, w, 0.8)
	return s
}

// Valve electrodes run top to bottom one grid step apart: anode(s), the grids
// from the highest number down to g1, cathode, heater. g1 leaves on the left,
// the other grids and the internal shield on the right; anode up, cathode and
// heater down. Only electrodes the part has pins for are drawn.
func valve(p *graph.Part, st Style) Shape {
	s := Shape{Turns: fixed}
	var grids []string
	for _, g := range []string{"g6", "g5", "g4", "g3", "g2", "g1"} {
		if p.Pin(g) != nil {
			grids = append(grids, g)
		}
	}
	anodes := []string{}
	for _, a := range []string{"a", "a1", "a2"} {
		if p.Pin(a) != nil {
			anodes = append(anodes, a)
		}
	}
	hasK := p.Pin("k") != nil
	var heaters []string
	for _, h := range []string{"h", "h1", "h2"} {
		if p.Pin(h) != nil {
			heaters = append(heaters, h)
		}
	}
	shield := p.Pin("s") != nil
	y := 0.0
	ay := y
	y++
	gy := map[string]float64{}
	for _, g := range grids {
		gy[g] = y
		y++
	}
	ky := y
	if len(heaters) > 0 {
		y++
	}
	hy := y
	top, bottom := ay-1, y
	if !hasK && len(heaters) == 0 {
		bottom = ky
	}
	// Right-side pins: grids other than g1, then the shield.
	right := 0
	for _, g := range grids {
		if g != "g1" {
			right++
		}
	}
	if shield {
		right++
		if float64(right) > bottom-top-1 {
			bottom++
		}
	}
	// envelope: a circle for small valves, a stadium for tall ones
	h := bottom - top
	if h <= 4 {
		c := math.Ceil((top + bottom) / 2) // pins stay on whole grid points
		top, bottom = c-2, c+2
		s.Prims = append(s.Prims, circle(pt(0, c), 2))
	} else {
		s.Prims = append(s.Prims, line(pt(-2, top+2), pt(-2, bottom-2)), line(pt(2, top+2), pt(2, bottom-2)),
			arc(pt(-2, top+2), pt(2, top+2), 2, true), arc(pt(2, bottom-2), pt(-2, bottom-2), 2, true))
	}
	// anodes
	switch len(anodes) {
	case 1:
		s.Prims = append(s.Prims, thick(pt(-0.9, ay), pt(0.9, ay)), line(pt(0, ay), pt(0, top-1)))
		s.Pins = append(s.Pins, pin(anodes[0], 0, top-1, geom.Up))
	case 2:
		for i, a := range anodes {
			x := -1.0 + 2*float64(i)
			s.Prims = append(s.Prims, thick(pt(x-0.6, ay), pt(x+0.6, ay)), line(pt(x, ay), pt(x, top-1)))
			s.Pins = append(s.Pins, pin(a, x, top-1, geom.Up))
		}
	}
	// grids: dashed lines; g1 to the left, others to the right
	ry := ay + 1
	for _, g := range grids {
		y := gy[g]
		s.Prims = append(s.Prims, Prim{Kind: Line, Pts: []geom.Pt{pt(-1.2, y), pt(1.2, y)}, Dash: true})
		if g == "g1" {
			s.Prims = append(s.Prims, line(pt(-1.2, y), pt(-3, y)))
			s.Pins = append(s.Pins, pin(g, -3, y, geom.Left))
			continue
		}
		s.Prims = append(s.Prims, line(pt(1.2, y), pt(3, y)))
		s.Pins = append(s.Pins, pin(g, 3, y, geom.Right))
		ry = y + 1
	}
	if shield {
		sy := math.Max(ry, ky)
		if sy >= bottom-0.5 {
			sy = ky
		}
		s.Prims = append(s.Prims, Prim{Kind: Line, Pts: []geom.Pt{pt(1.4, top+1.2), pt(1.4, bottom-1.2)}, Dash: true},
			line(pt(1.4, sy), pt(3, sy)))
		s.Pins = append(s.Pins, pin("s", 3, sy, geom.Right))
	}
	if hasK {
		s.Prims = append(s.Prims, thick(pt(-1, ky-0.2), pt(-1, ky), pt(1, ky), pt(1, ky-0.2)))
		kx := 0.0
		if len(heaters) > 0 {
			kx = -1
		}
		s.Prims = append(s.Prims, line(pt(kx, ky), pt(kx, bottom+1)))
		s.Pins = append(s.Pins, pin("k", kx, bottom+1, geom.Down))
	}
	switch len(heaters) {
	case 1:
		s.Prims = append(s.Prims, line(pt(0.3, hy-0.3), pt(0.6, hy+0.2), pt(0.9, hy-0.3)), line(pt(0.9, hy-0.3), pt(1, bottom+1)))
		s.Pins = append(s.Pins, pin(heaters[0], 1, bottom+1, geom.Down))
	case 2, 3:
		s.Prims = append(s.Prims, line(pt(0, bottom+1), pt(0, hy), pt(0.5, hy-0.5), pt(1, hy), pt(1, bottom+1)))
		s.Pins = append(s.Pins, pin(heaters[0], 0, bottom+1, geom.Down), pin(heaters[1], 1, bottom+1, geom.Down))
	}
	x0, x1 := -2.0, 2.0
	for _, pn := range s.Pins {
		x0, x1 = math.Min(x0, pn.At.X), math.Max(x1, pn.At.X)
	}
	y0, y1 := top, bottom
	for _, pn := range s.Pins {
		y0, y1 = math.Min(y0, pn.At.Y), math.Max(y1, pn.At.Y)
	}
	s.Box = geom.R(x0, y0, x1, y1)
	return s
}

func bjt(p *graph.Part, st Style) Shape {
	s := Shape{Turns: fixed, Box: geom.R(-3, -3, 1.8, 3)}
	s.Prims = []Prim{circle(pt(0.2, 0), 1.6), line(pt(-3, 0), pt(-0.6, 0)), thick(pt(-0.6, -0.9), pt(-0.6, 0.9)),
		line(pt(-0.6, -0.4), pt(1, -1.2), pt(1, -3)), line(pt(-0.6, 0.4), pt(1, 1.2), pt(1, 3))}
	if p.Type == "pnp" {
		s.Prims = append(s.Prims, poly(true, pt(-0.6, 0.4), pt(-0.05, 0.45), pt(-0.3, 0.85)))
	} else {
		s.Prims = append(s.Prims, poly(true, pt(1, 1.2), pt(0.45, 1.15), pt(0.7, 0.75)))
	}
	s.Pins = []geom.Pin{pin("b", -3, 0, geom.Left), pin("c", 1, -3, geom.Up), pin("e", 1, 3, geom.Down)}
	return s
}

// fet draws a FET in its envelope: gate on the left one step below the
// centre (so its lead clears the source), drain up, source down, body (when
// the part has one) to the right. A MOSFET has an insulated gate plate and a
// broken channel; a JFET a solid channel with the gate arrow on it.
func fet(p *graph.Part, st Style) Shape {
	s := Shape{Turns: fixed, Box: geom.R(-3, -3, 1.8, 3)}
	s.Prims = []Prim{circle(pt(0.2, 0), 1.6),
		line(pt(0, -0.7), pt(1, -0.7), pt(1, -3)), line(pt(0, 0.7), pt(1, 0.7), pt(1, 3))}
	nType := strings.HasPrefix(p.Type, "n")
	if strings.HasSuffix(p.Type, "mos") {
		s.Prims = append(s.Prims,
			line(pt(-3, 1), pt(-1, 1), pt(-1, 0.7), pt(-0.4, 0.7)), thick(pt(-0.4, -0.9), pt(-0.4, 0.9)),
			thick(pt(0, -1), pt(0, -0.4)), thick(pt(0, -0.25), pt(0, 0.25)), thick(pt(0, 0.4), pt(0, 1)),
			line(pt(0, 0), pt(1, 0), pt(1, 0.7)))
		// the body arrow points into the channel for n, out of it for p
		if nType {
			s.Prims = append(s.Prims, poly(true, pt(0, 0), pt(0.45, -0.25), pt(0.45, 0.25)))
		} else {
			s.Prims = append(s.Prims, poly(true, pt(0.6, 0), pt(0.15, -0.25), pt(0.15, 0.25)))
		}
	} else {
		s.Prims = append(s.Prims, thick(pt(0, -1), pt(0, 1)), line(pt(-3, 1), pt(-1, 1), pt(-1, 0.7), pt(0, 0.7)))
		if nType {
			s.Prims = append(s.Prims, poly(true, pt(0, 0.7), pt(-0.45, 0.45), pt(-0.45, 0.95)))
		} else {
			s.Prims = append(s.Prims, poly(true, pt(-0.5, 0.7), pt(-0.05, 0.45), pt(-0.05, 0.95)))
		}
	}
	s.Pins = []geom.Pin{pin("g", -3, 1, geom.Left), pin("d", 1, -3, geom.Up), pin("s", 1, 3, geom.Down)}
	if p.Pin("b") != nil {
		// the body lead leaves above the source's path
		s.Prims = append(s.Prims, line(pt(0, -0.2), pt(0.6, -0.2), pt(0.6, 0), pt(3, 0)))
		s.Pins = append(s.Pins, pin("b", 3, 0, geom.Right))
		s.Box.X1 = 3
	}
	return s
}

// coil is a chain of windings joined at taps, drawn as one vertical coil.
type coil struct{ pins []string }

// coils groups a transformer's windings into chains (a centre-tapped winding
// is two windings sharing its tap pin), sorted by first pin.
func coils(p *graph.Part) []coil {
	ws := append([]graph.Winding(nil), p.Windings...)
	sort.Slice(ws, func(i, j int) bool { return ws[i].Name < ws[j].Name })
	used := make([]bool, len(ws))
	var out []coil
	for i := range ws {
		if used[i] {
			continue
		}
		used[i] = true
		c := coil{pins: []string{ws[i].From, ws[i].To}}
		for grown := true; grown; {
			grown = false
			for j := range ws {
				if used[j] {
					continue
				}
				switch {
				case ws[j].From == c.pins[len(c.pins)-1]:
					c.pins = append(c.pins, ws[j].To)
				case ws[j].To == c.pins[0]:
					c.pins = append([]string{ws[j].From}, c.pins...)
				default:
					continue
				}
				used[j], grown = true, true
			}
		}
		out = append(out, c)
	}
	return out
}

// transformer draws the first half of the coils (primary first) on the left,
// bulging right, the rest on the right bulging left; each coil's end and tap
// pins point outwards. An iron core is a pair of lines between the sides.
func transformer(p *graph.Part, st Style) Shape {
	// coils stand 0.9 either side of the centre so that their humps (0.4
	// deep) clear the core lines at ±0.2 and read at print size
	s := Shape{Turns: flipOnly}
	cs := coils(p)
	nLeft := (len(cs) + 1) / 2
	// the shorter side stands centred against the longer one (a single
	// secondary across a centre-tapped primary), on whole grid steps
	sideH := [2]float64{-2, -2}
	for i, c := range cs {
		k := 0
		if i >= nLeft {
			k = 1
		}
		sideH[k] += 4*float64(len(c.pins)-1) + 2
	}
	yl := math.Floor((math.Max(sideH[0], sideH[1]) - sideH[0]) / 2)
	yr := math.Floor((math.Max(sideH[0], sideH[1]) - sideH[1]) / 2)
	if len(cs) <= nLeft {
		yr = 0
	}
	for i, c := range cs {
		side, x, px, dir := -1.0, -0.9, -2.0, geom.Left
		y := &yl
		if i >= nLeft {
			side, x, px, dir = 1, 0.9, 2, geom.Right
			y = &yr
		}
		sections := len(c.pins) - 1
		top := *y
		for k, name := range c.pins {
			py := top + 4*float64(k)
			if k == 0 {
				py = top
			}
			s.Pins = append(s.Pins, pin(name, px, py, dir))
			s.Prims = append(s.Prims, line(pt(px, py), pt(x, py)))
		}
		for k := 0; k < sections; k++ {
			a := top + 4*float64(k)
			// leads from the pin rows to the coil, then humps along y
			s.Prims = append(s.Prims, line(pt(x, a), pt(x, a+0.4)), line(pt(x, a+3.6), pt(x, a+4)))
			for h := 0; h < 4; h++ {
				y0 := a + 0.4 + 0.8*float64(h)
				s.Prims = append(s.Prims, arc(pt(x, y0), pt(x, y0+0.8), 0.4, side < 0))
			}
		}
		// the winding's start, by the dot convention (IEC 60617 / IEEE 315
		// polarity mark): the first pin of each winding as written
		dx := -0.45
		if side > 0 {
			dx = 0.45
		}
		s.Prims = append(s.Prims, Prim{Kind: Circle, Pts: []geom.Pt{pt(x+dx, top+0.5)}, R: 0.13, Fill: true})
		*y = top + 4*float64(sections) + 2
	}
	height := math.Max(yl, yr) - 2
	if ironCored(p) {
		s.Prims = append(s.Prims, thick(pt(-0.2, 0), pt(-0.2, height)), thick(pt(0.2, 0), pt(0.2, height)))
	}
	s.Box = geom.R(-2, 0, 2, height)
	return s.Moved(pt(0, -math.Round(height/2)))
}

func switchSym(p *graph.Part, st Style) Shape {
	names := make([]string, 0, len(p.Pins))
	for _, pn := range p.Pins {
		names = append(names, pn.Name)
	}
	sort.Strings(names)
	// commons are the pins named first in a closed pair; the rest are throws
	common := map[string]bool{}
	for _, pos := range p.Closes {
		for _, pr := range pos {
			common[pr[0]] = true
		}
	}
	var left, right []string
	for _, n := range names {
		if common[n] {
			left = append(left, n)
		} else {
			right = append(right, n)
		}
	}
	if len(left) == 0 && len(right) > 1 {
		left, right = right[:1], right[1:]
	}
	s := Shape{Turns: []Orient{{false, 0}, {true, 0}}}
	at := map[string]geom.Pt{}
	for i, n := range left {
		y := 2 * float64(i)
		s.Pins = append(s.Pins, pin(n, -3, y, geom.Left))
		s.Prims = append(s.Prims, line(pt(-3, y), pt(-1.6, y)), circle(pt(-1.4, y), 0.2))
		at[n] = pt(-1.4, y)
	}
	for i, n := range right {
		y := float64(i)
		s.Pins = append(s.Pins, pin(n, 3, y, geom.Right))
		s.Prims = append(s.Prims, line(pt(3, y), pt(1.6, y)), circle(pt(1.4, y), 0.2))
		at[n] = pt(1.4, y)
	}
	if set := int(p.Set); set >= 1 && set <= len(p.Closes) {
		for _, pr := range p.Closes[set-1] {
			a, okA := at[pr[0]]
			b, okB := at[pr[1]]
			if okA && okB {
				s.Prims = append(s.Prims, line(pt(a.X+0.2, a.Y), pt(b.X-0.25, b.Y-0.3)))
			}
		}
	}
	h := math.Max(2*float64(len(left)-1), float64(len(right)-1))
	s.Box = geom.R(-3, -0.8, 3, h+0.8)
	return s
}

// generic is a box with the part's terminals split left and right.
func generic(p *graph.Part, st Style) Shape {
	n := len(p.Pins)
	half := (n + 1) / 2
	rows := math.Max(1, float64(half))
	s := Shape{Turns: []Orient{{false, 0}, {true, 0}}}
	s.Prims = []Prim{poly(false, pt(-1.5, -0.8), pt(1.5, -0.8), pt(1.5, rows-0.2), pt(-1.5, rows-0.2))}
	for i, pn := range p.Pins {
		if i < half {
			y := float64(i)
			s.Pins = append(s.Pins, pin(pn.Name, -3, y, geom.Left))
			s.Prims = append(s.Prims, line(pt(-3, y), pt(-1.5, y)))
		} else {
			y := float64(i - half)
			s.Pins = append(s.Pins, pin(pn.Name, 3, y, geom.Right))
			s.Prims = append(s.Prims, line(pt(3, y), pt(1.5, y)))
		}
	}
	s.Box = geom.R(-3, -0.8, 3, rows-0.2)
	return s
}

// Ground is the local ground symbol hanging from at: three bars, shortening
// downwards (IEC 60617 / IEEE 315 ground), or pointing up when up is set.
func Ground(at geom.Pt, up bool) ([]Prim, geom.Rect) {
	sgn := 1.0
	if up {
		sgn = -1
	}
	var ps []Prim
	for i, w := range []float64{0.7, 0.45, 0.2} {
		y := at.Y + sgn*0.25*float64(i)
		ps = append(ps, line(pt(at.X-w, y), pt(at.X+w, y)))
	}
	return ps, geom.R(at.X-0.7, at.Y, at.X+0.7, at.Y+sgn*0.55)
}

// RailBar is the bar of a local supply symbol, across a stub ending at at.
func RailBar(at geom.Pt, horizontal bool) []Prim {
	if horizontal {
		return []Prim{thick(pt(at.X-0.6, at.Y), pt(at.X+0.6, at.Y))}
	}
	return []Prim{thick(pt(at.X, at.Y-0.6), pt(at.X, at.Y+0.6))}
}
