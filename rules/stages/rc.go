package stages

import (
	"fmt"
	"math"
	"strings"

	"pare/graph"
	"pare/graph/ac"
	"pare/graph/figure"
)

// The formulas of RC networks and filters, by the names a figure's origin
// gives them (docs/references.md §4; handbook formulas, from memory where
// the calc says so).
var (
	byTau        = figure.ByFormula("τ = RC")
	byCorner     = figure.ByFormula("fc = 1/(2πRC)")
	byPhaseShift = figure.ByFormula("f = 1/(2πRC√6)")
	byPhaseGain  = figure.ByFormula("A ≥ 29")
	byWien       = figure.ByFormula("f = 1/(2π√(R1R2C1C2))")
	byWienGain   = figure.ByFormula("A ≥ 1 + R1/R2 + C2/C1")
	byLoadR      = figure.BySolver("resistance to AC ground, nodal analysis", "")
	byLoadDC     = figure.BySolver("DC load through the set's DC paths, nodal analysis (the solver's detector takes rd = Rdc/2)", "")
	byACDC       = figure.ByFormula("m ≈ Rac/Rdc")
)

// calcRC: τ = RC and the corner fc = 1/(2πRC) (docs/references.md §4). use =
// "agc" or "detector" adds the checks a repairer makes on those.
func calcRC(x *figCtx) {
	r := parallelR(x.parts("r"))
	c := sumCap(x.parts("c"), 1)
	use := x.word("use", "")
	if use == "detector" {
		x.dropLineFeeds(x.parts("r"))
		r = x.detectorLoad(r)
	}
	if r <= 0 || c <= 0 {
		return
	}
	if use == "section" && x.backwards(x.parts("r"), x.parts("c")) {
		return // the capacitor is the previous section's: no figures, the guard drops the match
	}
	if use == "section" && x.holdsAtGround(x.parts("r"), x.parts("c")) {
		return // no low-pass in the signal path: a decoupler; the guard drops the match
	}
	if use == "coupling" && x.upstream(x.parts("r"), x.parts("c")) {
		return // the resistor is the source's (an anode load, a source resistor): no figures, the guard drops the match
	}
	if use == "agc" && !x.agcConfirmed(x.parts("r"), x.parts("c")) {
		return // no detector feeds it or no grid or base return takes the line: no figures, the guard drops the match
	}
	tau := r * c
	fc := 1 / (2 * math.Pi * tau)
	x.set("tau", figure.Second, tau, byTau)
	if use == "section" {
		if loads := x.loadsBeyond(x.parts("c")); len(loads) > 0 {
			// 1/(2πRC) holds only for a section into an open circuit; the
			// next section draws current from C, so the true −3 dB point
			// is lower. Say so rather than print a corner that is not there.
			x.set("f_c_unloaded", figure.Hertz, fc, byCorner)
			verb := "loads"
			if len(loads) > 1 {
				verb = "load"
			}
			x.st.Notes = append(x.st.Notes, fmt.Sprintf("corner figured unloaded: %s %s the section, so its real corner is lower",
				strings.Join(loads, ", "), verb))
			return
		}
	}
	switch rs, cs := x.parts("r"), x.parts("c"); {
	case len(rs) == 1 && len(cs) == 1 && (use == "coupling" || use == "section" || use == "" && x.spec.Prefix == ""):
		x.rcCorner(rs[0], cs[0], fc, use == "coupling")
	default:
		x.set("f_c", figure.Hertz, fc, byCorner)
	}
	switch use {
	case "agc":
		x.checkAGC(tau)
	case "detector":
		x.checkDetector(fc)
	}
}

