package stages

import (
	"fmt"
	"math"

	"pare/graph"
	"pare/graph/ac"
	"pare/graph/figure"
)

// cornerSpan is how far above a formula's corner the solver looks for the
// pass band's level (the most of |H| there), and below it for the −3 dB
// point: three decades either way hold any corner a formula can miss by
// loading (common practice, no source).
const cornerSpan = 1000

// highPassCorner is where V(out)/V(in) falls 3 dB below its pass band
// level, the level the most of |H| between guess and guess·cornerSpan,
// the −3 dB point searched down to guess/cornerSpan; in is driven by an
// ideal 1 V source in the solver's circuit c. ok is false where the
// solver fails or there is no such point.
func highPassCorner(c *graph.Circuit, in, out string, guess float64) (float64, bool) {
	r, err := ac.NewTransfer(c, in, out, gangMid.options())
	if err != nil {
		return 0, false
	}
	top, level := 0.0, 0.0
	for i := 0; i <= 12; i++ {
		f := guess * math.Pow(cornerSpan, float64(i)/12)
		if m := magnitude(r, f); m > level {
			top, level = f, m
		}
	}
	if level == 0 {
		return 0, false
	}
	return crossing(r, level/math.Sqrt2, top, guess/cornerSpan)
}

// couplingCorner writes a coupling capacitor's corner as the solver gives
// it in circuit: the −3 dB point of V(down)/V(up) with everything beyond
// the capacitor connected (the next device's input resistance, rπ, in
// parallel with its bias resistors), the formula 1/(2πRC) on the
// resistors to AC ground beside it.
func (x *figCtx) couplingCorner(p *graph.Part, up, down int, r, c float64) {
	fc := 1 / (2 * math.Pi * r * c)
	check := figure.Figure{Name: "f_c", Unit: figure.Hertz, Value: fc, Origin: byCorner}
	upNet, downNet := x.netName(up), x.netName(down)
	if !x.solve || upNet == "" || downNet == "" {
		x.put(check)
		return
	}
	f, ok := highPassCorner(x.solverCircuit(), upNet, downNet, fc)
	if !ok {
		x.put(check)
		return
	}
	sv := &figure.Figure{Name: "f_c", Unit: figure.Hertz, Value: f,
		Origin: figure.BySolver("−3 dB of V("+downNet+")/V("+upNet+")", gangMid.at)}
	why := func() string {
		load := 1 / (2 * math.Pi * f * c)
		beyond := loadingWhy(load, r, x.devicesOn(down))
		return fmt.Sprintf("in circuit %s works into about %s, not the %s of resistors to AC ground the formula takes: %s",
			p.Ref, figure.Format(load, figure.Ohm, figure.Text), figure.Format(r, figure.Ohm, figure.Text), beyond)
	}
	x.putChecked(sv, &check, why)
	x.cornerTau(sv)
	// The resistance the capacitor works into, as the corner shows it:
	// R = 1/(2π·fc·C); the resistors to AC ground are its formula.
	rin := &figure.Figure{Name: "r_in", Unit: figure.Ohm, Value: 1 / (2 * math.Pi * f * c),
		Origin: figure.BySolver("1/(2π·fc·C), fc the −3 dB point of V("+downNet+")/V("+upNet+")", gangMid.at)}
	x.putChecked(rin, &figure.Figure{Name: "r_in", Unit: figure.Ohm, Value: r, Origin: byResistorsToGround}, sameLoading)
}

// loadingWhy words why a coupling capacitor works into load in circuit
// rather than the r of its resistors to AC ground, by the sign of the
// difference: a lower load is current drawn beyond the resistors (the
// next device's input); a higher one is those resistors' far ends
// following the signal (a grid leak returned to a cathode's bias foot, a
// bootstrap, feedback), which raises the resistance: a cathodyne's grid
// leak read as "the input draws current too" told a repairer the opposite
// of what the circuit does.
func loadingWhy(load, r float64, refs []string) string {
	if load > r {
		if len(refs) > 0 {
			return "the resistors' far ends follow the signal through " + figure.AndList(refs) + " (bootstrapping or feedback), which raises the resistance"
		}
		return "the resistors' far ends follow the signal (bootstrapping or feedback), which raises the resistance"
	}
	if len(refs) > 0 {
		return "the input of " + figure.AndList(refs) + " draws current too"
	}
	return "what lies beyond draws current too"
}

