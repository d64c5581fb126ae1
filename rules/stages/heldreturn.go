package stages

import (
	"fmt"
	"math"

	"pare/graph"
	"pare/graph/figure"
)

// A detector diode returned to a bypassed point off chassis
// (patterns/diode-detector-bypassed-return.toml: a double-diode-triode's
// diodes on the triode's cathode) is a detector only if the bypass holds
// that point still for the IF the diode passes: a return that follows the
// signal makes the diode part of another network. The solver shows it,
// driving the diode's signal side (the pattern net side):
// |V(return)/V(side)| at the IF (the
// declared one, else the middle of the diode's band) must be small,
// returnMaxDB or below. The amplifier patterns that share such a return
// confirm their gain the same way (calc "gain-above").
func init() {
	calcs["detector-return"] = calc{args: []string{"diode", "return", "side"}, required: []string{"diode", "return", "side"}, netArgs: []string{"side"}, fn: calcDetectorReturn}
	calcs["gain-above"] = calc{args: []string{"device"}, required: []string{"device"}, fn: calcGainAbove}
}

// returnMaxDB is how far below the diode's IF its return must sit: 20 dB
// (a tenth) leaves the diode working across the winding, not across the
// bypass (common practice: a return bypassed ten times below the load's
// impedance is taken as held).
const returnMaxDB = -20

func calcDetectorReturn(x *figCtx) {
	d, ck := x.part("diode"), x.part("return")
	if d == nil || ck == nil || !x.solve {
		return
	}
	in, ret := x.st.nets[x.spec.Args["side"][0]], diodeReturn(d, ck)
	f := x.w.c.Freqs["if"]
	if b := x.w.c.BandOf(d); f <= 0 && b.Min > 0 && b.Max > b.Min {
		f = math.Sqrt(b.Min * b.Max)
	}
	c := x.solverCircuit()
	if in == "" || ret == "" || f <= 0 || c.Net(in) == nil || c.Net(ret) == nil {
		return
	}
	g, ok := transferAt(c, in, ret, f)
	if !ok {
		x.st.unconfirmed = fmt.Sprintf("the solver gives nothing from %s to %s: %s's return is not confirmed", in, ret, d.Ref)
		return
	}
	db := 20 * math.Log10(math.Max(math.Abs(g), 1e-12))
	if db > returnMaxDB {
		x.st.unconfirmed = fmt.Sprintf("%s's return %s follows the IF at %s dB in circuit: not held by %s", d.Ref, ret, figure.Plain(db), ck.Ref)
		return
	}
	x.put(figure.Figure{Name: "return_if", Unit: figure.Decibel, Value: db,
		Origin: figure.BySolver("20·log10 |V("+ret+")/V("+in+")|", hz(f)+", "+gangMid.at)})
	x.st.Notes = append(x.st.Notes, fmt.Sprintf("%s returns to %s, which %s holds at AC ground (%s dB of the IF in circuit)",
		d.Ref, ret, ck.Ref, figure.Plain(math.Round(db))))
	x.diodeDelay(d, in, ret)
}

// minDelay is the least standing reverse bias called a delay: a load
// returned to the diode's own return leaves microvolts of leakage, no delay.
const minDelay = 0.01

// diodeDelay is the standing reverse bias on the diode at the DC operating
// point, V(return) − V(signal side) on the circuit as captured: the
// carrier level the diode must pass before it conducts (the AGC delay).
// Nothing where no operating point was solved or the diode is not held
// off by minDelay or more (a load returned to the diode's own return).
func (x *figCtx) diodeDelay(d *graph.Part, in, ret string) {
	if x.w.orig == nil || x.w.orig.op == nil {
		return
	}
	op := x.w.orig.op
	od := op.Circuit.Part(d.Ref)
	if od == nil {
		return
	}
	var pin string
	for _, p := range d.Pins {
		if p.Net == in {
			pin = p.Name
			break
		}
	}
	k := "k"
	if pin == "k" {
		k = "a" // a diode the other way round: its anode on the return
	}
	if pin == "" || od.Pin(pin) == nil || od.Pin(k) == nil {
		return
	}
	vs, ok1 := op.Volts(od.NetOf(pin))
	vr, ok2 := op.Volts(od.NetOf(k))
	if !ok1 || !ok2 {
		return
	}
	delay := vr - vs
	if pin == "k" {
		delay = -delay
	}
	if delay < minDelay {
		return
	}
	x.set("delay", figure.Volt, delay, figure.BySolver("V("+od.NetOf(k)+") − V("+od.NetOf(pin)+")", "DC operating point, "+d.Ref))
}

// diodeReturn is the net the diode shares with the return's bypass.
func diodeReturn(d, ck *graph.Part) string {
	for _, p := range d.Pins {
		for _, q := range ck.Pins {
			if p.Net == q.Net {
				return p.Net
			}
		}
	}
	return ""
}

// calcGainAbove drops an amplifier whose gain the solver does not show
// above 1: named an amplifier by its shape, it must amplify in circuit.
func calcGainAbove(x *figCtx) {
	if !x.solve {
		return
	}
	g, ok := x.get("gain")
	if !ok || g.Origin.Source != figure.Solver {
		return
	}
	if math.Abs(g.Value) <= 1 {
		x.st.unconfirmed = fmt.Sprintf("%s's gain is %s in circuit: it does not amplify", x.part("device").Ref, figure.Plain(g.Value))
	}
}
