package rules

import (
	"math"

	"pare/graph"
	"pare/graph/device"
)

// tunedLoop bounds the path through a winding whose far end is tuned to AC
// ground: the cold end of a tuned winding returned to a decoupled line (an
// AGC line, a bias feed) whose capacitor to chassis closes the tank's loop.
// From the cold end the path is the winding in series with the tuning
// capacitance from its hot end to AC ground; where they resonate, inside or
// near the band [lo, hi], their reactances cancel and what is left is the
// winding's series loss R = ω0·L/Q (device.WindingLoss, the solver's own
// figure), raised by (Ca+Cg)/Cg squared when some of the tuning capacitance
// Ca sits across the winding, never lowered: so R bounds the path from
// below. A capacitor there is in series with the tank and detunes it by
// its reactance against that R, not against ωL; a lossless winding (no q)
// leaves only the loading, which the bound cannot see, so it is taken as a
// short. ok is false when the far end is not tuned to AC ground in band.
func (x *Ctx) tunedLoop(p *graph.Part, pin, net string, lo, hi float64) (branch, bool) {
	far, idx := "", -1
	for _, other := range p.Pins {
		if other.Name == pin || other.Net == net || other.Net == "nc" || x.IsACGround(other.Net) {
			continue
		}
		if l := pathL(p, pin, other.Name); l > 0 && l == windingL(p, pin, true) {
			far, idx = other.Net, windingIndex(p, pin, other.Name)
			break
		}
	}
	if far == "" {
		return branch{}, false
	}
	l := windingL(p, pin, true)
	cgMin, cgMax, ca := 0.0, 0.0, 0.0
	for _, cn := range x.Conns(far) {
		q := cn.Part
		if q == p || q.Kind != graph.Capacitor || len(q.Pins) != 2 {
			continue
		}
		other := q.Pins[0].Net
		if other == far {
			other = q.Pins[1].Net
		}
		switch {
		case other == net:
			ca += capMin(q)
		case x.IsACGround(other):
			cgMin += capMin(q)
			cgMax += capMax(q)
		}
	}
	if cgMax == 0 {
		return branch{}, false
	}
	fHi := 1 / (2 * math.Pi * math.Sqrt(l*(ca+cgMin)))
	fLo := 1 / (2 * math.Pi * math.Sqrt(l*(ca+cgMax)))
	if fHi < lo/2 || fLo > hi*2 {
		return branch{}, false
	}
	r := 0.0
	if loss := device.WindingLoss(p, omega(x.c.BandCentre(p))); idx >= 0 {
		r = loss[idx]
	} else {
		for _, v := range loss {
			r += v // both sections of a tapped coil, end to end
		}
	}
	text := p.Ref + "." + pin + " to " + far + ", tuned to AC ground at " + hz(fLo) + rangeTail(fLo, fHi) +
		": in series with the tank, whose reactances cancel there, leaving the winding's loss R " + ohms(r)
	return branch{r, text}, true
}

// windingIndex is the index in p.Windings of the winding between pins a and
// b, or -1 when no single winding joins them.
func windingIndex(p *graph.Part, a, b string) int {
	for i, w := range p.Windings {
		if (w.From == a && w.To == b) || (w.From == b && w.To == a) {
			return i
		}
	}
	return -1
}
