package symbol

import (
	"math"

	"pare/graph"
	"pare/render/geom"
)

// turns draws n turns of a winding from a to b (along one axis), bulging
// towards the side nrm points to: half-circle humps in the IEC 60617 form,
// overlapping loops in the IEEE 315 looped form (IEEE 315 also allows
// humps; the loops are the form its readers know the style by).
func turns(a, b, nrm geom.Pt, n int, st Style) []Prim {
	ux, uy := (b.X-a.X)/float64(n), (b.Y-a.Y)/float64(n) // one turn along the axis
	w := math.Hypot(ux, uy)
	if st != IEEE {
		// sweep 1 in SVG (y down) bulges to the right-hand normal (uy, -ux)
		sweep := nrm.X*uy-nrm.Y*ux > 0
		out := make([]Prim, 0, n)
		for i := 0; i < n; i++ {
			p := pt(a.X+ux*float64(i), a.Y+uy*float64(i))
			out = append(out, arc(p, pt(p.X+ux, p.Y+uy), w/2, sweep))
		}
		return out
	}
	// a prolate cycloid: the pen runs back at the foot of each turn, which
	// closes it into a loop; loops narrower than 0.75 grid steps close up
	// at the stroke's width, so a short coil gets fewer of them
	if fit := int(w * float64(n) / 0.75); fit < n {
		n = max(1, fit)
		ux, uy = (b.X-a.X)/float64(n), (b.Y-a.Y)/float64(n)
		w = math.Hypot(ux, uy)
	}
	const steps = 16
	h, back := 0.9*w, 0.4*w // loop height and the run back
	var pts []geom.Pt
	for i := 0; i <= n*steps; i++ {
		t := 2 * math.Pi * float64(i) / steps
		along := w*t/(2*math.Pi) - back*math.Sin(t)
		up := h * (1 - math.Cos(t)) / 2
		x := a.X + along*ux/w + up*nrm.X
		y := a.Y + along*uy/w + up*nrm.Y
		pts = append(pts, pt(math.Round(x*100)/100, math.Round(y*100)/100))
	}
	return []Prim{line(pts...)}
}

// tapAt is where a tap sits along a tapped coil, as a fraction of its turns
// from pin 1: for the two tightly coupled halves of one coil, inductance
// goes with turns squared, so the fraction is √(L(1–t)/L) of the whole.
func tapAt(p *graph.Part) float64 {
	w := p.Winding("1t")
	tot := p.Inductance()
	if w == nil || tot <= 0 || w.L <= 0 || w.L >= tot {
		return 0.5
	}
	return math.Sqrt(w.L / tot)
}

// tappedCoil draws a tapped inductor between pins at ±2, as an untapped
// one: the tap's lead leaves on a whole grid point and the coil is laid so
// that its turns on either side of the lead stand in the tap's ratio (six
// turns in all, at least one on each side), so a tap 12 % up the coil is
// drawn there and not mid-winding. The coil shortens when the tap is so
// near an end that it would not fit between the pins.
func tappedCoil(frac float64, st Style) (prims []Prim, tx float64) {
	const n = 6
	length := 3.2
	tx = math.Max(-1, math.Min(1, math.Round(-length/2+frac*length)))
	if frac > 0 {
		length = math.Min(length, (tx+1.8)/frac)
	}
	if frac < 1 {
		length = math.Min(length, (1.8-tx)/(1-frac))
	}
	x0, x1 := tx-frac*length, tx+(1-frac)*length
	n1 := int(math.Max(1, math.Min(n-1, math.Round(frac*n))))
	up := pt(0, -1)
	prims = []Prim{line(pt(-2, 0), pt(x0, 0)), line(pt(x1, 0), pt(2, 0)), line(pt(tx, 0), pt(tx, 1))}
	prims = append(prims, turns(pt(x0, 0), pt(tx, 0), up, n1, st)...)
	prims = append(prims, turns(pt(tx, 0), pt(x1, 0), up, n-n1, st)...)
	return prims, tx
}

func inductor(p *graph.Part, st Style, m Marks) Shape {
	s := Shape{Box: geom.R(-2, -0.9, 2, 0.9), Turns: allTurns}
	if p.Pin("t") == nil {
		s.Pins = twoPins(p)
		s.Prims = append(leads(1.6), turns(pt(-1.6, 0), pt(1.6, 0), pt(0, -1), 4, st)...)
	} else {
		prims, tx := tappedCoil(tapAt(p), st)
		s.Prims = prims
		s.Pins = []geom.Pin{pin("1", -2, 0, geom.Left), pin("t", tx, 1, geom.Down), pin("2", 2, 0, geom.Right)}
		s.Box.Y1 = 1
	}
	if ironCored(p) {
		s.Prims = append(s.Prims, thick(pt(-1.6, -0.85), pt(1.6, -0.85)))
		s.Box.Y0 = -1.1
	}
	if len(p.Adjust) > 0 {
		// an adjustable core: the preset mark across the winding
		s.Prims = append(s.Prims, presetMark(pt(-1.2, 0.4), pt(1, -1.2))...)
		s.Box.Y0 = math.Min(s.Box.Y0, -1.5)
	}
	return s
}
