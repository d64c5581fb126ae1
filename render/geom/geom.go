// Package geom is the final geometry of a drawn sheet: symbol boxes, pins,
// wire segments, local ground and rail symbols, labels and junction dots, all
// in grid units (one unit is one grid step; the renderer scales). The layout
// produces it, the renderer writes it out and the checker measures it, so what
// is checked is exactly what is drawn.
package geom

import "math"

// Pt is a point in grid units, y growing downwards as on the page.
type Pt struct{ X, Y float64 }

// Add returns p+q.
func (p Pt) Add(q Pt) Pt { return Pt{p.X + q.X, p.Y + q.Y} }

// Rect is an axis-aligned box, X0 ≤ X1, Y0 ≤ Y1.
type Rect struct{ X0, Y0, X1, Y1 float64 }

// R builds a normalised rectangle from two corners.
func R(x0, y0, x1, y1 float64) Rect {
	return Rect{math.Min(x0, x1), math.Min(y0, y1), math.Max(x0, x1), math.Max(y0, y1)}
}

// W and H are the box's width and height.
func (r Rect) W() float64 { return r.X1 - r.X0 }
func (r Rect) H() float64 { return r.Y1 - r.Y0 }

// Union is the smallest box holding both; the zero Rect counts as empty.
func (r Rect) Union(s Rect) Rect {
	if r == (Rect{}) {
		return s
	}
	if s == (Rect{}) {
		return r
	}
	return Rect{math.Min(r.X0, s.X0), math.Min(r.Y0, s.Y0), math.Max(r.X1, s.X1), math.Max(r.Y1, s.Y1)}
}

// Inset grows the box by d on every side (shrinks for negative d).
func (r Rect) Inset(d float64) Rect { return Rect{r.X0 - d, r.Y0 - d, r.X1 + d, r.Y1 + d} }

// Move shifts the box by p.
func (r Rect) Move(p Pt) Rect { return Rect{r.X0 + p.X, r.Y0 + p.Y, r.X1 + p.X, r.Y1 + p.Y} }

// Eps is the tolerance of every geometric comparison: coordinates are sums
// of grid steps and text metrics, far coarser than this.
const Eps = 1e-6

// Overlaps reports whether two boxes share interior (touching edges do not).
func (r Rect) Overlaps(s Rect) bool {
	return r.X0 < s.X1-Eps && s.X0 < r.X1-Eps && r.Y0 < s.Y1-Eps && s.Y0 < r.Y1-Eps
}

// Contains reports whether p lies inside or on the edge of r.
func (r Rect) Contains(p Pt) bool {
	return p.X >= r.X0-Eps && p.X <= r.X1+Eps && p.Y >= r.Y0-Eps && p.Y <= r.Y1+Eps
}

// Seg is an orthogonal wire segment.
type Seg struct{ A, B Pt }

// Horizontal reports whether the segment runs along x.
func (s Seg) Horizontal() bool { return math.Abs(s.A.Y-s.B.Y) < Eps }

// Box is the segment's extent as a (possibly zero-width) rectangle.
func (s Seg) Box() Rect { return R(s.A.X, s.A.Y, s.B.X, s.B.Y) }

// CutsInterior reports whether the segment passes through the inside of r
// (running along an edge or ending on it does not count).
func (s Seg) CutsInterior(r Rect) bool {
	b := s.Box()
	if s.Horizontal() {
		return b.Y0 > r.Y0+Eps && b.Y0 < r.Y1-Eps && b.X0 < r.X1-Eps && b.X1 > r.X0+Eps
	}
	return b.X0 > r.X0+Eps && b.X0 < r.X1-Eps && b.Y0 < r.Y1-Eps && b.Y1 > r.Y0+Eps
}

// Touches reports whether the segment meets r at all, edges included.
func (s Seg) Touches(r Rect) bool {
	b := s.Box()
	return b.X0 <= r.X1+Eps && b.X1 >= r.X0-Eps && b.Y0 <= r.Y1+Eps && b.Y1 >= r.Y0-Eps
}

// HasPoint reports whether p lies on the segment, ends included.
func (s Seg) HasPoint(p Pt) bool { return s.Box().Contains(p) }

// Dir is the direction a pin's lead points away from its symbol.
type Dir int

// Pin directions.
const (
	Left Dir = iota
	Up
	Right
	Down
)

