package device

import (
	"fmt"
	"math"

	"pare/graph"
)

// Param names one small-signal parameter; a set of them (Small.Assumed)
// says which values came from a class default rather than from the part.
type Param uint8

// The parameters of Small.
const (
	Gm    Param = 1 << iota // transconductance
	ROut                    // output resistance: ra, ro, rd
	Mu                      // amplification factor gm·ROut
	RPi                     // BJT input resistance
	Beta                    // BJT current gain
	Ic                      // BJT bias current
	GmOsc                   // a pentagrid converter's g1-to-g2 transconductance
)

// Small is the small-signal model of an amplifying part: a current
// gm·v(control, common) from the output electrode to the common one, the
// output resistance ROut across them, and for a BJT rπ from base to emitter.
// A valve's grid and a FET's gate draw no current (RPi is +Inf).
type Small struct {
	Ref   string
	Kind  graph.Kind
	Class string  // the Defaults class: "triode", "tetrode, pentode", "bjt", "fet", ...
	Gm    float64 // S
	ROut  float64 // Ω: valve ra, BJT ro, FET rd
	Mu    float64 // gm·ROut, dimensionless
	RPi   float64 // Ω; +Inf for valves and FETs
	Beta  float64 // BJT small-signal current gain β = gm·rπ; 0 for valves and FETs
	Ic    float64 // BJT bias current, A; 0 for valves and FETs
	// GmOsc is a pentagrid converter's (heptode, octode) transconductance
	// from g1 to g2, the oscillator anode: the inner triode of cathode, g1
	// and g2 that runs the oscillator. 0 for other parts, and for a section
	// of a multi-section envelope (a triode-heptode's oscillator is its
	// triode).
	GmOsc float64
	// Assumed holds the parameters whose value came from a class default,
	// directly or through a formula: a figure for a repairer may refuse to
	// rest on them, the solver and the bypass judgement use them alike.
	Assumed Param
}

// Given reports whether every parameter in q came from the part itself
// (given, or derived from given values only).
func (s Small) Given(q Param) bool { return s.Assumed&q == 0 }

// Of resolves the small-signal model of an amplifying part (a valve with a
// control grid, a BJT, a FET) from its parameters and the class defaults.
// The error names the part and says what is wrong.
func Of(p *graph.Part) (Small, error) {
	switch p.Kind {
	case graph.Valve:
		return valve(p)
	case graph.BJT:
		return bjt(p)
	case graph.FET:
		return fet(p)
	}
	return Small{}, fmt.Errorf("%s %s has no amplifying model", p.Kind, p.Ref)
}

