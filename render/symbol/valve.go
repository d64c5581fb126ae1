package symbol

import (
	"math"

	"pare/graph"
	"pare/render/geom"
)

// valveRows is where a valve's electrodes go: anode(s) at the top, the grids
// from the highest number down to g1 one grid step apart, then cathode and
// heater; and the envelope's top and bottom.
type valveRows struct {
	anodes, grids, heaters []string
	hasK, shield           bool
	ay, ky, hy             float64
	gy                     map[string]float64
	top, bottom            float64
	ties                   map[string]Tie // grids drawn with no pin, held at a mark
}

// present lists the names the part has pins for, in the given order.
func present(p *graph.Part, names ...string) []string {
	var out []string
	for _, n := range names {
		if p.Pin(n) != nil {
			out = append(out, n)
		}
	}
	return out
}

func newValveRows(p *graph.Part, ties map[string]Tie) *valveRows {
	v := &valveRows{
		grids:   drawnGrids(p, ties),
		anodes:  present(p, "a", "a1", "a2"),
		heaters: present(p, "h", "h1", "h2"),
		hasK:    p.Pin("k") != nil,
		shield:  p.Pin("s") != nil,
		gy:      map[string]float64{},
		ties:    map[string]Tie{},
	}
	for _, g := range v.grids {
		if p.Pin(g) == nil {
			v.ties[g] = ties[g]
			if v.ties[g] == TieCathode && !v.hasK {
				v.ties[g] = TieGround // no cathode drawn to strap it to
			}
		}
	}
	y := 0.0
	v.ay = y
	y++
	if len(v.ties) > 0 && v.ties[v.grids[0]] != TieNone {
		// static grids right under the anode: the plate moves up half a
		// step (its pin stays) to give them room
		v.ay = -0.5
	}
	prev := v.ay
	var held []string // static grids waiting for the next row with a pin
	for _, g := range v.grids {
		if v.ties[g] != TieNone {
			held = append(held, g)
			continue
		}
		v.spread(held, prev, y)
		held = nil
		v.gy[g] = y
		prev = y
		y++
	}
	v.spread(held, prev, y)
	v.ky = y
	if len(v.heaters) > 0 {
		y++
	}
	v.hy = y
	v.top, v.bottom = -1, y // the anode row is 0 (its plate may stand higher)
	switch {
	case !v.hasK && len(v.heaters) == 0:
		v.bottom = v.ky
	case len(v.heaters) == 0 && len(v.grids)-len(v.ties) > 1:
		// a tall envelope's end is round: a step under the cathode keeps
		// its bar (and a suppressor's strap) inside it
		v.bottom = v.ky + 1
	}
	// Right-side pins: grids other than g1, then the shield.
	right := 0
	for _, g := range v.grids {
		if g != "g1" && v.ties[g] == TieNone {
			right++
		}
	}
	if v.shield {
		right++
		if float64(right) > v.bottom-v.top-1 {
			v.bottom++
		}
	}
	return v
}

// Valve electrodes run top to bottom one grid step apart: anode(s), the grids
// from the highest number down to g1, cathode, heater. g1 leaves on the left,
// the other grids and the internal shield on the right; anode up, cathode and
// heater down. Only electrodes the part has pins for are drawn.
func valve(p *graph.Part, st Style, m Marks) Shape {
	s := Shape{Turns: fixed}
	v := newValveRows(p, m.Ties)
	v.envelope(&s)
	v.anodeLeads(&s)
	ry := v.gridLeads(&s)
	if v.shield {
		sy := math.Max(ry, v.ky)
		if sy >= v.bottom-0.5 {
			sy = v.ky
		}
		s.Prims = append(s.Prims, Prim{Kind: Line, Pts: []geom.Pt{pt(1.4, v.top+1.2), pt(1.4, v.bottom-1.2)}, Dash: true},
			line(pt(1.4, sy), pt(3, sy)))
		s.Pins = append(s.Pins, pin("s", 3, sy, geom.Right))
	}
	v.cathodeAndHeater(&s)
	x0, x1 := -2.0, 2.0
	for _, pn := range s.Pins {
		x0, x1 = math.Min(x0, pn.At.X), math.Max(x1, pn.At.X)
	}
	for _, t := range v.ties {
		if t == TieGround || t == TieRail {
			x0 = math.Min(x0, -3) // the chassis mark or rail bar of a grid held at AC ground
		}
	}
	y0, y1 := v.top, v.bottom
	for _, pn := range s.Pins {
		y0, y1 = math.Min(y0, pn.At.Y), math.Max(y1, pn.At.Y)
	}
	s.Box = geom.R(x0, y0, x1, y1)
	return s
}

// envelope draws a circle round a small valve (moving its top and bottom to
// whole grid points round the centre) and a stadium round a tall one.
func (v *valveRows) envelope(s *Shape) {
	if v.bottom-v.top <= 4 {
		c := math.Ceil((v.top + v.bottom) / 2) // pins stay on whole grid points
		v.top, v.bottom = c-2, c+2
		s.Prims = append(s.Prims, circle(pt(0, c), 2))
		return
	}
	top, bottom := v.top, v.bottom
	s.Prims = append(s.Prims, line(pt(-2, top+2), pt(-2, bottom-2)), line(pt(2, top+2), pt(2, bottom-2)),
		arc(pt(-2, top+2), pt(2, top+2), 2, true), arc(pt(2, bottom-2), pt(-2, bottom-2), 2, true))
}

