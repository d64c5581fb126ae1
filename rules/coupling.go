package rules

import (
	"math"

	"pare/graph"
)

// coupling-short (ideal view only): a coupling capacitor between two signal
// nets whose reactance at the low edge of the band is small against the
// impedance it feeds is drawn as a wire. "What it feeds" is the larger of the
// two sides' lower-bound impedances to AC ground: a coupling capacitor works
// into a grid leak or a base bias network, and the why says which side was
// taken. Capacitors that resonate with a coil on either net (tank and
// divider capacitors of tuned circuits and oscillators) are never shorted.
var couplingShort = Rule{
	Name:    "coupling-short",
	Purpose: "short coupling capacitors whose reactance is small against the impedance they feed",
	Level:   LevelIdeal,
	Kinds:   []graph.Kind{graph.Capacitor},
	Match: func(x *Ctx, a Anchor) *Plan {
		p := a.Part
		if p.Kind != graph.Capacitor || p.Keep || len(p.Pins) != 2 || p.Type == graph.CapVariable || p.Type == graph.CapTrimmer {
			return nil
		}
		na, nb := Ends(p, false)
		if na == nb || na == "nc" || nb == "nc" || x.IsACGround(na) || x.IsACGround(nb) {
			return nil
		}
		if x.IsEnd(na) && x.IsEnd(nb) {
			return nil // joining two declared ends would lose one of them
		}
		return &Plan{Parts: []*graph.Part{p}, Nets: []string{na, nb}}
	},
	Guard: func(x *Ctx, m *Plan) (bool, string) {
		p, na, nb := m.Parts[0], m.Nets[0], m.Nets[1]
		lo, hi, from, ok := x.bandOn([]*graph.Part{p}, na, nb)
		if !ok {
			return false, ""
		}
		d := x.describe(p)
		if l, lh, fLo, fHi, tuned := x.resonance([]string{na, nb}, capMin(p), capMax(p), lo, hi, p); tuned {
			return false, d + ": with " + l.Ref + " (" + henries(lh) + ") it resonates at " + hz(fLo) + rangeTail(fLo, fHi) + ", inside or near the band: part of a tuned circuit, not shorted"
		}
		if q := acrossPart(x, p, na, nb); q != nil {
			// The impedances on either side would count the part across the
			// capacitor as a load to ground, while the capacitor itself
			// shorts it: no ratio says anything here.
			return false, d + ": " + x.describe(q) + " is directly across it: an R–C or L–C network (a load, a time constant), not a coupling capacitor: kept"
		}
		xc := 1 / (omega(lo) * capMin(p))
		za, ta := x.LowerZ(na, lo, p)
		zb, tb := x.LowerZ(nb, lo, p)
		z, side, text := za, na, ta
		if zb > za {
			z, side, text = zb, nb, tb
		}
		at := "|Xc| at " + x.bandWhy(lo, from, p) + " = " + ohms(xc)
		if math.IsInf(z, 1) {
			return false, d + ": " + at + ", but nothing bounds the impedance on " + side + ": kept"
		}
		if xc <= x.ratio*z {
			return true, d + ": " + at + " ≤ " + num(x.ratio) + " × " + ohms(z) + " on " + side + " (" + text + ") → drawn as a wire (ideal view: assumes the signal flows into the higher-impedance side)"
		}
		return false, d + ": " + at + " > " + num(x.ratio) + " × " + ohms(z) + " on " + side + " (" + text + "): kept"
	},
	Apply: func(x *Ctx, m *Plan) Step {
		p := m.Parts[0]
		removed := origins(p)
		keep, gone := x.ChooseKeep(m.Nets[0], m.Nets[1])
		x.Remove(p)
		x.Join(keep, gone)
		return Step{Removed: removed, Joined: []string{keep, gone}}
	},
}

// acrossPart returns a part other than p whose terminals all lie on the two
// nets a and b, touching both (a resistor or coil across a capacitor), or
// nil. Parts are tried in the circuit's order, so the answer is stable.
func acrossPart(x *Ctx, p *graph.Part, a, b string) *graph.Part {
	for _, cn := range x.Conns(a) {
		q := cn.Part
		if q == p {
			continue
		}
		onA, onB, other := false, false, false
		for _, pin := range q.Pins {
			switch pin.Net {
			case a:
				onA = true
			case b:
				onB = true
			case "nc":
			default:
				other = true
			}
		}
		if onA && onB && !other {
			return q
		}
	}
	return nil
}
