package symbol

import (
	"math"
	"sort"

	"pare/graph"
	"pare/render/geom"
)

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
		if i < nLeft {
			yl = s.addCoil(c, -1, yl)
		} else {
			yr = s.addCoil(c, 1, yr)
		}
	}
	height := math.Max(yl, yr) - 2
	if ironCored(p) {
		s.Prims = append(s.Prims, thick(pt(-0.2, 0), pt(-0.2, height)), thick(pt(0.2, 0), pt(0.2, height)))
	}
	s.Box = geom.R(-2, 0, 2, height)
	return s.Moved(pt(0, -math.Round(height/2)))
}

// addCoil draws one coil from row top down, on the left (side -1) or the
// right (side 1), and returns the row where the next coil on that side
// starts.
func (s *Shape) addCoil(c coil, side, top float64) float64 {
	x, px, dir := -0.9, -2.0, geom.Left
	if side > 0 {
		x, px, dir = 0.9, 2, geom.Right
	}
	sections := len(c.pins) - 1
	for k, name := range c.pins {
		py := top + 4*float64(k)
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
	return top + 4*float64(sections) + 2
}

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

// coil is a chain of windings joined at taps, drawn as one vertical coil.
type coil struct{ pins []string }
