package stages

import (
	"fmt"
	"math"
	"math/cmplx"

	"pare/graph"
	"pare/graph/ac"
	"pare/graph/figure"
)

// screenFeedFigures writes a screen feed's figures: the DC drop across the
// dropper at the operating point, and, at the fed stage's lowest
// frequency, the screen's impedance to where its bypass returns (chassis,
// or the valve's own cathode) in circuit with and without its bypass (the
// solver's), the bypass's own reactance 1/(2πfC) as the check. A bypass
// returned to the cathode holds the screen at the cathode's AC potential,
// not at chassis: its job is read between screen and cathode.
func (x *figCtx) screenFeedFigures(s *graph.Part, c2 []*graph.Part, in, out int, dev *graph.Part) {
	inName, outName := x.netName(in), x.netName(out)
	if op := x.dcPoint(); op != nil {
		vi, ok1 := op.Volts(inName)
		vo, ok2 := op.Volts(outName)
		if ok1 && ok2 {
			x.set("screen_drop", figure.Volt, vi-vo, figure.BySolver("V("+inName+") − V("+outName+") at the", "DC operating point"))
			x.set("screen_v", figure.Volt, vo, figure.BySolver("V("+outName+") at the", "DC operating point"))
		}
	}
	f := x.w.c.BandOf(dev).Min
	if !(f > 0) {
		return
	}
	x.set("f_feed", figure.Hertz, f, byFeedBandLow)
	ret := x.bypassReturn(c2, out)
	name, to, where := "z_screen", "", "chassis"
	if ret != "" {
		name, to, where = "z_screen_k", ret, dev.Ref+"'s cathode"
	}
	c := x.solverCircuit()
	bare := c
	for _, p := range c2 {
		bare = without(bare, p.Ref)
	}
	zb, okB := impedanceBetween(bare, outName, to, f)
	z, ok := impedanceBetween(c, outName, to, f)
	if !okB || !ok {
		x.st.Notes = append(x.st.Notes, "the solver could not take the screen's impedance at "+hz(f))
		return
	}
	what := "|Z(" + outName + ")|"
	if to != "" {
		what = "|Z(" + outName + " to " + to + ")|"
	}
	x.set(name+"_unbypassed", figure.Ohm, cmplx.Abs(zb), figure.BySolver(what+" without the bypass", hz(f)))
	xc := 1 / (2 * math.Pi * f * sumCap(c2, 1))
	sv := &figure.Figure{Name: name, Unit: figure.Ohm, Value: cmplx.Abs(z), Origin: figure.BySolver(what, hz(f))}
	check := &figure.Figure{Name: name, Unit: figure.Ohm, Value: xc, Origin: byReactanceC}
	x.putChecked(sv, check, func() string {
		return fmt.Sprintf("the formula takes the bypass alone; in circuit %s and the screen lie across it", s.Ref)
	})
	share := cmplx.Abs(z) / cmplx.Abs(zb)
	zs, zbs := figure.Format(cmplx.Abs(z), figure.Ohm, figure.Text), figure.Format(cmplx.Abs(zb), figure.Ohm, figure.Text)
	if share <= screenBypassMax {
		held := "AC ground"
		if ret != "" {
			held = "its cathode's AC potential"
		}
		x.st.Notes = append(x.st.Notes, fmt.Sprintf("the bypass holds %s's screen at %s at %s: %s to %s in circuit against %s without it",
			dev.Ref, held, hz(f), zs, where, zbs))
		return
	}
	x.flag("screen bypass of %s is not effective at %s: the screen sees %s to %s in circuit, %.0f %% of the %s without it",
		dev.Ref, hz(f), zs, where, 100*share, zbs)
}

// bypassReturn is the net a screen bypass returns to when that is not
// chassis (the valve's cathode: screen-feed-cathode-return.toml), "" when
// it returns to chassis.
func (x *figCtx) bypassReturn(c2 []*graph.Part, out int) string {
	for _, p := range c2 {
		ci := x.partIndex(p)
		if ci < 0 {
			continue
		}
		for _, id := range x.w.pins[ci] {
			if id != out && id != groundNet {
				return x.netName(id)
			}
		}
	}
	return ""
}

// impedanceBetween is the impedance the circuit presents between nets a
// and b at f (b "" for chassis): a floating 1 A driven into a and out of
// b, V(a) − V(b) = Zaa − Zab − Zba + Zbb by superposition of the solver's
// transimpedances (circuit theory, any linear network).
func impedanceBetween(c *graph.Circuit, a, b string, f float64) (complex128, bool) {
	if b == "" {
		return impedanceAt(c, a, f)
	}
	var z [4]complex128
	for i, pr := range [][2]string{{a, a}, {b, a}, {a, b}, {b, b}} {
		r, err := ac.NewTransimpedance(c, pr[0], pr[1], gangMid.options())
		if err != nil {
			return 0, false
		}
		if z[i], err = r.At(f); err != nil || cmplx.IsNaN(z[i]) || cmplx.IsInf(z[i]) {
			return 0, false
		}
	}
	d := z[0] - z[1] - z[2] + z[3]
	return d, d != 0
}
