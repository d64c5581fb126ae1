package stages

import (
	"math"

	"pare/graph"
	"pare/graph/figure"
)

// What a repairer checks on an output stage beyond its load: the voltage
// gain from the grid to the loudspeaker, the most it can deliver and how
// hard the valve runs. The gain is the solver's on the whole reduced
// circuit (V(speaker)/V(control) at the middle of the device's band, gang
// at mid travel), with the handbook's A = gm·(rout ∥ n²Z)/n beside it. The
// power is the class-A estimate P = ½·Ia²·n²·Z (handbook: the anode current
// swings from its standing value Ia to cut-off and back to 2·Ia, into the
// reflected load n²·Z), Ia the DC solver's at the operating point. The
// anode (collector) dissipation is the DC solver's Ia·(Va − Vk) at the
// operating point, shown against the device's pmax and flagged above
// 100 % of it (common practice: a valve run above its rating glows and
// fails early).

var (
	byOutputGain  = figure.ByFormula("A = gm·(rout ∥ n²Z)/n")
	byClassAPower = figure.ByFormula("P = ½·Ia²·n²·Z, class A, Ia from the DC operating point")
	byPmax        = figure.FromNetlist("the device's pmax")
)

// outputGain is the stage's voltage gain to the loudspeaker as the solver
// gives it, with the formula's beside it.
func (x *figCtx) outputGain(dev *graph.Part, n, z float64) {
	in, out := "", ""
	if i := x.index(x.spec.Args["device"][0]); i >= 0 {
		for _, pin := range x.m.v.parts[i].pp.Pins {
			if pin.Key == "control" {
				in = x.st.nets[pin.Net]
			}
		}
	}
	spk := x.part("speaker")
	for _, pin := range spk.Pins {
		if id, ok := x.w.netID[pin.Net]; ok && id != groundNet && out == "" {
			out = pin.Net
		}
	}
	c := x.solverCircuit()
	band := x.w.c.BandOf(dev)
	if in == "" || out == "" || c.Net(in) == nil || c.Net(out) == nil || band.Min <= 0 {
		return
	}
	f := math.Sqrt(band.Min * band.Max)
	g, ok := transferAt(c, in, out, f)
	if !ok {
		return
	}
	sv := &figure.Figure{Name: "gain", Unit: figure.Ratio, Value: math.Abs(g),
		Origin: figure.BySolver("V("+out+")/V("+in+")", hz(f)+", "+gangMid.at)}
	var check *figure.Figure
	if d := deviceOf(dev); d.gm > 0 && n > 0 {
		rl := z
		if rout := d.ra + d.rOut; rout > 0 {
			rl = rout * z / (rout + z)
		}
		check = &figure.Figure{Name: "gain", Unit: figure.Ratio, Value: d.gm * rl / n, Origin: byOutputGain}
	}
	x.putChecked(sv, check, func() string {
		return "the formula takes the transformer as ideal; in circuit its windings' resistance and inductance and what else hangs on the anode count"
	})
}

// outputPower puts the class-A power estimate and the anode dissipation at
// the DC operating point, where it was solved.
func (x *figCtx) outputPower(dev *graph.Part, z float64) {
	if x.w.orig == nil || x.w.orig.op == nil || !x.solve {
		return
	}
	op := x.w.orig.op
	od := op.Circuit.Part(dev.Ref)
	out, common := "a", "k"
	switch dev.Kind {
	case graph.BJT:
		out, common = "c", "e"
	case graph.FET:
		out, common = "d", "s"
	}
	if od == nil || od.Pin(out) == nil || od.Pin(common) == nil || op.Part(dev.Ref) == nil {
		return
	}
	ia := op.Current(dev.Ref, out)
	va, ok1 := op.Volts(od.NetOf(out))
	vk, ok2 := op.Volts(od.NetOf(common))
	if !ok1 || !ok2 || ia <= 0 {
		return
	}
	where := "DC operating point, " + dev.Ref
	x.set("p_out_class_a", figure.Watt, ia*ia*z/2, byClassAPower)
	pa := ia * (va - vk)
	x.set("p_anode", figure.Watt, pa, figure.BySolver("I·V of the "+electrode(dev.Kind)+" at the", where))
	pmax, ok := od.Param("pmax")
	if !ok || pmax <= 0 {
		return
	}
	x.set("p_max", figure.Watt, pmax, byPmax)
	if share := pa / pmax; share > 1 {
		x.flag("%s %s dissipation %s is %.0f %% of its %s rating (pmax): the valve runs above its rating", dev.Ref, electrode(dev.Kind),
			figure.Format(pa, figure.Watt, figure.Text), 100*share, figure.Format(pmax, figure.Watt, figure.Text))
	}
}

// electrode names the output electrode of a device kind.
func electrode(k graph.Kind) string {
	switch k {
	case graph.BJT:
		return "collector"
	case graph.FET:
		return "drain"
	}
	return "anode"
}
