package dc

import (
	"fmt"
	"math"

	"pare/graph"
	dev "pare/graph/device"
)

// Large-signal laws and their defaults. This file is the seam to the one
// device model: every parameter a law needs is resolved here from what the
// netlist gives, and every default names its source. The small-signal figures
// the user already types (gm, ra, µ at a stated current) fix the large-signal
// law, so a part needs nothing new to get a DC operating point.

// Physical constants, SI 2019 exact values.
const (
	boltzmann = 1.380649e-23    // J/K
	charge    = 1.602176634e-19 // C
	// Kelvin is the temperature of the junction laws: 27 °C, the nominal
	// temperature of SPICE device models, so that the ngspice cross-check
	// uses the same thermal voltage.
	Kelvin = 300.15
)

// VT is the thermal voltage kT/q at 27 °C, 25.865 mV.
var VT = boltzmann * Kelvin / charge

// Default is one documented default of a large-signal law.
type Default struct {
	Class  string  `json:"class"`
	Param  string  `json:"param"`
	Value  float64 `json:"value"`
	Unit   string  `json:"unit"`
	Source string  `json:"source"`
}

// Defaults lists every default the DC laws use beyond the small-signal
// model's, in a fixed order. A valve's gm and µ and a transistor's β and ic
// come from the one device model (graph/device: given, completed from the
// other figures, or its class default), so the DC law and the AC model start
// from the same figures.
var Defaults = []Default{
	{"triode", "ia", 1e-3, "A", "anode current at which gm is stated, typical small-signal triode, from memory"},
	{"pentode", "ia", 5e-3, "A", "anode current at which gm is stated, typical RF/IF pentode, from memory"},
	{"pentode", "mu2", 20, "", "amplification factor of g1 over the screen, typical RF pentode, from memory"},
	{"pentode", "share", 0.25, "", "screen current as a fraction of cathode current, typical, from memory"},
	{"pentode", "vknee", 20, "V", "anode voltage scale of the knee (tanh law), typical, from memory"},
	{"valve grid", "kg", 1e-3, "A/V^1.5", "grid–cathode diode above 0 V: about 1 mA at +1 V, from memory"},
	{"valve diode", "perveance", 3e-4, "A/V^1.5", "signal diode perveance: 3 mA at 10 V, from memory"},
	{"rectifier valve", "perveance", 1e-3, "A/V^1.5", "perveance of one anode of a rectifier valve: about 90 mA at 20 V, from memory"},
	{"bjt", "vbe", 0.65, "V", "silicon small-signal transistor at about 1 mA, common practice"},
	{"bjt", "betar", 1, "", "reverse β, the SPICE default (BR = 1)"},
	{"fet", "idss", 5e-3, "A", "typical small-signal JFET, from memory"},
	{"fet", "vp", -2, "V", "pinch-off of a typical n-channel JFET, from memory"},
	{"fet", "is", 1e-14, "A", "gate junction saturation current, the SPICE default"},
	{"mosfet", "vth", 2, "V", "threshold of a typical small-signal enhancement n-channel MOSFET, from memory"},
	{"mosfet", "k", 0.05, "A/V²", "square-law factor of a typical small-signal MOSFET (50 mA at 1 V above threshold), from memory"},
	{"diode", "vf", 0.65, "V", "silicon junction at 1 mA, common practice"},
	{"diode", "n", 1, "", "ideality factor of Shockley's ideal junction, the SPICE default (N = 1)"},
	{"LED", "vf", 1.8, "V", "a red indicator LED at 1 mA, from memory (about 1.9 V at 10 mA; green and yellow 2 V or so, blue and white near 3 V): give vf on the part for another"},
	{"LED", "n", 2, "", "ideality factor of a visible LED, about 2, from memory"},
	{"winding", "rdc", 1, "Ω", "DC resistance of a coil or winding when not given: small, from memory"},
	{"mains", "hz", 50, "Hz", "mains frequency of a rectifier's transformer when hz is not given: 50 Hz in most of the world (60 Hz in North America), common practice"},
	{"gmin", "g", 1e-12, "S", "conductance from every net to chassis, the SPICE GMIN default"},
}

