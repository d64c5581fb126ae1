package stages

import (
	"fmt"
	"math"

	"pare/graph"
	"pare/graph/ac"
	"pare/graph/figure"
)

// A capacitor from a device's output electrode to its own control
// electrode (collector to base, anode to grid): local feedback that the
// Miller effect multiplies by the stage's gain, to roll the gain off
// above the band and keep a feedback amplifier stable. It couples nothing
// onward. Named only where the solver bears it out: a current fed into
// the control electrode, the output's response with the capacitor against
// without it falls 3 dB somewhere between the band's top and millerSpan
// times it, and the band's top itself keeps within 3 dB (a deeper cut
// there is a tone control's job, not a stability capacitor's).
func init() {
	calcs["miller-cap"] = calc{args: []string{"device", "c"}, required: []string{"device", "c"}, fn: calcMillerCap}
}

// millerSpan is how far above the band's top a stability capacitor's
// corner may lie: a decade and a half (common practice, no source: an
// audio amplifier's open-loop roll-off sits at a few tens of kilohertz
// to some hundreds).
const millerSpan = 30.0

func calcMillerCap(x *figCtx) {
	dev, c := x.part("device"), x.part("c")
	if dev == nil || c == nil || !x.solve {
		return
	}
	// Driven from the circuit's declared input, an ideal source, the
	// control electrode is held through its coupling capacitor and the
	// capacitor changes nothing; the amplifier it stabilises is fed from
	// a source of some resistance. So the control electrode is fed a
	// current, the declared inputs freed: its own bias network is then
	// the source, the highest the stage can meet.
	base := withPart(x.solverCircuit(), &graph.Part{})
	base.Parts, base.Inputs = x.solverCircuit().Parts, nil
	in, out := dev.NetOf(dev.PinWithRole(graph.RoleControl)), dev.NetOf(dev.PinWithRole(graph.RoleOutput))
	b := x.w.c.BandOf(dev)
	if in == "" || out == "" || b.Min <= 0 || b.Max <= b.Min {
		return
	}
	with, err1 := ac.NewTransimpedance(base, in, out, gangMid.options())
	bare, err2 := ac.NewTransimpedance(without(base, c.Ref), in, out, gangMid.options())
	if err1 != nil || err2 != nil {
		return
	}
	ratio := func(f float64) float64 { return magnitude(with, f) / magnitude(bare, f) }
	top := ratio(b.Max)
	if math.IsNaN(top) || top < 1/math.Sqrt2 {
		x.st.unconfirmed = fmt.Sprintf("%s cuts more than 3 dB at the band's top: a tone control, not a stability capacitor", c.Ref)
		return
	}
	fc, ok := bisectLog(func(f float64) (bool, bool) {
		v := ratio(f)
		return v >= 1/math.Sqrt2, !math.IsNaN(v)
	}, b.Max, millerSpan*b.Max)
	if !ok {
		x.st.unconfirmed = fmt.Sprintf("%s rolls nothing off within %s× the band's top in circuit", c.Ref, figure.Plain(millerSpan))
		return
	}
	what := "V(" + out + ")/I(" + in + ") with " + c.Ref + " against without it"
	at := "1 A into " + in + ", the declared inputs freed, " + gangMid.at
	x.put(figure.Figure{Name: "f_rolloff", Unit: figure.Hertz, Value: fc, Origin: figure.BySolver("−3 dB of "+what, at)})
	x.put(figure.Figure{Name: "cut_top", Unit: figure.Decibel, Value: -db(top), Origin: figure.BySolver(what+" at the band's top", at)})
	x.st.Notes = append(x.st.Notes, fmt.Sprintf("roll-off solved with %s fed a current and the input freed, its bias network the source: fed from a stiffer source it rolls off higher", in))
}
