package device

import (
	"fmt"
	"math"

	"pare/graph"
)

// DiodeRd is the small-signal resistance of a conducting diode (a
// semiconductor diode, or a valve diode's section): the part's rd, else the
// default, VT/Id at the "diode" bias for a semiconductor diode (Shockley,
// ideality 1) and the "valve diode" rd for a valve. It is 0 when the diode
// is off (off = 1), and for a varicap without rd: a varicap is reverse
// biased, and its capacitance is not in the netlist format. assumed says
// the value is a default, not the part's own.
func DiodeRd(p *graph.Part) (rd float64, assumed bool) {
	if off, ok := p.Param("off"); ok && off != 0 {
		return 0, false
	}
	if rd, ok := p.Param("rd"); ok {
		return rd, false
	}
	switch {
	case p.Kind == graph.Valve:
		return def("valve diode", "rd"), true
	case p.Type == "varicap":
		return 0, true
	}
	return VT / def("diode", "id"), true
}

// Crystal gives the motional arm Rm, Lm, Cm and the holder capacitance C0
// of a crystal at series frequency fs (the four-element equivalent). Lm or
// Cm given fixes the other by ωs² = 1/(Lm·Cm); with neither, Cm takes its
// default. Rm given wins; otherwise Rm = ωs·Lm/Q with the given or default Q.
func Crystal(p *graph.Part) (rm, lm, cm, c0 float64, err error) {
	fs := p.Value.Max
	if fs <= 0 {
		return 0, 0, 0, 0, fmt.Errorf("crystal %s: series frequency must be positive", p.Ref)
	}
	ws := 2 * math.Pi * fs
	c0, _ = paramOr(p, "c0", "crystal", 0)
	l, hasL := p.Param("lm")
	c, hasC := p.Param("cm")
	switch {
	case hasL && hasC:
	case hasL:
		c = 1 / (ws * ws * l)
	case hasC:
		l = 1 / (ws * ws * c)
	default:
		c = def("crystal", "cm")
		l = 1 / (ws * ws * c)
	}
	rm, hasR := p.Param("rm")
	if !hasR {
		q, _ := paramOr(p, "q", "crystal", 0)
		if !(q > 0) || math.IsInf(q, 0) {
			return 0, 0, 0, 0, fmt.Errorf("crystal %s: q must be a positive number, not %g", p.Ref, q)
		}
		rm = ws * l / q
	}
	if !(l > 0) || !(c > 0) || !(rm >= 0) || !(c0 >= 0) || math.IsInf(l+c+rm+c0, 0) {
		return 0, 0, 0, 0, fmt.Errorf("crystal %s: lm, cm must be positive and rm, c0 not negative", p.Ref)
	}
	return rm, l, c, c0, nil
}