func def(class, param string) float64 {
	for _, d := range Defaults {
		if d.Class == class && d.Param == param {
			return d.Value
		}
	}
	panic("dc: no default " + class + "." + param) // programming error: the table is fixed
}

// Origin says where a law's parameter came from, for the note.
type Origin struct {
	Ref   string  `json:"ref"`
	Param string  `json:"param"`
	Value float64 `json:"value"`
	Unit  string  `json:"unit"`
	From  string  `json:"from"` // "given", "default: …" or "derived: …"
}

type origins struct{ list []Origin }

func (o *origins) given(p *graph.Part, name, class, unit string) float64 {
	if v, ok := p.Param(name); ok {
		o.list = append(o.list, Origin{p.Ref, name, v, unit, "given"})
		return v
	}
	v := def(class, name)
	o.list = append(o.list, Origin{p.Ref, name, v, unit, "default: " + sourceOf(class, name)})
	return v
}

func (o *origins) derived(ref, name string, v float64, unit, how string) {
	o.list = append(o.list, Origin{ref, name, v, unit, "derived: " + how})
}

func sourceOf(class, param string) string {
	for _, d := range Defaults {
		if d.Class == class && d.Param == param {
			return d.Source
		}
	}
	return ""
}

// valveLaw is the three-halves-power law of a valve section (Child–Langmuir
// with an amplification factor; Langmuir, Phys. Rev. 2, 1913; the form
// Ia = K·(Vgk + Vak/µ)^1.5 is the textbook one, e.g. Terman, "Radio
// Engineers' Handbook", 1943, §4):
//
//	triode:  Ia = K·(Vg1k + Vak/µ)^1.5
//	pentode: Ik = K·(Vg1k + Vg2k/µ2)^1.5, Ia = (1−s)·Ik·tanh(Vak/Vknee), Ig2 = Ik − Ia
//
// K follows from gm at the stated current Ia0: the law gives
// gm = 1.5·Ia0/x with x the effective grid voltage, so x = 1.5·Ia0/gm and
// K = Ia0/x^1.5 (divided by 1−s for a pentode, whose gm is the anode's share).
type valveLaw struct {
	pentode bool
	k, mu   float64 // triode: µ; pentode: µ2 of the screen
	share   float64 // screen share of a pentode
	vknee   float64
	kg      float64 // grid current perveance
}

func resolveValve(p *graph.Part, o *origins) (valveLaw, error) {
	sm, err := dev.Of(p)
	if err != nil {
		return valveLaw{}, err
	}
	gm := o.small(p, "gm", sm.Gm, "S", sm.Given(dev.Gm))
	switch p.Type {
	case "triode":
		ia := o.given(p, "ia", "triode", "A")
		mu := o.small(p, "mu", sm.Mu, "", sm.Given(dev.Mu))
		if !(gm > 0) || !(ia > 0) || !(mu > 0) {
			return valveLaw{}, fmt.Errorf("valve %s: gm, ia and mu must be positive for the DC law", p.Ref)
		}
		x := 1.5 * ia / gm
		k := ia / math.Pow(x, 1.5)
		o.derived(p.Ref, "K", k, "A/V^1.5", "K = ia/x^1.5 with x = 1.5·ia/gm (three-halves law)")
		return valveLaw{k: k, mu: mu, kg: o.given(p, "kg", "valve grid", "A/V^1.5")}, nil
	case "tetrode", "pentode", "hexode", "heptode", "octode":
		ia := o.given(p, "ia", "pentode", "A")
		s := o.given(p, "share", "pentode", "")
		if !(gm > 0) || !(ia > 0) {
			return valveLaw{}, fmt.Errorf("valve %s: gm and ia must be positive for the DC law", p.Ref)
		}
		x := 1.5 * ia / gm
		k := ia / (1 - s) / math.Pow(x, 1.5)
		o.derived(p.Ref, "K", k, "A/V^1.5", "K = ia/((1−share)·x^1.5) with x = 1.5·ia/gm (three-halves law)")
		return valveLaw{pentode: true, k: k, mu: o.given(p, "mu2", "pentode", ""), share: s,
			vknee: o.given(p, "vknee", "pentode", "V"), kg: o.given(p, "kg", "valve grid", "A/V^1.5")}, nil
	}
	return valveLaw{}, fmt.Errorf("valve %s: type %q has no DC law", p.Ref, p.Type)
}