// ValveClass is the Defaults class of a valve type, "" for valve diodes and
// unknown types.
func ValveClass(typ string) string {
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

// valve resolves gm and ra of a valve section: any two of gm, ra and µ give
// the third (µ = gm·ra); one alone is completed with the class default of ra
// (or of gm when only ra is given). All three given must agree within 2 %.
func valve(p *graph.Part) (Small, error) {
	s := Small{Ref: p.Ref, Kind: p.Kind, Class: ValveClass(p.Type), RPi: math.Inf(1)}
	if s.Class == "" {
		return s, fmt.Errorf("valve %s: type %q has no amplifying model", p.Ref, p.Type)
	}
	g, hasG := p.Param("gm")
	r, hasR := p.Param("ra")
	mu, hasMu := p.Param("mu")
	switch {
	case hasG && hasR && hasMu:
		if math.Abs(g*r-mu) > graph.ValveAgreement*mu {
			return s, fmt.Errorf("valve %s: gm·ra = %.4g but mu = %.4g: give any two of gm, ra, mu", p.Ref, g*r, mu)
		}
	case hasG && hasR:
	case hasG && hasMu:
		r = mu / g
	case hasR && hasMu:
		g = mu / r
	case hasG:
		r, s.Assumed = def(s.Class, "ra"), ROut|Mu
	case hasR:
		g, s.Assumed = def(s.Class, "gm"), Gm|Mu
	case hasMu:
		r, s.Assumed = def(s.Class, "ra"), ROut|Gm
		g = mu / r
	default:
		g, r, s.Assumed = def(s.Class, "gm"), def(s.Class, "ra"), Gm|ROut|Mu
	}
	if g < 0 || r <= 0 || math.IsInf(r, 0) || math.IsNaN(g) {
		return s, fmt.Errorf("valve %s: gm %g and ra %g do not make a model", p.Ref, g, r)
	}
	s.Gm, s.ROut, s.Mu = g, r, g*r
	// A heptode section sharing its envelope with a triode (a
	// triode-heptode) has its oscillator in the triode: its g2 is a screen.
	if (p.Type == "heptode" || p.Type == "octode") && p.Envelope == "" {
		var assumed Param
		s.GmOsc, assumed = paramOr(p, "gmo", "heptode, octode", GmOsc)
		s.Assumed |= assumed
	}
	return s, nil
}

// bjt resolves the hybrid-π model: gm = Ic/VT, rπ = β/gm, ro = VA/Ic
// (Ebers–Moll in forward activity, linearised; any transistor text, from
// memory; docs/references.md §5). gm, rpi or ro given win over the values
// derived from the bias current.
func bjt(p *graph.Part) (Small, error) {
	s := Small{Ref: p.Ref, Kind: p.Kind, Class: "bjt"}
	var assumed Param
	s.Beta, assumed = paramOr(p, "beta", "bjt", Beta)
	s.Assumed |= assumed
	s.Ic, assumed = paramOr(p, "ic", "bjt", Ic)
	s.Assumed |= assumed
	if s.Ic <= 0 || s.Beta <= 0 {
		return s, fmt.Errorf("transistor %s: beta and ic must be positive", p.Ref)
	}
	// ro always rests on the default Early voltage: VA is no netlist key.
	s.Gm, s.ROut = s.Ic/VT, def("bjt", "va")/s.Ic
	s.Assumed |= ROut
	if v, ok := p.Param("gm"); ok {
		s.Gm = v
	} else if !s.Given(Ic) {
		s.Assumed |= Gm
	}
	s.RPi = s.Beta / s.Gm
	if !s.Given(Beta | Gm) {
		s.Assumed |= RPi
	}
	if v, ok := p.Param("rpi"); ok {
		s.RPi, s.Assumed = v, s.Assumed&^RPi
	}
	if v, ok := p.Param("ro"); ok {
		s.ROut, s.Assumed = v, s.Assumed&^ROut
	}
	if s.Gm <= 0 || s.RPi <= 0 || s.ROut <= 0 {
		return s, fmt.Errorf("transistor %s: gm, rpi and ro must be positive", p.Ref)
	}
	s.Mu = s.Gm * s.ROut
	if s.Assumed&(Gm|ROut) != 0 {
		s.Assumed |= Mu
	}
	return s, nil
}

// fet: gm·vgs from drain to source and rd across them, each given or the
// class default.
func fet(p *graph.Part) (Small, error) {
	s := Small{Ref: p.Ref, Kind: p.Kind, Class: "fet", RPi: math.Inf(1)}
	var a, b Param
	s.Gm, a = paramOr(p, "gm", "fet", Gm)
	s.ROut, b = paramOr(p, "rd", "fet", ROut)
	s.Assumed = a | b
	if a|b != 0 {
		s.Assumed |= Mu
	}
	if s.Gm < 0 || s.ROut <= 0 {
		return s, fmt.Errorf("FET %s: gm must not be negative and rd must be positive", p.Ref)
	}
	s.Mu = s.Gm * s.ROut
	return s, nil
}

// paramOr is the part's parameter, or the class default with the flag q
// set to say so.
func paramOr(p *graph.Part, name, class string, q Param) (float64, Param) {
	if v, ok := p.Param(name); ok {
		return v, 0
	}
	return def(class, name), q
}

// GivenOnly is the model with every value that rests on a default dropped,
// for a figure that must not rest on a guess: a dropped output resistance
// or rπ is +Inf (the textbook's "large"), a dropped gm, µ, β or bias
// current is 0. Assumed still says what was dropped.
func (s Small) GivenOnly() Small {
	g := s
	if !s.Given(Gm) {
		g.Gm = 0
	}
	if !s.Given(GmOsc) {
		g.GmOsc = 0
	}
	if !s.Given(ROut) {
		g.ROut = math.Inf(1)
	}
	if !s.Given(Mu) {
		g.Mu = 0
	}
	if !s.Given(RPi) {
		g.RPi = math.Inf(1)
	}
	if !s.Given(Beta) {
		g.Beta = 0
	}
	if !s.Given(Ic) {
		g.Ic = 0
	}
	return g
}
