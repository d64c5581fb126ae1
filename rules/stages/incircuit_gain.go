package stages

import (
	"fmt"
	"math"
	"math/cmplx"
	"strings"

	"pare/graph"
	"pare/graph/ac"
	model "pare/graph/device"
	"pare/graph/figure"
)

// gainWhy words why a textbook gain parts from the solver's in circuit
// (sv), each reason checked on the circuit, not guessed: a reason is
// named only where the formula, re-evaluated with that effect put in,
// comes nearer the solver. The effects: the load the output sees in
// circuit (the rest of the circuit with its devices working, the stage's
// own device taken out; for a follower the load on its common electrode),
// an output resistance the formula leaves out (ro from VA/Ic), and a
// common electrode that is not at AC ground at the frequency solved (a
// capacitor that is no full bypass there). Where none is found the text
// names no cause.
func (x *figCtx) gainWhy(p *graph.Part, form string, d device, rl, rk float64, out string, f, sv float64) string {
	var why []string
	full, err := model.Of(p)
	if err != nil {
		return ""
	}
	a0, _ := gainFormula(d, form, rl, rk)
	nearer := func(a float64) bool { return math.Abs(a-sv) < math.Abs(a0-sv)-1e-9*math.Abs(sv) }
	if z, ok := impedanceAt(without(x.solverCircuit(), p.Ref), out, f); ok {
		load, formulaLoad, a := cmplx.Abs(z), rl, 0.0
		if form == "follower" {
			formulaLoad = rk
			a, _ = gainFormula(d, form, rl, load)
		} else {
			a, _ = gainFormula(d, form, load, rk)
		}
		if figure.Differs(load, formulaLoad) && nearer(a) {
			why = append(why, fmt.Sprintf("the output works into %s in circuit, not the %s of resistors to AC ground the formula takes",
				figure.Format(load, figure.Ohm, figure.Text), figure.Format(formulaLoad, figure.Ohm, figure.Text)))
		}
	}
	if d.kind != graph.Valve && d.rOut == 0 && full.ROut > 0 && !math.IsInf(full.ROut, 1) {
		dr := d
		dr.rOut = full.ROut
		if a, _ := gainFormula(dr, form, rl, rk); nearer(a) {
			why = append(why, fmt.Sprintf("the solver's ro of %s (from the default Early voltage) the formula leaves out",
				figure.Format(full.ROut, figure.Ohm, figure.Text)))
		}
	}
	if form == "common" {
		if k := x.commonNet(); k != "" {
			if z, ok := impedanceAt(quiet(x.solverCircuit()), k, f); ok && cmplx.Abs(z) > figure.CheckAgreement*full.ZCommon(rl) {
				why = append(why, fmt.Sprintf("the %s is not at AC ground at %s: it sees %s, no full bypass",
					electrodeWord(p), hz(f), figure.Format(cmplx.Abs(z), figure.Ohm, figure.Text)))
			}
		}
	}
	if len(why) == 0 {
		return noCause
	}
	return strings.Join(why, "; ")
}

// noCause is the why of a difference no checked effect explains: it
// names no cause, since a guessed one (feedback, say) misleads a repairer.
const noCause = "the solver takes the whole circuit round the stage, which the formula does not model; no single effect pare checks (the load, ro, the bypass) accounts for it"

// outputWord is the output electrode's name for a device.
func outputWord(p *graph.Part) string {
	switch p.Kind {
	case graph.BJT:
		return "collector"
	case graph.FET:
		return "drain"
	}
	return "anode"
}

// electrodeWord is the common electrode's name for a device.
func electrodeWord(p *graph.Part) string {
	switch p.Kind {
	case graph.BJT:
		return "emitter"
	case graph.FET:
		return "source"
	}
	return "cathode"
}

// commonNet is the circuit net of the stage device's common electrode, ""
// when it is at AC ground or the pattern has no such pin.
func (x *figCtx) commonNet() string {
	args := x.spec.Args["device"]
	if len(args) == 0 {
		return ""
	}
	i := x.index(args[0])
	if i < 0 {
		return ""
	}
	for _, pin := range x.m.v.parts[i].pp.Pins {
		if pin.Key == "common" {
			name := x.st.nets[pin.Net]
			if id, ok := x.w.netID[name]; ok && id != groundNet {
				return name
			}
		}
	}
	return ""
}

