package stages

import (
	"fmt"
	"math/cmplx"

	"pare/graph"
	"pare/graph/figure"
)

// A push-pull pair is named by its wiring (two devices into the ends of
// one centre-tapped primary), and confirmed by what the solver shows it
// do: with the set driven from its input (the pair's region's declared
// input, else the circuit's first), the two control electrodes swing in
// antiphase, about equally (driverBalance). A pair driven in phase is two
// devices in parallel into half a winding each, not push-pull; a pair no
// declared input reaches keeps its name on the wiring alone, as before,
// and says so.
func init() {
	calcs["push-pull"] = calc{args: []string{"upper", "lower"}, required: []string{"upper", "lower"}, fn: calcPushPull}
}

func calcPushPull(x *figCtx) {
	up, lo := x.part("upper"), x.part("lower")
	if up == nil || lo == nil || !x.solve {
		return
	}
	g1, g2 := up.NetOf(up.PinWithRole(graph.RoleControl)), lo.NetOf(lo.PinWithRole(graph.RoleControl))
	c, _, _, f, ok := x.midbandDrive(up)
	in := pairInput(x.w.c, up)
	if !ok || in == "" || in == g1 || in == g2 || c.Net(in) == nil {
		x.st.Notes = append(x.st.Notes, fmt.Sprintf("no declared input drives %s and %s: named push-pull by the wiring alone", up.Ref, lo.Ref))
		return
	}
	h1, ok1 := transferComplex(c, in, g1, f)
	h2, ok2 := transferComplex(c, in, g2, f)
	if !ok1 || !ok2 || cmplx.Abs(h1) == 0 {
		x.st.Notes = append(x.st.Notes, fmt.Sprintf("the input %s does not reach %s in circuit: named push-pull by the wiring alone", in, up.Ref))
		return
	}
	r := h2 / h1
	ratio := cmplx.Abs(r)
	if real(r) < 0 {
		ratio = -ratio
	}
	if !antiphase(1, ratio, driverBalance) {
		x.st.unconfirmed = fmt.Sprintf("driven from %s, %s's %s swings ×%s of %s's in circuit: not a push-pull pair's antiphase drive",
			in, lo.Ref, ControlWord(lo), figure.Plain(ratio), up.Ref)
		return
	}
	x.put(figure.Figure{Name: "drive_ratio", Unit: figure.Ratio, Value: ratio,
		Origin: figure.BySolver("V("+g2+")/V("+g1+"), driven from "+in, hz(f)+", "+gangMid.at)})
}

// pairInput is where the set is driven from to see a pair work: its
// region's declared input where it names one, else the circuit's first.
func pairInput(c *graph.Circuit, q *graph.Part) string {
	if r := c.RegionOf(q); r != nil && r.Input != "" {
		return r.Input
	}
	if len(c.Inputs) > 0 {
		return c.Inputs[0]
	}
	return ""
}