// dropLineFeeds takes out of a detector's parts a resistor bound as its
// load whose grounded end is a declared bias line the reduction put at AC
// ground (the AGC line), not chassis: that resistor feeds the line, the
// AGC filter's (patterns/agc-line-filter.toml, on the original circuit,
// holds it), and it is no DC return of the detector, whose load figure
// (detectorLoad) never counts it either. A line that is only a bypassed
// signal net has no stage to take the resistor, so it stays.
func (x *figCtx) dropLineFeeds(rs []*graph.Part) {
	if x.w.orig == nil {
		return
	}
	var drop []*graph.Part
	for _, p := range rs {
		op := x.w.orig.c.Part(p.Ref)
		if op == nil {
			continue
		}
		for _, pin := range p.Pins {
			// grounded here, on a line in the circuit as drawn
			on := op.NetOf(pin.Name)
			if n := x.w.orig.c.Net(on); x.w.pinNet(x.partIndex(p), pin.Name) == groundNet && n != nil && n.Role == graph.Bias {
				drop = append(drop, p)
				break
			}
		}
	}
	if len(drop) > 0 {
		x.claimInstead(drop, nil)
	}
}

// detectorLoad is a diode detector's DC load, the one figure the note
// prints and the solver's detector model uses (rd = Rdc/2): the load kept
// from the circuit as written (ac.DetectorLoad), so a filter line grounded
// for the signal does not count as a DC return. Beside it the AC load, the
// resistance to AC ground at the detector's output in the reduced circuit
// (what the audio sees), and their ratio. It returns r when no diode or no
// load is found.
func (x *figCtx) detectorLoad(r float64) float64 {
	cs := x.parts("c")
	if len(cs) == 0 {
		return r
	}
	rdc := 0.0
	if i := x.index("D"); i >= 0 {
		if l := ac.DetectorLoad(x.w.c, x.w.parts[x.m.parts[i]]); l > 0 && !math.IsInf(l, 0) {
			rdc = l
		}
	}
	rac := 0.0
	for j := range cs[0].Pins {
		if id := x.w.pinNet(x.partIndex(cs[0]), cs[0].Pins[j].Name); id != groundNet {
			if v := resistanceToGround(x.w, id); v > 0 {
				rac = v
			}
		}
	}
	if nets := x.spec.Args["load_net"]; len(nets) > 0 {
		// the reservoir runs to a bypassed return, not chassis: the AC
		// load is what the load net sees, not the return's bias resistor
		if id, ok := x.w.netID[x.st.nets[nets[0]]]; ok && id != groundNet {
			rac = resistanceToGround(x.w, id)
		}
	}
	if rdc == 0 {
		rdc = rac
	}
	if rdc == 0 {
		return r
	}
	x.set("r_load", figure.Ohm, rdc, byLoadDC)
	if i := x.index("D"); i >= 0 {
		x.restDetector(x.w.parts[x.m.parts[i]], rdc)
	}
	if rac > 0 && rac < rdc*(1-1e-6) {
		x.set("r_load_ac", figure.Ohm, rac, byLoadR)
		x.checkClipping(rac / rdc)
	}
	return rdc
}

// clipDepth is the deepest modulation a detector should follow without
// clipping the troughs: broadcast programme peaks reach 80 % and more
// (common practice, no source).
const clipDepth = 0.8

// checkClipping: a detector whose audio load is below its DC load cuts the
// troughs of modulation deeper than about Rac/Rdc (common practice: the
// peak modulation depth a diode detector follows without clipping is about
// the ratio of its AC load to its DC load).
func (x *figCtx) checkClipping(ratio float64) {
	x.set("ac_dc_ratio", figure.Ratio, ratio, byACDC)
	if ratio < clipDepth {
		x.flag("AC/DC load ratio %.2f: modulation deeper than about %.0f %% is clipped (Rac/Rdc below %.0f %%)",
			ratio, 100*ratio, 100*clipDepth)
	}
}

// checkAGC: common practice, no source: an AGC line wants roughly
// 0.05–0.5 s, slow enough not to follow the lowest audio, quick enough to
// follow fading.
func (x *figCtx) checkAGC(tau float64) {
	text := figure.Format(tau, figure.Second, figure.Text)
	if tau < 0.02 {
		x.flag("AGC time constant %s is short: the AGC will follow low audio notes and distort them", text)
	}
	if tau > 1 {
		x.flag("AGC time constant %s is long: the set will be slow to follow fading and tuning", text)
	}
}