// impedanceAt is the driving-point impedance of a net at f, gang at mid
// travel; ok is false where the solver cannot give it.
func impedanceAt(c *graph.Circuit, net string, f float64) (complex128, bool) {
	r, err := ac.NewTransimpedance(c, net, net, gangMid.options())
	if err != nil {
		return 0, false
	}
	z, err := r.At(f)
	if err != nil || cmplx.IsNaN(z) || cmplx.IsInf(z) || z == 0 {
		return 0, false
	}
	return z, true
}

// gainNets are the nets a stage's gain is read between: the control
// electrode's (the common one's for a grid-driven stage) and the load net
// (the common electrode's for a follower).
func (x *figCtx) gainNets(form string) (in, out string) {
	i := x.index(x.spec.Args["device"][0])
	if i < 0 {
		return "", ""
	}
	for _, pin := range x.m.v.parts[i].pp.Pins {
		switch pin.Key {
		case "control":
			in = x.st.nets[pin.Net]
		case "common":
			if form == "follower" {
				out = x.st.nets[pin.Net]
			}
			if form == "grid" {
				in = x.st.nets[pin.Net]
			}
		}
	}
	if nets := x.spec.Args["load_net"]; len(nets) > 0 {
		out = x.st.nets[nets[0]]
	}
	return in, out
}

// solveGain is the stage's gain as the solver gives it in circuit: the
// whole reduced circuit (solverCircuit), the stage's input net driven with
// 1 V at the middle of the device's band (geometric mean of its edges),
// the output read where the next stage loads it, gang at mid travel. why
// words a difference from the formula (gainWhy). nil when the nets or the
// band are not known or the solver fails.
func (x *figCtx) solveGain(p *graph.Part, form string, d device, rl, rk float64) (*figure.Figure, func() string) {
	in, out := x.gainNets(form)
	c := x.solverCircuit()
	band := x.w.c.BandOf(p)
	if !x.solve || in == "" || out == "" || c.Net(in) == nil || c.Net(out) == nil || band.Min <= 0 || band.Max <= 0 {
		return nil, nil
	}
	f := math.Sqrt(band.Min * band.Max)
	r, err := ac.NewTransfer(c, in, out, gangMid.options())
	if err != nil {
		return nil, nil
	}
	h, err := r.At(f)
	if err != nil || cmplx.IsNaN(h) || cmplx.IsInf(h) {
		return nil, nil
	}
	g := cmplx.Abs(h)
	if real(h) < 0 {
		g = -g
	}
	sv := &figure.Figure{Name: "gain", Unit: figure.Ratio, Value: g,
		Origin: figure.BySolver("V("+out+")/V("+in+")", hz(f)+", "+gangMid.at)}
	return sv, func() string { return x.gainWhy(p, form, d, rl, rk, out, f, g) }
}

// solveTunedGain is a tuned stage's gain as the solver gives it in
// circuit: the peak of V(output)/V(control) near the load's in-circuit
// resonance, with everything the tuned winding feeds connected. The
// formula beside it takes the tank's own dynamic resistance (rdn2: Rd·n²)
// and the device's output resistance rOut alone; why says what the output
// works into at the peak in circuit instead.
func (x *figCtx) solveTunedGain(p *graph.Part, rdn2, rOut float64) (*figure.Figure, func() string) {
	in, out := "", ""
	i := x.index(x.spec.Args["device"][0])
	if i < 0 || !x.solve {
		return nil, nil
	}
	for _, pin := range x.m.v.parts[i].pp.Pins {
		switch pin.Key {
		case "control":
			in = x.st.nets[pin.Net]
		case "output":
			out = x.st.nets[pin.Net]
		}
	}
	f0, ok := x.st.Figures.Lookup("load_f_hz")
	if !ok {
		// a load the gang tunes: its peak at mid travel, where the
		// formula's capacitance is taken too
		f0, ok = x.tankAt(gangMid)
	}
	c := x.solverCircuit()
	if !ok || in == "" || out == "" || c.Net(in) == nil || c.Net(out) == nil {
		return nil, nil
	}
	r, err := ac.NewTransfer(c, in, out, gangMid.options())
	if err != nil {
		return nil, nil
	}
	f, _, ok := peakOf(r, f0/tankSearch, f0*tankSearch)
	if !ok {
		return nil, nil
	}
	h, err := r.At(f)
	if err != nil {
		return nil, nil
	}
	g := cmplx.Abs(h)
	if real(h) < 0 {
		g = -g
	}
	sv := &figure.Figure{Name: "gain", Unit: figure.Ratio, Value: g,
		Origin: figure.BySolver("peak of V("+out+")/V("+in+")", hz(f)+", "+gangMid.at)}
	x.gainAtIF(r, f, g)
	x.bandEndGains(c, in, out, "the device's own output electrode")
	why := func() string {
		z, ok := impedanceAt(quiet(c), out, f)
		if !ok {
			return ""
		}
		what := outputWord(p) + " output resistance"
		if rOut == 0 {
			what = "no " + what + " (none given)"
		}
		return fmt.Sprintf("at its peak the output works into %s in circuit, not the %s the formula takes from the tank's own Q, the tap's share of the turns and %s: the windings' coupling and what the tuned winding feeds set it",
			figure.Format(cmplx.Abs(z), figure.Ohm, figure.Text), figure.Format(parallel(rdn2, rOut), figure.Ohm, figure.Text), what)
	}
	return sv, why
}

