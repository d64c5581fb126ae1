package stages

import (
	"fmt"
	"math"
	"math/cmplx"

	"pare/graph"
	"pare/graph/ac"
	"pare/graph/figure"
)

// A tuned amplifier into a transformer tuned on both sides hands the next
// stage the secondary's voltage, not the primary's: near critical coupling
// the primary's voltage has two humps either side of the pass-band, the
// secondary's one flat top at its centre. So the stage's gain is its
// transfer to the secondary at the peak, and the load's tuned frequency is
// where that peak lies.
var byPairGain = figure.ByFormula("|A| = gm·√(Rd1·Rd2)·X/(1 + X²), X = k·√(Q1·Q2), Rd1 and Q1 the primary's own with the output resistance across it, Rd2 and Q2 the secondary's own (double-tuned transformer at its centre, handbook formula)")

// tunedSecondaryGain puts the gain to the tuned secondary (the figure's
// secondary net, its tuning capacitors other_caps bound) and moves the
// load's tuned frequency to that gain's peak; false when the stage has no
// tuned secondary or the solver cannot reach it, and the primary's gain
// stands. gm, rdn2 (the primary's Rd·n²), rOut and f0 (the primary's
// formula resonance) are calcTunedGain's.
func (x *figCtx) tunedSecondaryGain(p *graph.Part, gm, rdn2, rOut, f0 float64) bool {
	nets := x.spec.Args["secondary"]
	if !x.solve || len(nets) == 0 || len(x.parts("other_caps")) == 0 {
		return false
	}
	sec := x.st.nets[nets[0]]
	in, _ := x.gainNets("control")
	c := x.solverCircuit()
	if sec == "" || in == "" || c.Net(sec) == nil || c.Net(in) == nil {
		return false
	}
	r, err := ac.NewTransfer(c, in, sec, gangMid.options())
	if err != nil {
		return false
	}
	f, _, ok := peakOf(r, f0/tankSearch, f0*tankSearch)
	if !ok {
		return false
	}
	h, err := r.At(f)
	if err != nil || cmplx.IsNaN(h) || cmplx.IsInf(h) {
		return false
	}
	at := hz(f) + ", " + gangMid.at
	sv := &figure.Figure{Name: "gain", Unit: figure.Ratio, Value: cmplx.Abs(h),
		Origin: figure.BySolver("peak of |V("+sec+")/V("+in+")|, the tuned secondary the next stage takes", at)}
	var check *figure.Figure
	if a, ok := x.pairFormula(gm, rdn2, rOut, f0); ok {
		check = &figure.Figure{Name: "gain", Unit: figure.Ratio, Value: a, Origin: byPairGain}
	}
	x.putChecked(sv, check, func() string {
		return "the formula takes each winding's own Q and the coupling as captured; in circuit what the secondary feeds and the strays load the pair"
	})
	x.anodeGain(c, in, r, f, at)
	x.bandEndGains(c, in, sec, "the tuned secondary the next stage takes")
	old, _ := x.get("load_f")
	lf := figure.Figure{Name: "load_f", Unit: figure.Hertz, Value: f,
		Origin: figure.BySolver(fmt.Sprintf("peak of |V(%s)/V(%s)|: the transformer's pass-band centre", sec, in), at)}
	x.putChecked(&lf, old.Check, nil)
	return true
}

// anodeGain puts the gain to the device's own output electrode at the
// secondary's peak f beside the gain to the secondary: the two differ by
// the transformer's step, and a gain that a repairer measures at the anode
// (or collector) must not be read off the secondary's (review 12's IF
// strip: 144 to the detector winding, 202 at the anode).
func (x *figCtx) anodeGain(c *graph.Circuit, in string, _ *ac.Response, f float64, at string) {
	out := x.deviceNet("output")
	if out == "" || c.Net(out) == nil {
		return
	}
	r, err := ac.NewTransfer(c, in, out, gangMid.options())
	if err != nil {
		return
	}
	h, err := r.At(f)
	if err != nil || cmplx.IsNaN(h) || cmplx.IsInf(h) {
		return
	}
	dev := x.part("device")
	if dev == nil {
		return
	}
	name := map[graph.Kind]string{graph.Valve: "gain_anode", graph.BJT: "gain_collector", graph.FET: "gain_drain"}[dev.Kind]
	if name == "" {
		return
	}
	x.put(figure.Figure{Name: name, Unit: figure.Ratio, Value: cmplx.Abs(h),
		Origin: figure.BySolver("|V("+out+")/V("+in+")| at the secondary's peak, the device's own output electrode", at)})
}

// deviceNet is the circuit net of the figure's device's terminal of role
// key ("control", "common", "output"), "" when it has none.
func (x *figCtx) deviceNet(key string) string {
	i := x.index(x.spec.Args["device"][0])
	if i < 0 {
		return ""
	}
	for _, pin := range x.m.v.parts[i].pp.Pins {
		if pin.Key == key {
			return x.st.nets[pin.Net]
		}
	}
	return ""
}

// pairFormula is byPairGain's value: the primary winding's and the
// secondary's own Q (the part's q where a winding has none) and inductance
// from the coil, the coupling between them.
func (x *figCtx) pairFormula(gm, rdn2, rOut, f0 float64) (float64, bool) {
	p := x.part("coil")
	if p == nil || len(p.Windings) < 2 || gm <= 0 || !(f0 > 0) {
		return 0, false
	}
	w1, w2 := p.Windings[0], p.Windings[len(p.Windings)-1]
	q1, q2 := w1.Q, w2.Q
	if q, ok := p.Param("q"); ok {
		q1, q2 = orElse(q1, q), orElse(q2, q)
	}
	k := p.K(w1.Name, w2.Name)
	if q1 <= 0 || q2 <= 0 || k <= 0 {
		return 0, false
	}
	w := 2 * math.Pi * f0
	rd1 := parallel(rdn2, rOut)
	q1e := rd1 / (w * w1.L)
	rd2 := q2 * w * w2.L
	xk := k * math.Sqrt(q1e*q2)
	return gm * math.Sqrt(rd1*rd2) * xk / (1 + xk*xk), true
}

func orElse(v, def float64) float64 {
	if v > 0 {
		return v
	}
	return def
}
