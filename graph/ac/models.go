package ac

import (
	"fmt"
	"math"

	"pare/graph"
)

// Physical constants, SI 2019 exact values.
const (
	boltzmann = 1.380649e-23    // J/K
	charge    = 1.602176634e-19 // C
	// Temperature at which bias currents are turned into transconductances.
	roomKelvin = 300.0
)

// VT is the thermal voltage kT/q at 300 K, 25.8520 mV (SI 2019 exact constants).
var VT = boltzmann * roomKelvin / charge

// Default is one documented default of a small-signal model: used when a
// part does not give the parameter itself.
type Default struct {
	Class  string  `json:"class"` // "triode", "pentode", "bjt", ...
	Param  string  `json:"param"` // the netlist key, e.g. "gm"
	Value  float64 `json:"value"` // SI units
	Unit   string  `json:"unit"`
	Source string  `json:"source"`
}

// Defaults lists every default the models use, in a fixed order, for
// documentation and `pare` help. Values are typical of the parts found in
// domestic receivers of the valve and early transistor eras.
var Defaults = []Default{
	{"triode", "gm", 2e-3, "S", "typical small-signal triode, from memory"},
	{"triode", "ra", 20e3, "Ω", "typical small-signal triode (µ 40), from memory"},
	{"tetrode, pentode", "gm", 2e-3, "S", "typical RF/IF pentode, from memory"},
	{"tetrode, pentode", "ra", 1e6, "Ω", "typical RF/IF pentode, from memory"},
	{"hexode, heptode, octode", "gm", 0.5e-3, "S", "typical frequency-changer conversion conductance, from memory"},
	{"hexode, heptode, octode", "ra", 1e6, "Ω", "typical frequency changer, from memory"},
	{"valve diode", "rd", 1e3, "Ω", "conducting signal diode, typical, from memory"},
	{"bjt", "beta", 100, "", "typical small-signal transistor, from memory"},
	{"bjt", "ic", 1e-3, "A", "typical small-signal bias, from memory"},
	{"bjt", "va", 100, "V", "Early voltage for ro = VA/Ic, typical, from memory"},
	{"fet", "gm", 4e-3, "S", "typical small-signal JFET, from memory"},
	{"fet", "rd", 50e3, "Ω", "typical small-signal JFET, from memory"},
	{"diode", "id", 1e-3, "A", "conducting at 1 mA: rd = VT/Id = 25.85 Ω (Shockley, ideality 1)"},
	{"crystal", "c0", 5e-12, "F", "typical HC-6 holder capacitance, from memory"},
	{"crystal", "cm", 20e-15, "F", "c0/cm = 250, typical, from memory"},
	{"crystal", "q", 50e3, "", "typical quartz unit, from memory"},
}

func def(class, param string) float64 {
	for _, d := range Defaults {
		if d.Class == class && d.Param == param {
			return d.Value
		}
	}
	panic("ac: no default " + class + "." + param) // programming error: the table is fixed
}

func valveClass(typ string) string {
	switch typ {
	case "triode":
		return "triode"
	case "tetrode", "pentode":
		return "tetrode, pentode"
	case "hexode", "heptode", "octode":
		return "hexode, heptode, octode"
	}
	return ""
}

// valveParams resolves gm and ra of a valve section: any two of gm, ra and µ
// give the third (µ = gm·ra); one alone is completed with the class default
// of ra (or of gm when only ra is given).
func valveParams(p *graph.Part) (gm, ra float64, err error) {
	class := valveClass(p.Type)
	if class == "" {
		return 0, 0, fmt.Errorf("valve %s: type %q has no amplifying model", p.Ref, p.Type)
	}
	g, hasG := p.Param("gm")
	r, hasR := p.Param("ra")
	mu, hasMu := p.Param("mu")
	switch {
	case hasG && hasR && hasMu:
		if math.Abs(g*r-mu) > 0.02*mu {
			return 0, 0, fmt.Errorf("valve %s: gm·ra = %.4g but mu = %.4g: give any two of gm, ra, mu", p.Ref, g*r, mu)
		}
	case hasG && hasR:
	case hasG && hasMu:
		r = mu / g
	case hasR && hasMu:
		g = mu / r
	case hasG:
		r = def(class, "ra")
	case hasR:
		g = def(class, "gm")
	case hasMu:
		r = def(class, "ra")
		g = mu / r
	default:
		g, r = def(class, "gm"), def(class, "ra")
	}
	if g < 0 || r <= 0 || math.IsInf(r, 0) || math.IsNaN(g) {
		return 0, 0, fmt.Errorf("valve %s: gm %g and ra %g do not make a model", p.Ref, g, r)
	}
	return g, r, nil
}

// bjtParams resolves the hybrid-π model: gm = Ic/VT, rπ = β/gm, ro = VA/Ic.
// Given gm, rpi or ro win over the values derived from the bias current.
func bjtParams(p *graph.Part) (gm, rpi, ro float64, err error) {
	beta := paramOr(p, "beta", def("bjt", "beta"))
	ic := paramOr(p, "ic", def("bjt", "ic"))
	if ic <= 0 || beta <= 0 {
		return 0, 0, 0, fmt.Errorf("transistor %s: beta and ic must be positive", p.Ref)
	}
	gm = paramOr(p, "gm", ic/VT)
	rpi = paramOr(p, "rpi", beta/gm)
	ro = paramOr(p, "ro", def("bjt", "va")/ic)
	if gm <= 0 || rpi <= 0 || ro <= 0 {
		return 0, 0, 0, fmt.Errorf("transistor %s: gm, rpi and ro must be positive", p.Ref)
	}
	return gm, rpi, ro, nil
}

func fetParams(p *graph.Part) (gm, rd float64, err error) {
	gm = paramOr(p, "gm", def("fet", "gm"))
	rd = paramOr(p, "rd", def("fet", "rd"))
	if gm < 0 || rd <= 0 {
		return 0, 0, fmt.Errorf("FET %s: gm must not be negative and rd must be positive", p.Ref)
	}
	return gm, rd, nil
}

// diodeRes is the small-signal resistance of a diode, or 0 when it is off
// (open). Varicaps are reverse biased and so off unless rd is given; their
// capacitance is not in the netlist format and is not modelled.
func diodeRes(p *graph.Part, valve bool) float64 {
	if off, ok := p.Param("off"); ok && off != 0 {
		return 0
	}
	if rd, ok := p.Param("rd"); ok {
		return rd
	}
	if valve {
		return def("valve diode", "rd")
	}
	if p.Type == "varicap" {
		return 0
	}
	return VT / def("diode", "id")
}

// crystalParams gives the motional arm Rm, Lm, Cm and the holder capacitance
// C0 of a crystal at series frequency fs. Lm or Cm given fixes the other by
// ωs² = 1/(Lm·Cm); with neither, Cm takes its default. Rm given wins;
// otherwise Rm = ωs·Lm/Q with the given or default Q.
func crystalParams(p *graph.Part) (rm, lm, cm, c0 float64, err error) {
	fs := p.Value.Max
	if fs <= 0 {
		return 0, 0, 0, 0, fmt.Errorf("crystal %s: series frequency must be positive", p.Ref)
	}
	ws := 2 * math.Pi * fs
	c0 = paramOr(p, "c0", def("crystal", "c0"))
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
		q := paramOr(p, "q", def("crystal", "q"))
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

func paramOr(p *graph.Part, name string, d float64) float64 {
	if v, ok := p.Param(name); ok {
		return v
	}
	return d
}