// cornerTau makes a stage's time constant the one its corner in circuit
// gives, τ = 1/(2π·fc), the solver's, with τ = RC of the parts alone
// beside it as its formula: a corner of the circuit printed beside a time
// constant of the parts alone contradicted it wherever what follows loads
// the network (a coupling capacitor into a transistor's input: fc 90.6 Hz
// beside τ 0.475 s, which is 0.34 Hz).
func (x *figCtx) cornerTau(fc *figure.Figure) {
	rc, ok := x.get("tau")
	if !ok || fc == nil || !(fc.Value > 0) {
		return
	}
	sv := &figure.Figure{Name: "tau", Unit: figure.Second, Value: 1 / (2 * math.Pi * fc.Value),
		Origin: figure.BySolver("1/(2π·fc), fc the in-circuit corner", fc.Origin.At)}
	check := rc
	if rc.Check != nil {
		check = *rc.Check // already solved once: keep the formula
	}
	x.putChecked(sv, &check, sameLoading)
}

// byResistorsToGround is the formula of a coupling capacitor's load: the
// resistors from its far side to AC ground, nothing beyond them.
var byResistorsToGround = figure.ByFormula("R = the resistors from its far side to AC ground")

// sameLoading is why a time constant or input resistance read from the
// corner parts from its formula: the reason given for the corner.
func sameLoading() string { return "the loading that moves f c" }

// devicesOn lists the amplifying parts with a pin on a folded net.
func (x *figCtx) devicesOn(net int) []string {
	var out []string
	for _, ci := range x.w.conns[net] {
		switch p := x.w.parts[ci]; p.Kind {
		case graph.Valve, graph.BJT, graph.FET:
			out = append(out, p.Ref)
		}
	}
	return out
}

// bypassAgreement is how close the gain with a common-electrode capacitor
// must come to the gain with a perfect bypass, at the stage's band, for
// the capacitor to be called a bypass: 5 % (common practice, no source:
// half a decibel, less than a listener or a meter on the bench tells).
const bypassAgreement = 0.05

// partlyBypassed is the plainer name of a stage whose common-electrode
// capacitor the solver shows is no bypass at the band.
const partlyBypassed = "Common-{common} amplifier, {common} resistor partly bypassed ({family})"

// weakBypass is the name of a stage whose capacitor across the whole
// common lead holds the middle of the band but not its low edge: the
// resistor is wholly bypassed, not partly, and the bypass falls off below
// its corner inside the band.
const weakBypass = "Common-{common} amplifier, {common} bypass weak at the band's low end ({family})"

// lowPassBand is where V(out)/V(in) falls 3 dB below its pass band
// level, the −3 dB point searched up to guess·cornerSpan. The pass band
// level is the most of |H| between guess/cornerSpan and guess, unless the
// response still climbs at the bottom of that span (passBand): a section
// whose load hangs from it through a coupling capacitor (a de-emphasis
// into the volume control) is unloaded only near DC, where that capacitor
// blocks; its pass band is the flat stretch between the two corners, with
// the load in place (review23 b03: 10 k and 4n7 into 47 k through 1 µ fall
// 3 dB at 4.113 kHz in the reviewer's ngspice deck, not at 1/(2πRC) =
// 3.386 kHz).
//
// The level is returned with the corner: |V(out)/V(in)| on the flat, what
// a load costs the section there.
func lowPassBand(c *graph.Circuit, in, out string, guess float64) (fc, level float64, ok bool) {
	r, err := ac.NewTransfer(c, in, out, gangMid.options())
	if err != nil {
		return 0, 0, false
	}
	const steps = 12
	fs := make([]float64, steps+1)
	ms := make([]float64, steps+1)
	top, level := 0.0, 0.0
	for i := range fs {
		fs[i] = guess / math.Pow(cornerSpan, float64(i)/steps)
		ms[i] = magnitude(r, fs[i])
		if ms[i] > level {
			top, level = fs[i], ms[i]
		}
	}
	if level == 0 {
		return 0, 0, false
	}
	if f, m, ok := passBand(fs, ms); ok {
		top, level = f, m
	}
	if f, m, ok := firstFlat(fs, ms); ok && level/m > liftedAbove {
		// the highest level is a lift far below the corner (a load
		// hung through a coupling capacitor comes off there, a blind
		// reviewer's 15 k and 3n3 into 250 k through 22 n): the corner
		// is read from the plateau the corner falls from
		top, level = f, m
	}
	fc, ok = crossing(r, level/math.Sqrt2, top, guess*cornerSpan)
	return fc, level, ok
}

// flatStep is the change in level, 0.05 dB, under which a step of the
// downward scan counts as flat; liftedAbove is the ratio (0.1 dB) by
// which the highest level must stand over that plateau to be a lift.
const (
	flatStep    = 1.00577
	liftedAbove = 1.0116
)

// firstFlat is the first step of the downward scan (fs, ms) whose level
// changes by less than flatStep: the plateau just below a low-pass
// corner, which a lift further down (a load coming off through its
// coupling capacitor) does not reach.
func firstFlat(fs, ms []float64) (f, m float64, ok bool) {
	for i := 0; i+1 < len(ms); i++ {
		if ms[i] > 0 && ms[i+1] > 0 && math.Max(ms[i]/ms[i+1], ms[i+1]/ms[i]) < flatStep {
			return fs[i+1], ms[i+1], true
		}
	}
	return 0, 0, false
}

