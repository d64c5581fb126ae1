package stages

import (
	"fmt"
	"math"
	"math/cmplx"

	"pare/graph"
	"pare/graph/ac"
	"pare/graph/figure"
)

// A grid stopper (patterns/grid-stopper.toml) is a series resistor at a
// control electrode. Its figure is the corner it makes with the device's
// input capacitance: fc = 1/(2πR·Cin), Cin = Cin0 + (1 + |A|)·Cf (the
// Miller effect, handbook formula, from memory), A the device's gain from
// its control electrode to its output electrode as the solver gives it in
// circuit at the middle of its band (the geometric mean of the edges, where
// the stage's own gain is read): the ratio of its output and control
// electrodes' voltages with the set driven from its input, as the device
// works (a push-pull half driven alone sees another load than with its
// partner in antiphase, and outside the overall feedback); only where no
// input reaches it is the electrode held by the source and the stopper
// taken out (left in, the stopper would carry the held grid's signal back
// into the driver, and the figure would
// count that as the valve's gain. The solver has no interelectrode
// capacitances, so Cin0 and Cf are the typical ones below and the corner
// is a check value, said to rest on them. Not at the band's top: an output
// valve's anode load rises there through the transformer's leakage
// inductance, and the gain read there (307 against 40.7 at 1 kHz for a
// blind reviewer's push-pull pentode) is no capacitance: with an inductive
// load the Miller admittance turns partly into a negative conductance, and
// a corner worked from it claimed a cut the circuit does not make. Whether
// the stopper cuts the signal is asked of the solver (stopperloss.go), the
// corner kept beside as the formula's cross-check.
func init() {
	calcs["stopper"] = calc{args: []string{"r", "device"}, required: []string{"r", "device"}, fn: calcStopper}
}

var byMiller = figure.ByFormula("fc = 1/(2πR·(Cin + (1 + |A|)·Cf))")

// inputCaps are the typical input capacitance (control to every electrode
// but the output) and feedback capacitance (control to output) of a
// device class, from memory of typical data: a small-signal triode about
// 2 pF and 1.5 pF; a pentode or tetrode (a screen grid) about 8 pF and
// 0.5 pF, an output pentode's being the larger and a small RF pentode's
// feedback much smaller, so these lean to the output valve a stopper
// usually guards; a small-signal BJT about 20 pF and 2 pF; a small FET
// about 5 pF and 2 pF.
func inputCaps(p *graph.Part) (cin, cf float64, what string) {
	switch p.Kind {
	case graph.BJT:
		return 20e-12, 2e-12, "a small-signal BJT's typical"
	case graph.FET:
		return 5e-12, 2e-12, "a small FET's typical"
	}
	for _, pin := range p.Pins {
		if pin.Name == "g2" {
			return 8e-12, 0.5e-12, "a pentode's typical"
		}
	}
	return 2e-12, 1.5e-12, "a triode's typical"
}

func calcStopper(x *figCtx) {
	r, dev := x.part("r"), x.part("device")
	if r == nil || dev == nil || r.Value.Max <= 0 {
		return
	}
	cin, cf, what := inputCaps(dev)
	gain := 0.0
	band := x.w.c.BandOf(dev)
	at := band.Max
	if band.Min > 0 && band.Max > band.Min {
		at = math.Sqrt(band.Min * band.Max)
	}
	if a, how, ok := x.controlGain(dev, r, at); ok {
		gain = a
		x.set("gain_miller", figure.Ratio, a, figure.BySolver("|V(output)/V(control)| of "+dev.Ref+" "+how, hz(at)))
	}
	c := cin + (1+gain)*cf
	fc := 1 / (2 * math.Pi * r.Value.Max * c)
	x.set("c_in", figure.Farad, c, byMiller)
	x.set("f_c", figure.Hertz, fc, byMiller)
	x.st.Notes = append(x.st.Notes, fmt.Sprintf("input capacitance assumed from %s %s and %s feedback (the solver has no interelectrode capacitances): a check value",
		what, figure.Format(cin, figure.Farad, figure.Text), figure.Format(cf, figure.Farad, figure.Text)))
	if band.Max > 0 {
		x.putStopperLoss(dev, r, cin, cf, fc, band.Max, fmt.Sprintf("%s %s and %s feedback", what,
			figure.Format(cin, figure.Farad, figure.Text), figure.Format(cf, figure.Farad, figure.Text)))
	}
}

// controlGain is |V(output)/V(control)| of dev at f in circuit: the gain
// the Miller effect multiplies. Where the circuit has a declared input that
// reaches the control electrode, it is the ratio of the two electrodes'
// voltages with the set driven from there, as the valve works (a push-pull
// half driven in antiphase with its partner, inside any overall feedback);
// else the control electrode is driven itself, its stopper out.
func (x *figCtx) controlGain(dev, stopper *graph.Part, f float64) (a float64, from string, ok bool) {
	if !x.solve || !(f > 0) {
		return 0, "", false
	}
	var ctl, out string
	for _, pin := range dev.Pins {
		switch graph.RoleOfPin(dev.Kind, pin.Name) {
		case graph.RoleControl:
			ctl = pin.Net
		case graph.RoleOutput:
			out = pin.Net
		}
	}
	if ctl == "" || out == "" {
		return 0, "", false
	}
	if a, in, ok := x.workingRatio(ctl, out, f); ok {
		return a, "with the set driven from " + in, true
	}
	a, ok = transferMag(without(x.solverCircuit(), stopper.Ref), ctl, out, f)
	return a, "with " + stopper.Ref + " out", ok
}

// workingRatio is |V(out)/V(ctl)| with the circuit driven from its first
// declared input, and that input's net; not ok where the input does not
// reach ctl.
func (x *figCtx) workingRatio(ctl, out string, f float64) (float64, string, bool) {
	c := x.solverCircuit()
	if len(c.Inputs) == 0 || c.Inputs[0] == ctl {
		return 0, "", false
	}
	in := c.Inputs[0]
	hc, ok1 := transferComplex(c, in, ctl, f)
	ho, ok2 := transferComplex(c, in, out, f)
	if !ok1 || !ok2 || cmplx.Abs(hc) < 1e-9*cmplx.Abs(ho) || cmplx.Abs(hc) == 0 {
		return 0, "", false
	}
	return cmplx.Abs(ho / hc), in, true
}

// transferMag is |V(out)/V(in)| at f with in driven.
func transferMag(c *graph.Circuit, in, out string, f float64) (float64, bool) {
	h, ok := transferComplex(c, in, out, f)
	return cmplx.Abs(h), ok
}

// transferComplex is V(out)/V(in) at f with in driven.
func transferComplex(c *graph.Circuit, in, out string, f float64) (complex128, bool) {
	resp, err := ac.NewTransfer(c, in, out, gangMid.options())
	if err != nil {
		return 0, false
	}
	v, err := resp.At(f)
	if err != nil || cmplx.IsNaN(v) || cmplx.IsInf(v) {
		return 0, false
	}
	return v, true
}
