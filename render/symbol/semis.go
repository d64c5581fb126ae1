package symbol

import (
	"strings"

	"pare/graph"
	"pare/render/geom"
)

func bjt(p *graph.Part, st Style, m Marks) Shape {
	s := Shape{Turns: fixed, Box: geom.R(-3, -3, 1.8, 3)}
	s.Prims = []Prim{circle(pt(0.2, 0), 1.6), line(pt(-3, 0), pt(-0.6, 0)), thick(pt(-0.6, -0.9), pt(-0.6, 0.9)),
		line(pt(-0.6, -0.4), pt(1, -1.2), pt(1, -3)), line(pt(-0.6, 0.4), pt(1, 1.2), pt(1, 3))}
	if p.Type == "pnp" {
		s.Prims = append(s.Prims, poly(true, pt(-0.6, 0.4), pt(-0.05, 0.45), pt(-0.3, 0.85)))
	} else {
		s.Prims = append(s.Prims, poly(true, pt(1, 1.2), pt(0.45, 1.15), pt(0.7, 0.75)))
	}
	s.Pins = []geom.Pin{pin("b", -3, 0, geom.Left), pin("c", 1, -3, geom.Up), pin("e", 1, 3, geom.Down)}
	if p.Type == "pnp" {
		// a PNP may also stand flipped top to bottom, emitter up towards
		// the positive rail and collector down, as the trade draws it
		// (common practice: the lower half of a complementary pair, a PNP
		// stage off a negative-going supply); the base stays left
		s.Turns = []Orient{{false, 0}, {true, 2}}
	}
	return s
}

// fet draws a FET in its envelope: gate on the left one step below the
// centre (so its lead clears the source), drain up, source down, body (when
// the part has one) to the right. A MOSFET has an insulated gate plate and a
// broken channel; a JFET a solid channel with the gate arrow on it.
func fet(p *graph.Part, st Style, m Marks) Shape {
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