// passBand is the flattest step of a scan downward in f (fs, ms): its
// upper point and level, ok only when that step is not the lowest, so the
// response climbs again below it (a series capacitor to the load taking
// the load off); a section flat to the bottom keeps its highest level.
func passBand(fs, ms []float64) (f, m float64, ok bool) {
	best, at := math.Inf(1), -1
	for i := 0; i+1 < len(ms); i++ {
		if !(ms[i] > 0) || !(ms[i+1] > 0) {
			return 0, 0, false
		}
		if d := math.Abs(math.Log(ms[i] / ms[i+1])); d < best {
			best, at = d, i
		}
	}
	if at < 0 || at+2 >= len(ms) {
		return 0, 0, false
	}
	return fs[at], ms[at], true
}

// rcNets are the nets of a series-shunt RC pair: the series part's free
// end (in) and the net the two share (out); the series part is the
// capacitor for a high-pass (coupling), the resistor for a low-pass.
// ok is false unless each is one two-terminal part sharing one net off
// ground.
func (x *figCtx) rcNets(series, shunt *graph.Part) (in, out int, ok bool) {
	si, hi := x.partIndex(series), x.partIndex(shunt)
	if si < 0 || hi < 0 || len(x.w.pins[si]) != 2 || len(x.w.pins[hi]) != 2 {
		return 0, 0, false
	}
	for k, id := range x.w.pins[si] {
		other := x.w.pins[si][1-k]
		if id != groundNet && other != groundNet && (x.w.pins[hi][0] == id || x.w.pins[hi][1] == id) {
			return other, id, true
		}
	}
	return 0, 0, false
}

// rcCorner writes an RC section's corner as the solver gives it in
// circuit, the section driven at its input by an ideal source and
// loaded by whatever follows, with fc = 1/(2πRC) beside it. highPass: the
// capacitor is in series (a coupling); else the resistor (a low-pass
// section, a pi filter's second half, de-emphasis).
func (x *figCtx) rcCorner(rp, cp *graph.Part, fc float64, highPass bool) {
	check := figure.Figure{Name: "f_c", Unit: figure.Hertz, Value: fc, Origin: byCorner}
	series, shunt := rp, cp
	if highPass {
		series, shunt = cp, rp
	}
	in, out, ok := x.rcNets(series, shunt)
	inNet, outNet := x.netName(in), x.netName(out)
	if !x.solve || !ok || inNet == "" || outNet == "" {
		x.put(check)
		return
	}
	var f, level float64
	if highPass {
		f, ok = highPassCorner(x.solverCircuit(), inNet, outNet, fc)
	} else {
		f, level, ok = lowPassBand(x.solverCircuit(), inNet, outNet, fc)
	}
	if !ok {
		x.put(check)
		return
	}
	sv := &figure.Figure{Name: "f_c", Unit: figure.Hertz, Value: f,
		Origin: figure.BySolver("−3 dB of V("+outNet+")/V("+inNet+")", gangMid.at)}
	why := func() string {
		return fmt.Sprintf("the formula takes %s and %s alone; in circuit what follows loads the section", rp.Ref, cp.Ref)
	}
	x.putChecked(sv, &check, why)
	if x.word("tau", "") == "network" {
		// τ names the network's design constant (a de-emphasis's 50 or
		// 75 µs): it stays RC, the loaded corner beside it is the
		// solver's, and so is what its load costs on the flat
		if level > 0 {
			x.set("pass_level", figure.Decibel, db(level), figure.BySolver("|V("+outNet+")/V("+inNet+")| on the flat below the corner", gangMid.at))
		}
		return
	}
	x.cornerTau(sv)
}

// holdsAtGround tells whether an RC section is no low-pass the signal
// passes through: another part joins the resistor's two ends (a winding
// across it: the resistor is that winding's load and the capacitor holds
// the winding's cold end at AC ground, the signal never runs through the
// resistor into the capacitor). A name implying behaviour is confirmed by
// behaviour:
// review16 b02's "RC low-pass section C7 R5" (3.288 kHz in a MW stage,
// 525 kHz up) was the link winding's load R5 and the mixer's bias
// decoupler C7.
func (x *figCtx) holdsAtGround(rs, cs []*graph.Part) bool {
	if len(rs) != 1 || len(cs) != 1 {
		return false
	}
	in, out, ok := x.rcNets(rs[0], cs[0])
	if !ok {
		return false
	}
	ri, cj := x.partIndex(rs[0]), x.partIndex(cs[0])
	for _, ci := range x.w.conns[in] {
		if ci != ri && ci != cj && x.w.joins(ci, in, out) {
			return true
		}
	}
	return false
}