// small records a figure taken from the one small-signal model.
func (o *origins) small(p *graph.Part, name string, v float64, unit string, given bool) float64 {
	from := "default: the device model's (graph/device)"
	if _, ok := p.Param(name); ok {
		from = "given"
	} else if given {
		from = "derived from the given figures (graph/device)"
	}
	o.list = append(o.list, Origin{p.Ref, name, v, unit, from})
	return v
}

// bjtLaw is the Ebers–Moll transport model (Ebers and Moll, Proc. IRE 42,
// 1954) with the Early effect, the Gummel–Poon model of SPICE with only IS,
// BF, BR and VAF (its base charge qb = 1/(1 − Vbc/VA)):
//
//	Ic = Is·(e^(Vbe/VT) − e^(Vbc/VT))·(1 − Vbc/VA) − Is/βR·(e^(Vbc/VT) − 1)
//	Ib = Is/βF·(e^(Vbe/VT) − 1) + Is/βR·(e^(Vbc/VT) − 1)
//
// Is follows from Vbe at the stated Ic: Is = Ic·e^(−Vbe/VT). VA is the one
// Early voltage the AC model's ro = VA/Ic rests on (graph/device): without it
// here the DC law had no output slope while the AC model had one, and the β
// at the bias, βF·(1 + Vcb/VA) in SPICE's model, stayed βF, so a stage whose
// load is an emitter follower's input read about 5 % low against ngspice
// (review17 b04's driver, 42.8 against 45.1).
type bjtLaw struct {
	is, bf, br float64
	va         float64 // Early voltage, V
	sign       float64 // +1 npn, −1 pnp
}

func resolveBJT(p *graph.Part, o *origins) (bjtLaw, error) {
	sm, err := dev.Of(p)
	if err != nil {
		return bjtLaw{}, err
	}
	bf := o.small(p, "beta", sm.Beta, "", sm.Given(dev.Beta))
	ic := o.small(p, "ic", sm.Ic, "A", sm.Given(dev.Ic))
	vbe := o.given(p, "vbe", "bjt", "V")
	if !(bf > 0) || !(ic > 0) || !(vbe > 0) || vbe > 2 {
		return bjtLaw{}, fmt.Errorf("transistor %s: beta and ic must be positive and vbe between 0 and 2 V", p.Ref)
	}
	is := ic * math.Exp(-vbe/VT)
	o.derived(p.Ref, "is", is, "A", "Is = ic·exp(−vbe/VT) (Ebers–Moll)")
	sign := 1.0
	if p.Type == "pnp" {
		sign = -1
	}
	va := dev.DefaultValue("bjt", "va")
	o.list = append(o.list, Origin{p.Ref, "va", va, "V", "default: " + dev.DefaultSource("bjt", "va")})
	return bjtLaw{is: is, bf: bf, br: def("bjt", "betar"), va: va, sign: sign}, nil
}

// fetLaw is the square law of a JFET (Shichman and Hodges, IEEE JSSC 3,
// 1968; SPICE JFET level 1 with BETA = Idss/Vp², LAMBDA 0), with its two
// gate junctions as Shockley diodes.
type fetLaw struct {
	beta, vto, is float64
	sign          float64 // +1 n-channel, −1 p-channel
	mos           bool    // insulated gate (is = 0): SPICE's level-1 MOSFET in the deck
}