// anodeLeads draws one anode, or two side by side, with their leads up.
func (v *valveRows) anodeLeads(s *Shape) {
	switch len(v.anodes) {
	case 1:
		s.Prims = append(s.Prims, thick(pt(-0.9, v.ay), pt(0.9, v.ay)), line(pt(0, v.ay), pt(0, v.top-1)))
		s.Pins = append(s.Pins, pin(v.anodes[0], 0, v.top-1, geom.Up))
	case 2:
		for i, a := range v.anodes {
			x := -1.0 + 2*float64(i)
			s.Prims = append(s.Prims, thick(pt(x-0.6, v.ay), pt(x+0.6, v.ay)), line(pt(x, v.ay), pt(x, v.top-1)))
			s.Pins = append(s.Pins, pin(a, x, v.top-1, geom.Up))
		}
	}
}

// gridLeads draws the grids as dashed lines, g1 leaving to the left, the
// others to the right, and returns the first free row on the right.
func (v *valveRows) gridLeads(s *Shape) float64 {
	ry := v.ay + 1
	for _, g := range v.grids {
		y := v.gy[g]
		s.Prims = append(s.Prims, Prim{Kind: Line, Pts: []geom.Pt{pt(-1.2, y), pt(1.2, y)}, Dash: true})
		if t := v.ties[g]; t != TieNone {
			v.tiedGrid(s, y, t)
			continue
		}
		if g == "g1" {
			s.Prims = append(s.Prims, line(pt(-1.2, y), pt(-3, y)))
			s.Pins = append(s.Pins, pin(g, -3, y, geom.Left))
			continue
		}
		s.Prims = append(s.Prims, line(pt(1.2, y), pt(3, y)))
		s.Pins = append(s.Pins, pin(g, 3, y, geom.Right))
		ry = y + 1
	}
	return ry
}

// spread sets static grids evenly between two rows: a grid without a pin
// has no lead to keep clear of its neighbours', so it takes no row of its own
// and the valve keeps the pins and the size of the same valve without it:
// the layout around it does not change.
func (v *valveRows) spread(held []string, from, to float64) {
	for i, g := range held {
		v.gy[g] = from + (to-from)*float64(i+1)/float64(len(held)+1)
	}
}

// drawnGrids lists the grids drawn, highest number first: those the part
// has pins for and those the sheet marks as held static, so a pentode whose
// screen and suppressor were made static still reads as a pentode.
func drawnGrids(p *graph.Part, ties map[string]Tie) []string {
	var out []string
	for _, g := range []string{"g6", "g5", "g4", "g3", "g2", "g1"} {
		if p.Pin(g) != nil || ties[g] != TieNone {
			out = append(out, g)
		}
	}
	return out
}

// tiedGrid draws a static grid's lead: a grid at AC ground leaves on the
// left (g1's row, below it, is the only other left lead, and it is never
// static) with a stub to a small chassis mark pointing up, clear of g1's
// lead; a grid strapped to the cathode is joined to the cathode's end inside
// the envelope, as valve makers draw an internal strap.
func (v *valveRows) tiedGrid(s *Shape, y float64, t Tie) {
	if t == TieCathode {
		s.Prims = append(s.Prims, line(pt(1.2, y), pt(1.5, y), pt(1.5, v.ky), pt(1, v.ky)))
		return
	}
	if t == TieRail {
		// the bar of a rail tag, short enough to stay clear of g1's lead
		// half a step below a static grid spread between rows
		s.Prims = append(s.Prims, line(pt(-1.2, y), pt(-2.6, y)), thick(pt(-2.6, y-0.25), pt(-2.6, y+0.2)))
		return
	}
	s.Prims = append(s.Prims, line(pt(-1.2, y), pt(-2.6, y), pt(-2.6, y-0.3)))
	for i, w := range []float64{0.35, 0.22, 0.08} {
		yy := y - 0.3 - 0.17*float64(i)
		s.Prims = append(s.Prims, line(pt(-2.6-w, yy), pt(-2.6+w, yy)))
	}
}

// cathodeAndHeater draws the cathode (beside the heater when there is one)
// and the heater, their leads down.
func (v *valveRows) cathodeAndHeater(s *Shape) {
	ky, hy, bottom := v.ky, v.hy, v.bottom
	if v.hasK {
		s.Prims = append(s.Prims, thick(pt(-1, ky-0.2), pt(-1, ky), pt(1, ky), pt(1, ky-0.2)))
		kx := 0.0
		if len(v.heaters) > 0 {
			kx = -1
		}
		s.Prims = append(s.Prims, line(pt(kx, ky), pt(kx, bottom+1)))
		s.Pins = append(s.Pins, pin("k", kx, bottom+1, geom.Down))
	}
	switch len(v.heaters) {
	case 1:
		s.Prims = append(s.Prims, line(pt(0.3, hy-0.3), pt(0.6, hy+0.2), pt(0.9, hy-0.3)), line(pt(0.9, hy-0.3), pt(1, bottom+1)))
		s.Pins = append(s.Pins, pin(v.heaters[0], 1, bottom+1, geom.Down))
	case 2, 3:
		s.Prims = append(s.Prims, line(pt(0, bottom+1), pt(0, hy), pt(0.5, hy-0.5), pt(1, hy), pt(1, bottom+1)))
		s.Pins = append(s.Pins, pin(v.heaters[0], 0, bottom+1, geom.Down), pin(v.heaters[1], 1, bottom+1, geom.Down))
	}
}
