package stages

import (
	"fmt"
	"math"

	"pare/graph"
	"pare/graph/figure"
)

// A complementary output pair: an NPN and a PNP emitter follower (or an
// N and a P channel source follower) whose common electrodes drive one
// output net, each through its own small resistor or directly, their
// control electrodes held apart by a bias network (two diodes, a preset,
// a resistor, a Vbe multiplier) that sets the standing current. The
// driver's output electrode feeds one control electrode directly and the
// other through the bias network, which is an AC short for the signal.
// Named only where the solver shows both followers following: the gain
// from the driven control electrode to the output, in circuit at
// mid-band, between pairMinGain and pairMaxGain (a follower's is just
// under 1; handbook, from memory).
func init() {
	calcs["complementary"] = calc{args: []string{"upper", "lower", "out"}, required: []string{"upper", "lower", "out"},
		netArgs: []string{"out"}, fn: calcComplementary}
}

const (
	pairMinGain = 0.5
	pairMaxGain = 1.05
)

func calcComplementary(x *figCtx) {
	up, lo := x.part("upper"), x.part("lower")
	out := x.st.nets[x.spec.Args["out"][0]]
	if up == nil || lo == nil || out == "" || !x.solve {
		return
	}
	in := x.drivenControl(up, lo)
	c := x.solverCircuit()
	band := x.w.c.BandOf(up)
	if in == "" || c.Net(in) == nil || c.Net(out) == nil || band.Min <= 0 || band.Max <= band.Min {
		return
	}
	f := math.Sqrt(band.Min * band.Max)
	g, ok := transferAt(c, in, out, f)
	if !ok {
		return
	}
	if g < pairMinGain || g > pairMaxGain {
		x.st.unconfirmed = fmt.Sprintf("the pair's gain from %s to %s is %s in circuit, not a follower's", in, out, figure.Plain(g))
		return
	}
	x.put(figure.Figure{Name: "gain", Unit: figure.Ratio, Value: g,
		Origin: figure.BySolver("V("+out+")/V("+in+")", hz(f)+", "+gangMid.at)})
}

// drivenControl is the control electrode's net of the pair that another
// device's output electrode drives (the driver's collector), else the
// upper device's.
func (x *figCtx) drivenControl(up, lo *graph.Part) string {
	for _, q := range []*graph.Part{lo, up} {
		net := q.NetOf(q.PinWithRole(graph.RoleControl))
		for _, cn := range x.w.c.ConnsOf(net) {
			p := cn.Part
			if p != up && p != lo && p.IsActive() && graph.RoleOfPin(p.Kind, cn.Pin) == graph.RoleOutput {
				return net
			}
		}
	}
	return up.NetOf(up.PinWithRole(graph.RoleControl))
}