// Step is the unit vector of the direction.
func (d Dir) Step() Pt {
	switch d {
	case Left:
		return Pt{-1, 0}
	case Up:
		return Pt{0, -1}
	case Right:
		return Pt{1, 0}
	}
	return Pt{0, 1}
}

// Pin is a terminal of a drawn symbol, at the tip of its lead.
type Pin struct {
	Name string
	Net  string
	At   Pt
	Dir  Dir
}

// Symbol is one drawn part (or a sheet terminal for an input or output net).
type Symbol struct {
	Ref   string
	Box   Rect // body and leads; pins lie on its edge
	Pins  []Pin
	Faded bool
	// Kind is the part's kind ("capacitor", "transformer", ...; empty for
	// the sheet's own flags and connectors), Type its sub-type
	// ("electrolytic", "choke"), and Windings the end pins of
	// each coil of a coil or transformer: what the checker needs to find a
	// capacitor across a winding.
	Kind, Type string
	Windings   [][2]string
}

// LocalKind is the kind of a symbol drawn at a pin instead of a wire.
type LocalKind int

// Local symbols.
const (
	LocalGround LocalKind = iota // ground / chassis bars
	LocalRail                    // supply, bias or heater: a bar with the net's label
	LocalFlag                    // a net-name flag, where a wire could not be drawn
)

// Local is a ground, rail or net-name symbol standing for a net's connection
// at one pin. Its stub wire from the pin is in Stub.
type Local struct {
	Kind    LocalKind
	Net     string
	Owner   string // ref of the part whose pin it serves
	Pin     string
	Stub    []Seg // from the pin tip to At
	At      Pt    // where the symbol attaches
	Box     Rect  // the symbol with its text
	Text    string
	TextBox Rect // where Text is set
	Down    bool // ground bars or rail text below (else above / beside)
	Side    Dir  // which way the symbol faces
	Faded   bool
}

// Label is text placed beside a symbol (ref, value) or a frame title.
type Label struct {
	Owner string
	Lines []string
	Box   Rect
	Faded bool
	Small bool // second-line markers and frame figures
	Head  int  // frame titles: how many leading lines are the title (the rest are figures)
}

// Wire is one net's routed segments.
type Wire struct {
	Net   string
	Segs  []Seg
	Faded []bool // per segment: drawn faded (it serves only faded parts)
}

// Frame is a stage frame: a titled rectangle round its parts.
type Frame struct {
	Box   Rect
	Title Label
	// Parts are the refs of the stage the frame holds: a symbol of any
	// other part inside the box is a fault the checker reports.
	Parts []string
}

// Link is a mechanical link (a gang) drawn dashed between symbols.
type Link struct {
	Name string
	Path []Pt
}

// Sheet is the whole geometry of one drawing.
type Sheet struct {
	Symbols []Symbol
	Locals  []Local
	Labels  []Label
	Wires   []Wire
	Dots    []Pt
	Frames  []Frame
	Links   []Link
	Bounds  Rect // the drawing, without the sheet furniture
	// Failed names the nets drawn with net-name flags instead of wires.
	Failed []string
	// PageMM is, for a page of paper, the millimetres one grid unit prints
	// at (smaller than the paper's scale when the page is drawn smaller to
	// hold a row too big for it); 0 for a sheet as wide as its drawing,
	// which has no size on paper.
	PageMM float64
}

// SideCover is, for each side of b (top, right, bottom, left), how much of
// its length the segments run along, outside b and within reach of it: the
// measure of a wire boxing a part or a title (render/check counts such
// boxes; render/layout lifts a title out of one).
func SideCover(segs []Seg, b Rect, reach float64) [4]float64 {
	var cover [4]float64
	for _, s := range segs {
		sb := s.Box()
		if s.Horizontal() {
			run := Overlap(sb.X0, sb.X1, b.X0, b.X1)
			if y := sb.Y0; y <= b.Y0 && y >= b.Y0-reach {
				cover[0] += run
			} else if y >= b.Y1 && y <= b.Y1+reach {
				cover[2] += run
			}
			continue
		}
		run := Overlap(sb.Y0, sb.Y1, b.Y0, b.Y1)
		if x := sb.X0; x >= b.X1 && x <= b.X1+reach {
			cover[1] += run
		} else if x <= b.X0 && x >= b.X0-reach {
			cover[3] += run
		}
	}
	return cover
}

// Overlap is the length two intervals share.
func Overlap(a0, a1, b0, b1 float64) float64 {
	return math.Max(0, math.Min(a1, b1)-math.Max(a0, b0))
}
