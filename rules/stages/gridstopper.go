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
// circuit at the top of the band, the electrode held by the source and the
// stopper itself taken out: left in, the stopper would carry the held
// grid's signal back into the driver (a cathodyne's low cathode, the other
// half of a push-pull pair through the splitter), and the figure would
// count that as the valve's gain. The solver has no interelectrode
// capacitances, so Cin0 and Cf are the typical ones below and the corner
// is a check value, said to rest on them.
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
	if a, ok := x.controlGain(dev, r, band.Max); ok {
		gain = a
		x.set("gain_miller", figure.Ratio, a, figure.BySolver("|V(output)/V(control)| of "+dev.Ref+" with "+r.Ref+" out", hz(band.Max)))
	}
	c := cin + (1+gain)*cf
	fc := 1 / (2 * math.Pi * r.Value.Max * c)
	x.set("c_in", figure.Farad, c, byMiller)
	x.set("f_c", figure.Hertz, fc, byMiller)
	x.st.Notes = append(x.st.Notes, fmt.Sprintf("input capacitance assumed from %s %s and %s feedback (the solver has no interelectrode capacitances): a check value",
		what, figure.Format(cin, figure.Farad, figure.Text), figure.Format(cf, figure.Farad, figure.Text)))
	if band.Max > 0 && fc < 10*band.Max {
		x.flag("%s with %s's input capacitance makes a corner at %s, within ten times the band's top %s: it cuts the signal, not only parasitics",
			r.Ref, dev.Ref, hz(fc), hz(band.Max))
	}
}

// controlGain is |V(output)/V(control)| of dev at f in circuit, the
// control electrode driven and its stopper out: the gain the Miller effect
// multiplies.
func (x *figCtx) controlGain(dev, stopper *graph.Part, f float64) (float64, bool) {
	if !x.solve || !(f > 0) {
		return 0, false
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
		return 0, false
	}
	resp, err := ac.NewTransfer(without(x.solverCircuit(), stopper.Ref), ctl, out, gangMid.options())
	if err != nil {
		return 0, false
	}
	v, err := resp.At(f)
	if err != nil || cmplx.IsNaN(v) {
		return 0, false
	}
	return cmplx.Abs(v), true
}