// checkDetector: common practice, no source: the load must pass the top
// audio (about 5 kHz for AM) yet hold the IF ripple. A corner below 3 kHz
// says how much of the top is cut, and what the load's time constant does
// to deep modulation there: it cannot discharge fast enough to follow the
// troughs of a tone at f deeper than m = 1/√(1 + (2πf·RC)²) (diagonal
// clipping, handbook formula from memory; 2πf·RC = f/fc), which is a
// different limit from the AC/DC load ratio's (checkClipping).
func (x *figCtx) checkDetector(fc float64) {
	if fc < 3e3 {
		m := 1 / math.Sqrt(1+math.Pow(audioTop/fc, 2))
		x.flag("detector load corner %s is below 3 kHz: the top of the audio is cut (%s down at %s), and a %s tone modulated deeper than %.0f %% is clipped diagonally (the load's RC cannot follow the troughs)",
			hz(fc), dbText(-10*math.Log10(1+math.Pow(audioTop/fc, 2))), hz(audioTop), hz(audioTop), 100*m)
	}
	if ifHz := x.w.c.Freqs["if"]; ifHz > 0 && fc > ifHz/5 {
		x.flag("detector load corner %s is close to the IF (%s): IF ripple reaches the audio", hz(fc), hz(ifHz))
	}
}

// audioTop is the highest audio an AM detector's load should pass (about
// 5 kHz; common practice, no source).
const audioTop = 5e3

// dbText writes a level change in dB to one decimal.
func dbText(db float64) string { return fmt.Sprintf("%.1f dB", math.Abs(db)) }

// calcPhaseShift: three equal RC sections give f = 1/(2πRC√6) and need a
// gain of 29 (handbook formula, from memory).
func calcPhaseShift(x *figCtx) {
	rs, cs := x.parts("r"), x.parts("c")
	if len(rs) == 0 || len(cs) == 0 {
		return
	}
	r, c := rs[0].Value.Max, cs[0].Value.Max
	for _, p := range rs {
		if math.Abs(p.Value.Max-r) > 0.05*r {
			x.flag("phase-shift sections are unequal: f uses %s and %s and is only a guide", rs[0].Ref, cs[0].Ref)
		}
	}
	for _, p := range cs {
		if math.Abs(p.Value.Max-c) > 0.05*c {
			x.flag("phase-shift sections are unequal: f uses %s and %s and is only a guide", rs[0].Ref, cs[0].Ref)
		}
	}
	x.set("f", figure.Hertz, 1/(2*math.Pi*r*c*math.Sqrt(6)), byPhaseShift)
	x.set("gain_min", figure.Ratio, 29, byPhaseGain)
}

// calcWien: f = 1/(2π√(R1R2C1C2)); with equal arms the loop needs a gain of
// 3 (handbook formula, from memory).
func calcWien(x *figCtx) {
	// The series arm's resistors add (one before the capacitor, one after:
	// the order within a series arm does not matter); the parallel arm's
	// resistors are in parallel.
	r1, c1, r2, c2 := seriesR(x.parts("r1")), sumCap(x.parts("c1"), 1), parallelR(x.parts("r2")), sumCap(x.parts("c2"), 1)
	if r1 <= 0 || r2 <= 0 || c1 <= 0 || c2 <= 0 {
		return
	}
	x.set("f", figure.Hertz, 1/(2*math.Pi*math.Sqrt(r1*r2*c1*c2)), byWien)
	x.set("gain_min", figure.Ratio, 1+r1/r2+c2/c1, byWienGain)
}

// calcCoupling: a series capacitor and the resistance it feeds, the
// resistive network from its far side to AC ground (the next grid leak or
// input resistance), make a high-pass: τ = RC, fc = 1/(2πRC)
// (docs/references.md §4). The far side is the one downstream in signal
// order; a capacitor into a tank or port alone has no corner.
func calcCoupling(x *figCtx) {
	p := x.part("c")
	if p == nil {
		return
	}
	c := p.Value.Max
	x.set("c", figure.Farad, c, byPartValue)
	ci := x.partIndex(p)
	if ci < 0 || len(x.w.pins[ci]) != 2 || c <= 0 {
		return
	}
	down, r, ok := x.downstream(ci)
	if !ok {
		return
	}
	x.couplingFigures(p, ci, down, r)
}