// without is c less one part: what the rest of the circuit presents to
// that part's terminals.
func without(c *graph.Circuit, ref string) *graph.Circuit {
	out := withPart(c, &graph.Part{})
	out.Parts = nil
	for _, p := range c.Parts {
		if p.Ref != ref {
			out.Parts = append(out.Parts, p)
		}
	}
	return out
}

// tankAt is the in-circuit resonance of the stage's last solved tank at
// gang setting g, if it was solved there.
func (x *figCtx) tankAt(g gang) (float64, bool) {
	if !x.tankOK {
		return 0, false
	}
	for i, tg := range x.tank.gs {
		if tg.frac == g.frac && i < len(x.tank.f) {
			return x.tank.f[i], true
		}
	}
	return 0, false
}

// offPeakGain is how far a stage's gain at the IF may fall below its gain
// at its load's own peak before the note gives both: 2 % (common practice,
// no source: the figures are printed to three digits, and a reader
// comparing with a measurement at the IF reads the difference as an error).
const offPeakGain = 0.02

// gainAtIF says, for a fixed-tuned stage working at the set's IF whose load
// peaks off it in circuit, that the gain figure is the peak's and what the
// stage gives at the IF itself as captured (review20 b05: T5 peaks at
// 458.2 kHz with the detector's low rd across its secondary, gain −211
// there and −196 at 455 kHz, where the reviewer's deck read it).
func (x *figCtx) gainAtIF(r *ac.Response, peak, g float64) {
	fIF := x.w.c.Freqs["if"]
	if _, fixed := x.st.Figures.Lookup("load_f_hz"); !fixed || !(fIF > 0) || math.Abs(peak-fIF) > ifRoleTol*fIF {
		return
	}
	h, err := r.At(fIF)
	if err != nil {
		return
	}
	gi := cmplx.Abs(h)
	if real(h) < 0 {
		gi = -gi
	}
	if math.Abs(gi) >= (1-offPeakGain)*math.Abs(g) {
		return
	}
	side := "above"
	if peak < fIF {
		side = "below"
	}
	why := ""
	if lf, ok := x.st.Figures.Get("load_f"); ok && lf.Check != nil && lf.Check.Value > 0 {
		own := lf.Check.Value
		if math.Abs(own-fIF) <= ownAtIF*fIF {
			why = fmt.Sprintf(": the tank's own parts tune it to %s, and what the tuned winding feeds moves the peak", hz(own))
		} else {
			why = fmt.Sprintf(": the tank's own parts tune it to %s", hz(own))
		}
	}
	x.st.Notes = append(x.st.Notes, fmt.Sprintf("the gain %s is its peak at %s in circuit, %.1f %% %s the %s IF%s; at the IF itself the gain is %s as captured",
		figure.Format(g, figure.Ratio, figure.Text), hz(peak), 100*math.Abs(peak-fIF)/fIF, side, hz(fIF), why, figure.Format(gi, figure.Ratio, figure.Text)))
}

// ownAtIF is how near the IF a tank's own resonance (its formula) stands
// for the tank to count as tuned to it, so that a peak off the IF in
// circuit is what its loads do: 0.2 % (common practice, no source: the
// tuning capacitor's own tolerance is 2 %, so a capture with a can at the
// IF states it to about that).
const ownAtIF = 0.002
