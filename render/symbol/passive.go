package symbol

import (
	"math"
	"sort"

	"pare/graph"
	"pare/render/geom"
)

func resistor(p *graph.Part, st Style, m Marks) Shape {
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

func capacitor(p *graph.Part, st Style, m Marks) Shape {
	s := Shape{Pins: twoPins(p), Box: geom.R(-2, -0.9, 2, 0.9), Turns: allTurns}
	s.Prims = leads(0.25)
	switch {
	case st == IEEE:
		// IEEE 315: one straight and one curved plate (the curved one the
		// outside foil, or the negative of a polarised capacitor)
		s.Prims = append(s.Prims, thick(pt(-0.25, -0.8), pt(-0.25, 0.8)),
			arc(pt(0.45, -0.8), pt(0.45, 0.8), 1.2, false), line(pt(0.25, 0), pt(0.3, 0)))
		if p.Type == graph.CapElectrolytic {
			s.Prims = append(s.Prims, line(pt(-0.95, -0.75), pt(-0.55, -0.75)), line(pt(-0.75, -0.95), pt(-0.75, -0.55)))
		}
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
		s.Prims = append(s.Prims, presetMark(pt(-0.9, 0.85), pt(0.8, -0.75))...)
	}
	if m.Preset && p.Type != graph.CapTrimmer {
		// a trimmer merged into this section: its preset mark on the other
		// diagonal, so the alignment point is still on the sheet
		s.Prims = append(s.Prims, presetMark(pt(-0.9, -0.85), pt(0.8, 0.75))...)
	}
	return s
}

// presetMark is the preset-adjustment mark (IEC 60617 / IEEE 315): a line
// across the body from a to b ending in a short bar square to it at b, for
// a trimmer, a merged trimmer or an adjustable core.
func presetMark(a, b geom.Pt) []Prim {
	dx, dy := b.X-a.X, b.Y-a.Y
	n := math.Hypot(dx, dy)
	ux, uy := -dy/n*0.4, dx/n*0.4 // half the bar, square to the line
	return []Prim{line(a, b), thick(pt(b.X-ux, b.Y-uy), pt(b.X+ux, b.Y+uy))}
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

func diode(p *graph.Part, st Style, m Marks) Shape {
	s := Shape{Pins: twoPins(p), Box: geom.R(-2, -0.9, 2, 0.9), Turns: allTurns}
	// IEC 60617 draws the triangle open with the lead running through it;
	// IEEE 315 readers know the filled triangle
	s.Prims = append(leads(0.6), poly(st == IEEE, pt(-0.6, -0.6), pt(-0.6, 0.6), pt(0.6, 0)))
	if st != IEEE {
		s.Prims = append(s.Prims, line(pt(-0.6, 0), pt(0.6, 0)))
	}
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

func crystal(p *graph.Part, st Style, m Marks) Shape {
	s := Shape{Pins: twoPins(p), Box: geom.R(-2, -0.9, 2, 0.9), Turns: allTurns}
	s.Prims = append(leads(0.7), thick(pt(-0.7, -0.7), pt(-0.7, 0.7)), thick(pt(0.7, -0.7), pt(0.7, 0.7)),
		poly(false, pt(-0.4, -0.8), pt(0.4, -0.8), pt(0.4, 0.8), pt(-0.4, 0.8)))
	return s
}

func pot(p *graph.Part, st Style, m Marks) Shape {
	s := Shape{Box: geom.R(-2, -2, 2, 0.6), Turns: allTurns}
	s.Pins = []geom.Pin{pin("1", -2, 0, geom.Left), pin("w", 0, -2, geom.Up), pin("2", 2, 0, geom.Right)}
	s.Prims = append(resistorBody(st), line(pt(0, -2), pt(0, -0.7)), poly(true, pt(0, -0.45), pt(-0.3, -0.95), pt(0.3, -0.95)))
	return s
}

func switchSym(p *graph.Part, st Style, m Marks) Shape {
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

// generic is a box with the part's terminals split left and right; a
// two-terminal fuse or lamp, told by the words of its description, is
// drawn as the standards draw it (genericBody), in the same box.
func generic(p *graph.Part, st Style, m Marks) Shape {
	if len(p.Pins) == 2 {
		if body := genericBody(p.Label, st); body != nil {
			s := Shape{Turns: []Orient{{false, 0}, {true, 0}}, Box: geom.R(-3, -0.8, 3, 0.8)}
			s.Pins = []geom.Pin{pin(p.Pins[0].Name, -3, 0, geom.Left), pin(p.Pins[1].Name, 3, 0, geom.Right)}
			s.Prims = body
			return s
		}
	}
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