func resolveFET(p *graph.Part, o *origins) (fetLaw, error) {
	if p.Type == "nmos" || p.Type == "pmos" {
		return resolveMOS(p, o)
	}
	sign := 1.0
	if p.Type == "pjfet" {
		sign = -1
	}
	idss := o.given(p, "idss", "fet", "A")
	vp, ok := p.Param("vp")
	if ok {
		o.list = append(o.list, Origin{p.Ref, "vp", vp, "V", "given"})
	} else {
		vp = def("fet", "vp") * sign
		o.list = append(o.list, Origin{p.Ref, "vp", vp, "V", "default: " + sourceOf("fet", "vp")})
	}
	// Vp is written with its sign; the law works in n-channel terms.
	vto := vp * sign
	if !(idss > 0) || !(vto < 0) {
		return fetLaw{}, fmt.Errorf("FET %s: idss must be positive and vp of the channel's sign (negative for n-channel)", p.Ref)
	}
	return fetLaw{beta: idss / (vto * vto), vto: vto, is: def("fet", "is"), sign: sign}, nil
}

// resolveMOS gives a MOSFET the square law of SPICE's level-1 MOSFET
// (Shichman and Hodges 1968, with λ = 0 and no body effect):
//
//	saturation (Vds ≥ Vgs − Vth): Id = k·(Vgs − Vth)²
//	triode     (Vds < Vgs − Vth): Id = k·Vds·(2(Vgs − Vth) − Vds)
//
// k is ½·KP·W/L in SPICE's terms (Sedra and Smith's k'n/2·W/L). It is the
// JFET's law with vto = Vth and β = k, and an insulated gate: no gate
// junctions. Vth is written with the channel's sign (an enhancement pmos
// has a negative one); a depletion device has Vth of the other sign.
func resolveMOS(p *graph.Part, o *origins) (fetLaw, error) {
	sign := 1.0
	if p.Type == "pmos" {
		sign = -1
	}
	vth, ok := p.Param("vth")
	if ok {
		o.list = append(o.list, Origin{p.Ref, "vth", vth, "V", "given"})
	} else {
		vth = def("mosfet", "vth") * sign
		o.list = append(o.list, Origin{p.Ref, "vth", vth, "V", "default: " + sourceOf("mosfet", "vth")})
	}
	k := o.given(p, "k", "mosfet", "A/V²")
	if !(k > 0) || math.IsInf(vth, 0) {
		return fetLaw{}, fmt.Errorf("MOSFET %s: k must be positive", p.Ref)
	}
	return fetLaw{beta: k, vto: vth * sign, sign: sign, mos: true}, nil
}

// zenerLaw is a zener's reverse breakdown (graph/device's Zener: the one
// model the AC small-signal slope comes from too) when the part declares
// its breakdown voltage vz, with where rz came from.
func zenerLaw(p *graph.Part, o *origins) (dev.Zener, bool) {
	z, ok := dev.ZenerOf(p)
	if !ok {
		return z, false
	}
	o.list = append(o.list, Origin{p.Ref, "vz", z.Vz, "V", "given"})
	from := "given"
	if z.RzAssumed {
		from = "default: " + dev.DefaultSource("zener", "rz")
	}
	o.list = append(o.list, Origin{p.Ref, "rz", z.Rz, "Ω", from})
	return z, true
}

// diodeLaw is the Shockley law of a semiconductor diode (Shockley, Bell
// Syst. Tech. J. 28, 1949), I = Is·(e^(V/(n·VT)) − 1): Is given, or the one
// that passes 1 mA at vf; n given or 1.
func diodeLaw(p *graph.Part, o *origins) (is, n float64, err error) {
	n = o.given(p, "n", "diode", "")
	if v, ok := p.Param("is"); ok {
		o.list = append(o.list, Origin{p.Ref, "is", v, "A", "given"})
		return v, n, nil
	}
	vf := o.given(p, "vf", "diode", "V")
	if !(vf > 0) || vf > 3 {
		return 0, 0, fmt.Errorf("diode %s: vf must be between 0 and 3 V", p.Ref)
	}
	is = 1e-3 * math.Exp(-vf/(n*VT))
	o.derived(p.Ref, "is", is, "A", "Is = 1 mA·exp(−vf/(n·VT)) (Shockley)")
	return is, n, nil
}
