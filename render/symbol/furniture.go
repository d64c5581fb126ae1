package symbol

import (
	"math"

	"pare/render/geom"
)

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

// Ground is the local ground symbol hanging from at, or pointing up when up
// is set: in the IEC style three bars shortening downwards (IEC 60617
// earth, the mark European service sheets use for the chassis return); in
// the IEEE style the chassis or frame connection of IEEE 315, a bar with
// three slanting strokes. Both fit the same box, so the layout does not
// depend on the style.
func Ground(at geom.Pt, up bool, st Style) ([]Prim, geom.Rect) {
	sgn := 1.0
	if up {
		sgn = -1
	}
	var ps []Prim
	if st == IEEE {
		ps = append(ps, line(pt(at.X-0.7, at.Y), pt(at.X+0.7, at.Y)))
		for _, x := range []float64{-0.4, 0.1, 0.6} {
			ps = append(ps, line(pt(at.X+x, at.Y), pt(at.X+x-0.3, at.Y+sgn*0.45)))
		}
	} else {
		for i, w := range []float64{0.7, 0.45, 0.2} {
			y := at.Y + sgn*0.25*float64(i)
			ps = append(ps, line(pt(at.X-w, y), pt(at.X+w, y)))
		}
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

// Connector is an off-row connector: where a net leaves one row of a sheet
// and goes on in another, a box holding the net's label with a filled
// arrowhead on the side the signal travels (IEC 60617 / IEEE 315 draw a
// continuation as a labelled terminal; the arrowhead is pare's own mark, so
// it never reads as a port to the rest of the set). The outgoing end takes
// the wire on its left and points right; the incoming end points right
// into the row, its pin on the right.
func Connector(text string, in bool) Shape {
	w := math.Ceil(TextWidth(text)*SmallScale + 2.2)
	s := Shape{Turns: fixed}
	x0 := 0.0
	if in {
		x0 = -w
	}
	box := []geom.Pt{pt(x0, -0.7), pt(x0+w-1, -0.7), pt(x0+w-1, 0.7), pt(x0, 0.7), pt(x0, -0.7)}
	tip := []geom.Pt{pt(x0+w-1, -0.7), pt(x0+w, 0), pt(x0+w-1, 0.7)}
	s.Prims = []Prim{line(box...), poly(true, tip...), {Kind: Text, Pts: []geom.Pt{pt(x0+0.4, 0)}, Text: text}}
	s.Box = geom.R(x0, -0.8, x0+w, 0.8)
	if in {
		s.Pins = []geom.Pin{pin("1", 0, 0, geom.Right)}
	} else {
		s.Pins = []geom.Pin{pin("1", 0, 0, geom.Left)}
	}
	return s
}
