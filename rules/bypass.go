package rules

import (
	"math"

	"pare/graph"
)

// bypass: a capacitor from a net to AC ground holds that net at AC ground
// when its reactance, at the lowest frequency of interest on the net, is
// small against everything else the net sees towards AC ground. "Everything
// else" is a lower bound (parallel combination of each terminal's least
// impedance: resistors, coils, a cathode's (ra + RL)/(µ + 1), an anode's
// ra …, from graph/device's model; a winding tuned to AC ground at its far
// end, a coil's cold end, counts as the tank's loss resistance over the
// whole band, since the capacitor is in series with the tank), so the
// judgement errs towards keeping a capacitor. A capacitor that resonates
// with a coil on the same net inside or near the band is a tuned circuit and
// never a bypass.
var bypass = Rule{
	Name:      "bypass",
	Purpose:   "a capacitor to AC ground whose reactance is small against what it shunts puts its net at AC ground",
	Level:     LevelSignal,
	Kinds:     []graph.Kind{graph.Capacitor},
	Symmetric: true,
	Match: func(x *Ctx, a Anchor) *Plan {
		p, net, gnd, ok := shuntToGround(x, a)
		if !ok {
			return nil
		}
		return &Plan{Parts: []*graph.Part{p}, Nets: []string{net, gnd}}
	},
	Guard: bypassGuard,
	Apply: groundThroughCap,
}

// shuntToGround is what the bypass and supply-line rules ask of their
// anchor first: a fixed two-terminal capacitor, free to go, from a signal
// net that is no declared end to a net at AC ground. It gives the part and
// its two nets, the grounded one second.
func shuntToGround(x *Ctx, a Anchor) (p *graph.Part, net, gnd string, ok bool) {
	p = a.Part
	net, gnd = Ends(p, a.Flip)
	if p.Type == graph.CapVariable || p.Type == graph.CapTrimmer {
		return nil, "", "", false // a tuning element, never a bypass
	}
	if p.Kind != graph.Capacitor || p.Keep || len(p.Pins) != 2 || net == "nc" || gnd == "nc" || net == gnd {
		return nil, "", "", false
	}
	if !x.IsACGround(gnd) || x.IsACGround(net) || x.IsEnd(net) {
		return nil, "", "", false
	}
	return p, net, gnd, true
}

// groundThroughCap applies both rules' plan: the capacitor goes and its net
// joins AC ground.
func groundThroughCap(x *Ctx, m *Plan) Step {
	p, net := m.Parts[0], m.Nets[0]
	removed := origins(p)
	x.Remove(p)
	x.GroundNet(net)
	return Step{Removed: removed, Grounded: []string{net}}
}

func bypassGuard(x *Ctx, m *Plan) (bool, string) {
	p, net := m.Parts[0], m.Nets[0]
	lo, hi, from, ok := x.bandOn([]*graph.Part{p}, net)
	if !ok {
		return false, ""
	}
	d := x.describe(p)
	if l, lh, fLo, fHi, tuned := x.resonance([]string{net}, capMin(p), capMax(p), lo, hi, p); tuned {
		return false, d + ": with " + l.Ref + " (" + henries(lh) + ") it resonates at " + hz(fLo) + rangeTail(fLo, fHi) +
			", inside or near the band " + hz(lo) + "–" + hz(hi) + ": a tuned circuit, not a bypass"
	}
	xc := 1 / (omega(lo) * capMin(p))
	z, branches := x.LowerZIn(net, lo, hi, p)
	limit := x.ratio * z
	at := "|Xc| at " + x.bandWhy(lo, from, p) + " = " + ohms(xc)
	if math.IsInf(z, 1) {
		return true, d + ": " + at + "; nothing else on " + net + " leads to AC ground (" + branches + ") → " + net + " is at AC ground"
	}
	if xc <= limit {
		return true, d + ": " + at + " ≤ " + num(x.ratio) + " × " + ohms(z) + " (" + branches + ") → " + net + " is at AC ground"
	}
	return false, d + ": " + at + " > " + num(x.ratio) + " × " + ohms(z) + " (" + branches + "): not a bypass at the band's low edge, kept"
}

func rangeTail(lo, hi float64) string {
	if hi/lo < 1.0001 {
		return ""
	}
	return "–" + hz(hi)
}
