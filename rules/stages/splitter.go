package stages

import (
	"fmt"
	"slices"

	"pare/graph"
	"pare/graph/figure"
)

// A cathodyne phase splitter (patterns/cathodyne.toml): equal loads in
// the output and common leads give equal and opposite outputs, each
// RL/(RL + 1/gm + ...) of the control electrode's signal, a little under
// one (handbook: the split-load inverter's gain µRL/(ra + (µ+2)RL) from
// each output with RL = Rk, from memory). The name stands only where the
// common electrode's signal goes on (a capacitor or resistor beyond the
// stage takes it) and the solver gives the two outputs in antiphase,
// within splitBalance of each other.
func init() {
	calcs["splitter"] = calc{args: []string{"device", "load", "cathode", "bias"}, required: []string{"device", "load", "cathode"}, fn: calcSplitter}
}

// splitBalance is the most the two outputs may differ, as a ratio: 1.3
// (common practice, no source: a cathodyne's two loads are matched
// within their tolerance, the outputs within a few per cent).
const splitBalance = 1.3

var byLoadRatio = figure.ByFormula("RL/Rk, the output load over the common lead's")

func calcSplitter(x *figCtx) {
	q, rl, rk := x.part("device"), x.part("load"), x.part("cathode")
	if q == nil || rl == nil || rk == nil || rk.Value.Max <= 0 {
		return
	}
	k := q.NetOf(q.PinWithRole(graph.RoleCommon))
	if !takenOn(x.w.c, k, q, rk, x.part("bias")) {
		return // nothing takes the common electrode's signal: a degenerated amplifier
	}
	x.set("load_ratio", figure.Ratio, rl.Value.Max/rk.Value.Max, byLoadRatio)
	if !x.solve {
		return
	}
	c, g, o, f, ok := x.midbandDrive(q)
	if !ok {
		return
	}
	ga, ok1 := transferAt(c, g, o, f)
	gk, ok2 := transferAt(c, g, k, f)
	if !ok1 || !ok2 {
		return
	}
	if !antiphase(ga, gk, splitBalance) {
		x.st.unconfirmed = fmt.Sprintf("in circuit %s's %s gives ×%s and its %s ×%s: no split into equal and opposite halves",
			q.Ref, outputWord(q), figure.Plain(ga), electrodeWord(q), figure.Plain(gk))
		return
	}
	at := hz(f) + ", " + gangMid.at
	x.put(figure.Figure{Name: outputGainName(q), Unit: figure.Ratio, Value: ga,
		Origin: figure.BySolver("V("+o+")/V("+g+")", at)})
	x.put(figure.Figure{Name: commonGainName(q), Unit: figure.Ratio, Value: gk,
		Origin: figure.BySolver("V("+k+")/V("+g+")", at)})
}

// takenOn says whether a part other than the device and the common lead's
// own resistors (the load, and the bias resistor above it where there is
// one), and not a resistor or capacitor to AC ground, is on net k: the
// coupling that takes the common electrode's signal on.
func takenOn(c *graph.Circuit, k string, q *graph.Part, own ...*graph.Part) bool {
	for _, cn := range c.ConnsOf(k) {
		p := cn.Part
		if p == q || slices.Contains(own, p) {
			continue
		}
		if a, b, ok := passiveEnds(p); ok && (c.RoleOf(a).IsACGround() || c.RoleOf(b).IsACGround()) {
			continue
		}
		return true
	}
	return false
}

// commonGainName is the figure of the gain at a device's common electrode.
func commonGainName(p *graph.Part) string {
	switch p.Kind {
	case graph.BJT:
		return "gain_emitter"
	case graph.FET:
		return "gain_source"
	}
	return "gain_cathode"
}
