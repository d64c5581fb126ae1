package stages

import (
	"math"
	"math/cmplx"

	"pare/graph"
	"pare/graph/figure"
)

// The output resistance of a follower by the formula that fits its
// device (handbook, from memory; docs/references.md §5): a cathode
// follower's ra/(µ+1) ∥ Rk; an emitter follower's (re + Rs/(β+1)) ∥ RE,
// re = 1/gm, where the base's source resistance Rs, divided by the
// current gain, shows at the emitter (a BJT draws base current, so what
// drives its base counts, unlike a grid); a source follower's 1/gm ∥ RS.
var (
	byROutValve = figure.ByFormula("Rout = ra/(µ+1) ∥ Rk")
	byROutBJT   = figure.ByFormula("Rout = (re + Rs/(β+1)) ∥ RE, re = 1/gm, Rs the base's source in circuit")
	byROutBJT0  = figure.ByFormula("Rout = re ∥ RE, re = 1/gm, the base's source taken as 0")
	byROutFET   = figure.ByFormula("Rout = 1/gm ∥ RS")
)

// followerROutCheck is the formula's output resistance for follower p,
// rk its common-lead resistor; for a transistor Rs is the solver's
// impedance to chassis at the base with p taken out, at f (f ≤ 0, or the
// solver silent: Rs taken as 0 and the formula's name says so).
func (x *figCtx) followerROutCheck(p *graph.Part, d device, rk, f float64) figure.Figure {
	fig := func(v float64, by figure.Origin) figure.Figure {
		return figure.Figure{Name: "r_out", Unit: figure.Ohm, Value: v, Origin: by}
	}
	switch {
	case d.kind == graph.BJT && d.gm > 0:
		beta := d.beta
		if !(beta > 0) {
			beta = d.gm * d.rpi
		}
		re := 1 / d.gm
		if zs, ok := x.baseSource(p, f); ok && beta > 0 {
			// Rs complex as the solver gives it: a base fed through a
			// capacitor or tank has a reactive source, and |re + Rs/(β+1)|
			// is what the emitter shows
			zo := complex(re, 0) + zs/complex(beta+1, 0)
			if rk > 0 {
				zo = zo * complex(rk, 0) / (zo + complex(rk, 0))
			}
			return fig(cmplx.Abs(zo), byROutBJT)
		}
		return fig(parallel(re, rk), byROutBJT0)
	case d.kind == graph.FET && d.gm > 0:
		return fig(parallel(1/d.gm, rk), byROutFET)
	}
	return fig(parallel(d.small.ZCommon(0), rk), byROutValve)
}

// baseSource is Z into p's control electrode from the rest of the
// circuit, p taken out, at f.
func (x *figCtx) baseSource(p *graph.Part, f float64) (complex128, bool) {
	b := p.NetOf(p.PinWithRole(graph.RoleControl))
	if !x.solve || f <= 0 || b == "" {
		return 0, false
	}
	z, ok := impedanceAt(without(x.solverCircuit(), p.Ref), b, f)
	if !ok || cmplx.IsNaN(z) || math.IsInf(cmplx.Abs(z), 0) {
		return 0, false
	}
	return z, true
}
