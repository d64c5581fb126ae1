// Package symbol holds pare's drawing symbols: one Go table entry per part
// kind, each a list of strokes in grid units with its pins on whole grid
// points, in the IEC 60617 style (rectangle resistor) or the IEEE 315 style
// (zig-zag resistor). The drawings are pare's own; only the conventions of the
// two standards are followed.
//
// symbol.go holds the shape type, orientations, text metrics and the table
// from kind to builder; the builders are in passive.go (resistors,
// capacitors, coils, diodes, crystal, pot, switch, the generic box),
// semis.go (transistors), valve.go, transformer.go, and furniture.go (flags,
// ground and rail symbols).
package symbol

import (
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
	out := s.copied()
	for k := range out.Prims {
		q := &out.Prims[k]
		for i, pt := range q.Pts {
			q.Pts[i] = o.Apply(pt)
		}
		if q.Kind == Arc && o.Mirror {
			q.Sweep = !q.Sweep
		}
	}
	for i := range out.Pins {
		pin := &out.Pins[i]
		pin.At = o.Apply(pin.At)
		pin.Dir = o.ApplyDir(pin.Dir)
	}
	a, b := o.Apply(geom.Pt{X: s.Box.X0, Y: s.Box.Y0}), o.Apply(geom.Pt{X: s.Box.X1, Y: s.Box.Y1})
	out.Box = geom.R(a.X, a.Y, b.X, b.Y)
	return out
}

// Moved returns the shape shifted by d.
func (s Shape) Moved(d geom.Pt) Shape {
	out := s.copied()
	out.Shift(d)
	return out
}

// Owned is the shape with strokes and pins of its own, which Shift may
// then change without touching the shape it was copied from.
func (s Shape) Owned() Shape { return s.copied() }

// Shift moves the shape by d in place: the same sums as Moved, for a
// holder that owns the shape's strokes and pins (Owned) and moves it many
// times, so that each move does not copy it again.
func (s *Shape) Shift(d geom.Pt) {
	s.Box = s.Box.Move(d)
	for k := range s.Prims {
		pts := s.Prims[k].Pts
		for i, pt := range pts {
			pts[i] = pt.Add(d)
		}
	}
	for i := range s.Pins {
		s.Pins[i].At = s.Pins[i].At.Add(d)
	}
}

// copied is the shape with strokes and pins of its own, to be changed in
// place: the points of all its strokes in one allocation (each stroke's
// slice capped at its own end), as a layout moves every symbol many times
// while it places a sheet.
func (s Shape) copied() Shape {
	out := Shape{Turns: s.Turns, Box: s.Box}
	if len(s.Prims) > 0 {
		n := 0
		for _, p := range s.Prims {
			n += len(p.Pts)
		}
		pts := make([]geom.Pt, 0, n)
		out.Prims = make([]Prim, len(s.Prims))
		for k, p := range s.Prims {
			at := len(pts)
			pts = append(pts, p.Pts...)
			p.Pts = pts[at:len(pts):len(pts)]
			out.Prims[k] = p
		}
	}
	if len(s.Pins) > 0 {
		out.Pins = append([]geom.Pin(nil), s.Pins...)
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
type builder func(p *graph.Part, st Style, m Marks) Shape

// Marks is what a sheet knows about a part beyond its netlist entry, for its
// symbol: the valve electrodes the reduction made static and where they are
// held, and the alignment points a reduction folded into the part.
type Marks struct {
	// Ties holds, per pin name, where a static electrode is held: the
	// electrode keeps its grid line with a stub to that mark and has no pin.
	Ties map[string]Tie
	// Preset says a trimmer (a preset the repairer turns at alignment) was
	// merged into the part: its preset mark stays on the merged symbol.
	Preset bool
	// Tuned are the end pins of a transformer's windings with a capacitor
	// across them: a core adjusting the whole part is marked on the first
	// coil holding one, the winding the repairer tunes with it.
	Tuned [][2]string
}

// Tie is where a static electrode is held.
type Tie int

// Ties of a static electrode.
const (
	TieNone    Tie = iota
	TieGround      // at AC ground: a stub to a chassis mark
	TieCathode     // strapped to the cathode, drawn as the trade's internal strap
	// TieRail: at a supply rail or a line fed from one (a screen on its
	// dropper and bypass): a stub to a rail bar, the rail named in the
	// part's label (layout.Options.TieLabels), never a chassis mark, which
	// would tell a technician the electrode sits at 0 V
	TieRail
)

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
	graph.Port:        func(p *graph.Part, st Style, m Marks) Shape { return Flag(p.Label, true) },
	graph.Generic:     generic,
}

// For returns the symbol of a part in its natural orientation with each pin's
// net filled in. Pins the part does not have are not drawn (a reduced valve
// without its screen is drawn without a screen).
func For(p *graph.Part, st Style) Shape { return ForMarked(p, st, Marks{}) }

// ForMarked is For with the sheet's marks for the part.
func ForMarked(p *graph.Part, st Style, m Marks) Shape {
	b, ok := table[p.Kind]
	if !ok {
		b = generic
	}
	s := b(p, st, m)
	for i := range s.Pins {
		s.Pins[i].Net = p.NetOf(s.Pins[i].Name)
	}
	// Pins of the part the symbol did not place (a terminal name it does not
	// know) would vanish from the drawing: fall back to the generic box.
	for _, pn := range p.Pins {
		if s.Pin(pn.Name) == nil {
			s = generic(p, st, m)
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
