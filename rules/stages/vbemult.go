package stages

import (
	"fmt"
	"math"

	"pare/graph"
	"pare/graph/figure"
)

// A Vbe multiplier (patterns/complementary-pair-vbe.toml): a transistor
// whose base sits on the tap of a divider Ra (collector to base) and Rb
// (base to emitter) holds V = Vbe·(1 + Ra/Rb) from collector to emitter
// (handbook amplified-diode bias, from memory: the divider's current
// through Rb is Vbe/Rb, and flows through Ra too, the base current small).
// The figure is the DC operating point's voltage across it; the formula
// beside it takes the same operating point's Vbe, so the check is on the
// divider law, not on a guessed 0.65 V. A multiplier the operating point
// shows cut off (Vbe under vbeOn) is no bias source: the stage is dropped.
// Without an operating point (no DC solve asked) no figure is given.
func init() {
	calcs["vbe-multiplier"] = calc{args: []string{"device", "upper", "lower"}, required: []string{"device", "upper", "lower"}, fn: calcVbeMultiplier}
}

// vbeOn is the least base-emitter voltage of a silicon transistor
// conducting enough to hold a bias (common practice: 0.5–0.7 V on).
const vbeOn = 0.4

var byVbeMultiplier = figure.ByFormula("V = Vbe·(1 + Ra/Rb), Vbe at the DC operating point")

func calcVbeMultiplier(x *figCtx) {
	q, ra, rb := x.part("device"), x.part("upper"), x.part("lower")
	if q == nil || ra == nil || rb == nil || !x.solve || x.w.orig == nil || x.w.orig.op == nil {
		return
	}
	op := x.w.orig.op
	oq := op.Circuit.Part(q.Ref)
	if oq == nil || oq.Pin("b") == nil || oq.Pin("c") == nil || oq.Pin("e") == nil {
		return
	}
	vb, ok1 := op.Volts(oq.NetOf("b"))
	vc, ok2 := op.Volts(oq.NetOf("c"))
	ve, ok3 := op.Volts(oq.NetOf("e"))
	if !ok1 || !ok2 || !ok3 {
		return
	}
	vbe := math.Abs(vb - ve)
	if vbe < vbeOn {
		x.st.unconfirmed = fmt.Sprintf("%s's base-emitter voltage is %s at the DC operating point: cut off, no Vbe multiplier", q.Ref, figure.Format(vbe, figure.Volt, figure.Text))
		return
	}
	r1, r2 := ra.Value.Max, rb.Value.Max
	if ra.Kind == graph.Pot || rb.Kind == graph.Pot || r1 <= 0 || r2 <= 0 {
		r1, r2 = 0, 0 // a preset's setting: no formula, the solver's figure alone
	}
	v := figure.Figure{Name: "bias_v", Unit: figure.Volt, Value: math.Abs(vc - ve),
		Origin: figure.BySolver("V("+oq.NetOf("c")+") − V("+oq.NetOf("e")+")", "DC operating point, "+q.Ref)}
	if r2 > 0 {
		check := figure.Figure{Name: "bias_v", Unit: figure.Volt, Value: vbe * (1 + r1/r2), Origin: byVbeMultiplier}
		v.Check = &check
		if figure.Differs(v.Value, check.Value) {
			v.Why = fmt.Sprintf("the formula leaves out %s's base current, which also flows in %s", q.Ref, ra.Ref)
		}
	}
	x.put(v)
}
