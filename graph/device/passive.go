package device

import (
	"fmt"
	"math"

	"pare/graph"
)

// DiodeRd is the small-signal resistance of a conducting diode (a
// semiconductor diode, or a valve diode's section): the part's rd, else a
// default. It is 0 when the diode is off (off = 1), and for a varicap
// without rd: a varicap is reverse biased, and its capacitance is not in the
// netlist format. assumed says the value is a default, not the part's own.
//
// The default: a signal diode (a valve diode, or a semiconductor diode that
// is not a rectifier or a zener) with a DC load is a peak detector, and
// load is that DC load per section (the resistance its current returns
// through, times the number of sections that share it); its rd is the
// detector's input resistance, DetectorRd(load). Any other diode, or one
// with no DC load (load 0 or infinite), conducts at the class bias: VT/Id
// for a semiconductor diode (Shockley, ideality 1), the "valve diode" rd
// for a valve. A zener is held in breakdown by its circuit, so its rd is
// its rz (Zener); one that declares no breakdown voltage is open, as the DC
// solve takes it. The operating point says better where it is known
// (graph/dc fills rd, or off when the zener does not conduct).
func DiodeRd(p *graph.Part, load float64) (rd float64, assumed bool) {
	if off, ok := p.Param("off"); ok && off != 0 {
		return 0, false
	}
	if rd, ok := p.Param("rd"); ok {
		return rd, false
	}
	if p.Type == "varicap" || NoBreakdown(p) {
		return 0, true
	}
	if z, ok := ZenerOf(p); ok {
		return z.Rz, z.RzAssumed
	}
	if load > 0 && !math.IsInf(load, 0) && p.Type != "rectifier" && p.Type != "zener" {
		return DetectorRd(load), true
	}
	if p.Kind == graph.Valve {
		return def("valve diode", "rd"), true
	}
	return VT / def("diode", "id"), true
}

// DetectorRd is the input resistance of a peak (envelope) detector into a
// DC load RL: RL/2. A detector of efficiency near 1 turns a carrier of peak
// Vp into Vp of DC, so the power it takes, Vp²/(2·Rin), is the power in its
// load, Vp²/RL (common practice; derived from that power balance; checked
// against ngspice's diode in a detector, docs/references.md §17).
func DetectorRd(load float64) float64 { return def("detector", "rin/rl") * load }

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