// couplingFigures sets a coupling capacitor's figures once its driven side
// (down, a pin index) and the resistance there (r) are known.
func (x *figCtx) couplingFigures(p *graph.Part, ci, down int, r float64) {
	c := p.Value.Max
	if r <= 0 {
		if down >= 0 {
			x.noteOpenPort(p, x.w.pins[ci][down])
		}
		return
	}
	tau := r * c
	x.set("r_in", figure.Ohm, r, byLoadR)
	x.set("tau", figure.Second, tau, byTau)
	x.couplingCorner(p, x.w.pins[ci][1-down], x.w.pins[ci][down], r, c)
}

// downstream finds which side of a two-terminal part (ci) is farther from
// the inputs (a declared input is upstream by definition) and the
// resistance from it to AC ground: only a resistance there is what a
// coupling capacitor feeds; one on the upstream side (an anode load) is its
// source. down is -1 when neither side is; ok is false when a side is at
// AC ground.
func (x *figCtx) downstream(ci int) (down int, r float64, ok bool) {
	var sides [2]struct {
		d int
		r float64
	}
	for i, net := range x.w.pins[ci] {
		if net == groundNet {
			return -1, 0, false
		}
		// a side nothing else reaches from the inputs is downstream (MaxInt)
		sides[i].d, sides[i].r = x.netDist(net, ci), resistanceToGround(x.w, net)
		if sp := speakerLoad(x.w, net); sp > 0 {
			// the loudspeaker is across whatever else the side holds (an
			// overall feedback resistor's path): 8 Ω beside 1.6 kΩ sets
			// the corner, not the 1.6 kΩ alone (review20 b04)
			sides[i].r = parallelOf(sides[i].r, sp)
		}
	}
	down = -1
	switch {
	case sides[0].d > sides[1].d:
		down = 0
	case sides[1].d > sides[0].d:
		down = 1
	case (sides[0].r > 0) != (sides[1].r > 0):
		// No order to go by (no inputs declared): the one resistive side.
		down = 0
		if sides[1].r > 0 {
			down = 1
		}
	}
	if down < 0 {
		return -1, 0, true
	}
	return down, sides[down].r, true
}

// speakerLoad is the rated impedance of a loudspeaker from net to AC
// ground, 0 when none: what a capacitor coupling a loudspeaker feeds (its
// rating is its nominal impedance, common practice). The resistive walk
// holds resistors and pots only, so a coupling capacitor into an 8 Ω
// speaker was said to feed "the resistance beyond … not in this circuit".
func speakerLoad(w *world, net int) float64 {
	r := 0.0
	for _, ci := range w.conns[net] {
		p := w.parts[ci]
		if p.Kind != graph.Loudspeaker || len(w.pins[ci]) != 2 || p.Value.Max <= 0 {
			continue
		}
		if other := w.pins[ci][0]; other == net && w.pins[ci][1] == groundNet || other == groundNet && w.pins[ci][1] == net {
			r = parallelOf(r, p.Value.Max)
		}
	}
	return r
}

func parallelOf(a, b float64) float64 {
	if a <= 0 {
		return b
	}
	return a * b / (a + b)
}

// noteOpenPort notes a coupling capacitor that feeds a port (a connection
// off the sheet) and no resistance: its corner depends on what is beyond.
func (x *figCtx) noteOpenPort(p *graph.Part, net int) {
	for _, other := range x.w.conns[net] {
		if q := x.w.parts[other]; q.Kind == graph.Port {
			port := q.Ref
			if q.Label != "" {
				port += " (" + q.Label + ")"
			}
			x.st.Notes = append(x.st.Notes, fmt.Sprintf("no corner figured: %s feeds %s, and the resistance beyond is not in this circuit",
				p.Ref, port))
			return
		}
	}
}

// withDetectorLoads is reduced with the detectors' DC loads of the wiring
// (ac.KeepDetectorLoads), as the comparison uses them: a caller that
// reduced without the pipeline gets them from the full circuit here.
func withDetectorLoads(reduced, full *graph.Circuit) *graph.Circuit {
	if reduced.DetectorLoads != nil || full == nil {
		return reduced
	}
	if full.DetectorLoads == nil {
		full = full.Clone()
		ac.KeepDetectorLoads(full)
	}
	reduced = reduced.Clone()
	reduced.DetectorLoads = full.DetectorLoads
	return reduced
}
