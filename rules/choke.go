package rules

import (
	"math"

	"pare/graph"
)

// RF chokes from a signal net to AC ground are there to feed DC and block the
// signal. At LevelSignal a choke goes when its reactance at the band's low
// edge is at least 1/ratio times an upper bound of the impedance it shunts
// (so the choke is negligible across it); at LevelIdeal it goes when its
// reactance merely exceeds that bound. A choke in series between two signal
// nets stays: opening it could cut a lower-frequency path (audio, DC bias)
// that the region's band does not show.
func chokeRule(name string, level Level, factor func(x *Ctx) float64, words string) Rule {
	return Rule{
		Name:      name,
		Purpose:   "open RF chokes whose reactance is large against what they shunt (" + words + ")",
		Level:     level,
		Kinds:     []graph.Kind{graph.Inductor},
		Symmetric: true,
		Match: func(x *Ctx, a Anchor) *Plan {
			p := a.Part
			if p.Keep || p.Type != graph.IndChoke || len(p.Pins) != 2 {
				return nil
			}
			net, gnd := Ends(p, a.Flip)
			if net == gnd || net == "nc" || gnd == "nc" || x.IsACGround(net) {
				return nil
			}
			if !x.IsACGround(gnd) {
				if a.Flip {
					return nil // report a series choke once, not for each pin order
				}
				return &Plan{Parts: []*graph.Part{p}, Nets: []string{net, gnd}, Data: "series"}
			}
			return &Plan{Parts: []*graph.Part{p}, Nets: []string{net, gnd}}
		},
		Guard: func(x *Ctx, m *Plan) (bool, string) {
			p, net := m.Parts[0], m.Nets[0]
			if m.Data == "series" {
				return false, x.describe(p) + ": in series between two signal nets: left in (opening it could cut a lower-frequency path)"
			}
			lo, _, from, ok := x.bandOn([]*graph.Part{p}, net)
			if !ok {
				return false, ""
			}
			xl := omega(lo) * p.Inductance()
			z, what := x.UpperZ(net, lo, p)
			k := factor(x)
			at := "XL at " + x.bandWhy(lo, from, p) + " = " + ohms(xl)
			if math.IsInf(z, 1) {
				return false, x.describe(p) + ": " + at + ", but nothing on " + net + " bounds the impedance it shunts: left in"
			}
			if xl >= k*z {
				return true, x.describe(p) + ": " + at + " ≥ " + num(k) + " × " + ohms(z) + " (" + what + ") → open at signal frequency; removed (it only feeds DC)"
			}
			return false, x.describe(p) + ": " + at + " < " + num(k) + " × " + ohms(z) + " (" + what + "): not negligible at the band's low edge, kept"
		},
		Apply: func(x *Ctx, m *Plan) Step {
			removed := origins(m.Parts[0])
			x.Remove(m.Parts[0])
			return Step{Removed: removed}
		},
	}
}

var rfChoke = chokeRule("rf-choke", LevelSignal, func(x *Ctx) float64 { return 1 / x.ratio }, "XL ≥ |Z|/ratio")

var chokeOpen = chokeRule("choke-open", LevelIdeal, func(*Ctx) float64 { return 1 }, "ideal view: XL ≥ |Z|")
