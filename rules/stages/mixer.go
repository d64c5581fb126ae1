package stages

import (
	"fmt"
	"math"
	"slices"

	"pare/graph"
	"pare/graph/figure"
	"pare/graph/value"
)

// The formulas of coupled tuned circuits and frequency changers, by the
// names a figure's origin gives them (docs/references.md §2, §6).
var (
	byCoupling   = figure.FromNetlist("coupling k")
	byWindingQ   = figure.FromNetlist("winding Q")
	byCritical   = figure.ByFormula("kc = 1/√(Q1Q2)")
	byKRatio     = figure.ByFormula("k/kc")
	byLoadedQ    = figure.BySolver("f0/(f2 − f1) of |Z| across the winding, the other uncoupled", gangMid.at)
	byBandwidth  = figure.ByFormula("B = √2·f0/Q, Q = √(Q1Q2)")
	byDeclaredIF = figure.FromNetlist("[freqs] if")
	bySignal     = figure.ByFormula("fsig = fosc − IF")
	byImage      = figure.ByFormula("fimage = fsig + 2·IF")
)

// calcDoubleTuned: both resonances of a coupled pair of tuned windings; with
// the coupling k and the windings' Q the critical coupling kc = 1/√(Q1Q2)
// and the bandwidth at critical coupling √2·f0/Q, with Q = √(Q1Q2)
// (docs/references.md §6; exact for equal Q).
func calcDoubleTuned(x *figCtx) {
	ci, p, as, ok := x.tunedPair()
	if !ok {
		return
	}
	c1, c2 := x.w.coils[ci][as[0]], x.w.coils[ci][as[1]]
	// Each side is tuned as an aligner peaks it: with the other side's
	// coupling taken out, so the pair's split does not pass for a
	// mistuning. The pair's response with its coupling is the bandwidth.
	sub := x.sub
	x.sub = withPart(x.solverCircuit(), x.w.uncoupled(ci, as[0], as[1]))
	f1 := x.windingTank(ci, c1, x.parts("caps1"), "1")
	ql1 := x.tankLoadedQ()
	doubt := x.tankDoubt(p.Ref)
	f2 := x.windingTank(ci, c2, x.parts("caps2"), "2")
	ql2 := x.tankLoadedQ()
	if doubt == "" {
		doubt = x.tankDoubt(p.Ref)
	}
	x.sub = sub
	if x.solve && x.st.group == "tuned" && doubt != "" {
		// a side that is no tuned circuit in circuit (a winding its
		// conducting diodes damp below tankMinQ) makes no double-tuned
		// pair: the stage is dropped, as confirmTank drops a single tank
		x.st.unconfirmed = doubt
		return
	}
	k := p.K(c1.name, c2.name)
	x.set("k", figure.Ratio, k, byCoupling)
	q1, q2 := c1.q, c2.q
	if q, ok := p.Param("q"); ok {
		if q1 == 0 {
			q1 = q
		}
		if q2 == 0 {
			q2 = q
		}
	}
	if q1 > 0 && q2 > 0 {
		x.coupledPair(p.Ref, f1, k, [2]float64{q1, q2}, [2]float64{ql1, ql2})
		x.pairFigure(x.hotEnd(ci, c1), x.hotEnd(ci, c2), f1)
	}
	for _, f := range []float64{f1, f2} {
		x.checkIF(p.Ref, f)
	}
}

// uncoupled is a copy of transformer part ci with no winding of one coil
// coupled to a winding of another (the halves of a tapped coil stay
// coupled: they are one coil); with only set, only couplings between
// those two coils (by index in w.coils[ci]) go.
func (w *world) uncoupled(ci int, only ...int) *graph.Part {
	p := w.parts[ci]
	coilOf := func(winding string) int {
		for _, wd := range p.Windings {
			if wd.Name != winding {
				continue
			}
			for i, cl := range w.coils[ci] {
				if slices.Contains(cl.pins, wd.From) && slices.Contains(cl.pins, wd.To) {
					return i
				}
			}
		}
		return -1
	}
	q := *p
	q.Coupling = nil
	for _, c := range p.Coupling {
		a, b := coilOf(c.A), coilOf(c.B)
		apart := a != b && a >= 0 && b >= 0
		if apart && (len(only) < 2 || slices.Contains(only, a) && slices.Contains(only, b)) {
			continue
		}
		q.Coupling = append(q.Coupling, c)
	}
	return &q
}

// coupledPair writes the critical coupling and bandwidth of a pair of
// windings of own Q q coupled by k, and flags a pair far from critical.
// Where the solver gives each winding's Q as its circuit loads it (ql,
// each side solved with the other uncoupled), kc and k/kc come from those,
// with kc from the windings' own Q as the cross-check: a pair is judged
// as it works, not as its coils would on the bench.
func (x *figCtx) coupledPair(ref string, f1, k float64, q, ql [2]float64) {
	qo := math.Sqrt(q[0] * q[1])
	kc := 1 / qo
	x.set("q1", figure.Ratio, q[0], byWindingQ)
	x.set("q2", figure.Ratio, q[1], byWindingQ)
	check := figure.Figure{Name: "kc", Unit: figure.Ratio, Value: kc, Origin: byCritical}
	if ql[0] > 0 && ql[1] > 0 {
		x.set("q1_loaded", figure.Ratio, ql[0], byLoadedQ)
		x.set("q2_loaded", figure.Ratio, ql[1], byLoadedQ)
		kc = 1 / math.Sqrt(ql[0]*ql[1])
		sv := &figure.Figure{Name: "kc", Unit: figure.Ratio, Value: kc, Origin: figure.BySolver("1/√(Q1Q2) with each winding's loaded Q", gangMid.at)}
		x.putChecked(sv, &check, func() string {
			return fmt.Sprintf("the formula takes the windings' own Q (%s, %s); in circuit their loads bring them to %s and %s",
				figure.Plain(q[0]), figure.Plain(q[1]), figure.Plain(ql[0]), figure.Plain(ql[1]))
		})
	} else {
		x.put(check)
	}
	if f1 > 0 {
		x.set("bw", figure.Hertz, math.Sqrt2*f1/qo, byBandwidth) // the solver's replaces it (pairFigure)
	}
	if k <= 0 {
		return
	}
	x.set("k_ratio", figure.Ratio, k/kc, byKRatio)
	switch r := k / kc; {
	case r > 2:
		x.flag("%s is over-coupled (k = %s·kc): expect a double-humped response", ref, figure.Plain(r))
	case r < 0.5:
		x.flag("%s is under-coupled (k = %s·kc): low gain, narrow response", ref, figure.Plain(r))
	}
}

// tankLoadedQ is the Q of the tank last solved (resonanceFigure) at mid
// travel, 0 where it did not solve or nothing damps it (maxLoadedQ).
func (x *figCtx) tankLoadedQ() float64 {
	if !x.solve || !x.tankOK || len(x.tank.q) == 0 {
		return 0
	}
	v := x.tank.q[len(x.tank.q)/2]
	if math.IsNaN(v) || v <= 0 || v > maxLoadedQ {
		return 0
	}
	return v
}

// windingTank writes one side's resonance (f1 or f2, a value or a range)
// and returns the fixed or mid-range value for later figures.
func (x *figCtx) windingTank(ci int, cl coil, caps []*graph.Part, side string) float64 {
	a, b := x.w.pinNet(ci, cl.pins[0]), x.w.pinNet(ci, cl.pins[len(cl.pins)-1])
	x.set("l"+side, figure.Henry, cl.l, byPartValue)
	formulaAt := func(frac float64) float64 { return resonance(cl.l, capBetween(x.w, caps, a, b, frac)) }
	x.resonanceFigure("f"+side, x.w.parts[ci].Ref, cl.l, a, b, formulaAt, byResonance, refsOf(caps))
	f, ok := x.get("f" + side)
	switch {
	case !ok:
		return math.NaN()
	case f.Range != nil:
		return (f.Range.Min + f.Range.Max) / 2
	}
	return f.Value
}

// ifTolerance is how far a tuned IF circuit may sit from the declared IF
// before it is flagged: 1 % (common practice, no source: about the
// pass-band's half width at 455 kHz).
const ifTolerance = 0.01

// checkIF flags a resonance near the declared IF (within 30 %, so an RF or
// audio transformer is left alone) that misses it by more than ifTolerance.
func (x *figCtx) checkIF(ref string, f float64) {
	ifHz := x.w.c.Freqs["if"]
	if ifHz <= 0 || f <= 0 || math.IsNaN(f) {
		return
	}
	off := f - ifHz
	if math.Abs(off) > 0.3*ifHz || math.Abs(off) <= ifTolerance*ifHz {
		return
	}
	dir := "above"
	if off < 0 {
		dir = "below"
	}
	x.flag("%s is tuned to %s, %s (%s %%) %s the declared IF %s", ref, hz(f), hz(math.Abs(off)),
		figure.Plain(100*math.Abs(off)/ifHz), dir, hz(ifHz))
}

// calcMixer: for a self-oscillating or separate-oscillator mixer the
// oscillator's range, the IF (declared in Circuit.Freqs["if"], else the IF
// transformer's tuning), the signal range it converts with high-side
// injection (oscillator − IF) and the image (signal + 2·IF); with ganged
// tuning, the tracking error across the dial and the three-point padder
// (docs/references.md §2).
func calcMixer(x *figCtx) {
	oc, ok := x.coil("coil")
	if !ok {
		return
	}
	oscCaps := x.withAcross(oc, x.parts("caps"))
	osc := &tankModel{w: x.w, l: oc.l, a: oc.a, b: oc.b, caps: oscCaps}
	x.resonanceFigure("osc_f", oc.ref, oc.l, oc.a, oc.b, osc.f, byResonance, refsOf(oscCaps))
	fmin, fmax := osc.f(1), osc.f(0) // the formula's
	omin, omax := fmin, fmax
	if f, ok := x.get("osc_f"); ok && f.Range == nil {
		// a tank the gang does not move: still the oscillator's range,
		// one point wide, as the signal and image ranges are
		r := value.Range{Min: f.Value, Max: f.Value}
		f.Range, f.Value = &r, 0
		if c := f.Check; c != nil && c.Range == nil {
			cr := value.Range{Min: c.Value, Max: c.Value}
			c.Range, c.Value = &cr, 0
		}
		f.Name = "osc_f"
		x.put(f)
	}
	if f, ok := x.get("osc_f"); ok && f.Range != nil {
		omin, omax = f.Range.Min, f.Range.Max // the solver's, in circuit
	}
	ifHz := x.intermediate()
	if !(ifHz > 0) {
		return
	}
	smin, smax := omin-ifHz, omax-ifHz
	// From the solver's oscillator range, with the same sums on the
	// formula's range beside them.
	span := func(name string, lo, hi float64, o figure.Origin) *figure.Figure {
		return &figure.Figure{Name: name, Unit: figure.Hertz, Range: &value.Range{Min: lo, Max: hi}, Origin: o}
	}
	sig := span("sig_f", smin, smax, bySignal)
	img := span("image_f", smin+2*ifHz, smax+2*ifHz, byImage)
	if f, ok := x.get("osc_f"); ok && f.Check != nil {
		// the solver's oscillator range less the IF: the solver's figure
		sig.Origin = figure.BySolver("osc f in circuit − IF", f.Origin.At)
		img.Origin = figure.BySolver("osc f in circuit + IF", f.Origin.At)
		sig.Check = span("sig_f", fmin-ifHz, fmax-ifHz, bySignal)
		img.Check = span("image_f", fmin+ifHz, fmax+ifHz, byImage)
		if f.Why != "" {
			sig.Why, img.Why = "from the oscillator's range, "+f.Why, "from the oscillator's range, "+f.Why
		}
	}
	x.put(*sig)
	x.put(*img)
	if f := coverageFlag(x.w.c.Band, omin, omax, ifHz); f != "" {
		x.flag("%s", f)
	}
	x.tracking(osc, oc, ifHz)
}

// intermediate writes the IF transformer's tuning and the IF, and returns
// the IF: the declared one, else the transformer's; NaN when neither is
// known.
func (x *figCtx) intermediate() float64 {
	spec := x.spec
	x.spec = FigureSpec{Calc: "tank", Args: map[string][]string{"coil": spec.Args["ift"], "caps": spec.Args["ift_caps"], "winding": {"1"}}}
	ic, iok := x.coil("coil")
	x.spec = spec
	ift := math.NaN()
	if iok {
		caps := x.parts("ift_caps")
		formulaAt := func(float64) float64 { return resonance(ic.l, capBetween(x.w, caps, ic.a, ic.b, 1)) }
		// the primary peaked as an aligner peaks it, the secondary's
		// coupling out (calcDoubleTuned)
		if p := x.part("ift"); p != nil && x.solve && x.partIndex(p) >= 0 {
			sub := x.sub
			x.sub = withPart(x.solverCircuit(), x.w.uncoupled(x.partIndex(p)))
			defer func() { x.sub = sub }()
		}
		x.resonanceFigure("ift_f", ic.ref, ic.l, ic.a, ic.b, formulaAt, byResonance, refsOf(caps))
		if f, ok := x.get("ift_f"); ok {
			ift = f.Value
		}
		if p := x.part("ift"); p != nil {
			x.checkIF(p.Ref, ift)
		}
	}
	if ifHz := x.w.c.Freqs["if"]; ifHz > 0 {
		x.set("if", figure.Hertz, ifHz, byDeclaredIF)
		return ifHz
	}
	if f, ok := x.get("ift_f"); ok {
		f.Name = "if" // the transformer's tuning is the IF, as solved
		x.put(f)
	}
	return ift
}

// tankModel is a coil and the capacitors that tune it, between nets a and b
// of world w.
type tankModel struct {
	w    *world
	l    float64
	a, b int
	caps []*graph.Part
	// net is caps numbered as a network, once f reads them (nets: as many
	// caps as it was numbered with)
	net  *capNet
	nets int
}

// gangRef names the tank's section of the gang.
func (t *tankModel) gangRef(gang string) string {
	for _, p := range t.caps {
		if p.Gang == gang {
			return p.Ref
		}
	}
	return "the other section"
}

// f is the tank's resonance with its variable capacitors at frac of their
// travel (0 at minimum capacitance).
func (t *tankModel) f(frac float64) float64 {
	if t.net == nil || t.nets != len(t.caps) {
		t.net, t.nets = capNetOf(t.w, t.caps, t.a, t.b), len(t.caps)
	}
	return resonance(t.l, t.net.at(frac))
}

// original rebuilds a tank from the parts of the original circuit the
// reduced ones stand for: a reduction folds a padder and a trimmer into one
// variable part whose span is exact only at its ends, and tracking needs the
// whole dial. It returns t itself when there is no original to go back to.
func (t *tankModel) original(oc coilEnds, orig *world) *tankModel {
	if orig == nil {
		return t
	}
	var caps []*graph.Part
	for _, p := range t.caps {
		for _, ref := range p.Origins() {
			q := orig.c.Part(ref)
			if q == nil {
				return t
			}
			caps = append(caps, q)
		}
	}
	ci := -1
	for i, p := range orig.parts {
		if p.Ref == oc.ref {
			ci = i
		}
	}
	if ci < 0 {
		return t
	}
	out := &tankModel{w: orig, l: t.l, caps: caps, a: orig.pinNet(ci, oc.pinA), b: orig.pinNet(ci, oc.pinB)}
	if out.a < 0 || out.b < 0 {
		return t
	}
	return out
}

// findGangTank finds the other section of a gang and the tank it tunes: a
// coil and the capacitors across the same two nets. Where the gang has
// more than one signal section (aerial and RF tanks of a set with an RF
// stage), it is the one furthest from the inputs: the tank that feeds the
// mixer, whose pass-band the oscillator must land the IF in.
func findGangTank(w *world, osc *graph.Part, exclude []*graph.Part) *tankModel {
	var best *tankModel
	bestD := -1
	dist := w.signalDist()
	for _, t := range gangTanks(w, osc, exclude) {
		d, ok := dist[t.gangRef(osc.Gang)]
		if !ok {
			d = 0
		}
		if d > bestD {
			best, bestD = t, d
		}
	}
	return best
}

// gangTanks are the tanks the other sections of osc's gang tune, in the
// world's part order.
func gangTanks(w *world, osc *graph.Part, exclude []*graph.Part) []*tankModel {
	skip := map[*graph.Part]bool{}
	for _, p := range exclude {
		skip[p] = true
	}
	var out []*tankModel
	for ci, p := range w.parts {
		if p == osc || skip[p] || p.Gang != osc.Gang || p.Kind != graph.Capacitor || len(p.Pins) != 2 {
			continue
		}
		a, b := w.pins[ci][0], w.pins[ci][1]
		cold := coldEnds(w, p.Value.Max)
		across := func(n1, n2 int) bool {
			n1, n2 = cold(n1), cold(n2)
			return n1 == a && n2 == b || n1 == b && n2 == a
		}
		t := &tankModel{w: w, a: a, b: b}
		for cj, q := range w.parts {
			switch {
			case q.Kind == graph.Capacitor && len(q.Pins) == 2 && (w.pins[cj][0] == a && w.pins[cj][1] == b || w.pins[cj][0] == b && w.pins[cj][1] == a):
				t.caps = append(t.caps, q)
			case q.Kind == graph.Inductor && t.l == 0 && across(w.pinNet(cj, "1"), w.pinNet(cj, "2")):
				t.l = q.Inductance()
			case q.Kind == graph.Transformer && t.l == 0:
				for _, cl := range w.coils[cj] {
					if across(w.pinNet(cj, cl.pins[0]), w.pinNet(cj, cl.pins[len(cl.pins)-1])) {
						t.l = cl.l
						break
					}
				}
			}
		}
		if t.l == 0 {
			t.l = seriesCoilAcross(w, a, b, cold, across)
		}
		if t.l > 0 {
			out = append(out, t)
		}
	}
	return out
}

// coldBypass is how many times a tank's largest tuning capacitance a
// capacitor from a coil's cold end to ground must be for that end to count
// as grounded for the tank: 100 times keeps its reactance under 1 % of the
// tuning capacitor's at every frequency (an aerial coil returned to the
// AGC line, decoupled there; judgement, in the spirit of the reduction's
// bypass rule).
const coldBypass = 100

// coldEnds maps a net bypassed to ground by a capacitor of coldBypass times
// cmax or more to the ground, any other net to itself.
func coldEnds(w *world, cmax float64) func(int) int {
	return func(n int) int {
		if n <= groundNet || n >= len(w.conns) {
			return n
		}
		for _, ci := range w.conns[n] {
			q := w.parts[ci]
			if q.Kind != graph.Capacitor || len(w.pins[ci]) != 2 || q.Value.Min < coldBypass*cmax {
				continue
			}
			if w.pins[ci][0] == groundNet || w.pins[ci][1] == groundNet {
				return groundNet
			}
		}
		return n
	}
}

// hotEnd is the circuit net of a winding's end off AC ground (its first
// pin's when neither end is).
func (x *figCtx) hotEnd(ci int, cl coil) string {
	a, b := x.w.pinNet(ci, cl.pins[0]), x.w.pinNet(ci, cl.pins[len(cl.pins)-1])
	if a == groundNet {
		a = b
	}
	return x.netName(a)
}

// pairFigure puts the pair's bandwidth as the solver gives it in circuit
// (pairBandwidth), with √2·f0/Q beside it: the formula holds at critical
// coupling and for equal Q, so the words for a difference give k/kc.
func (x *figCtx) pairFigure(prim, sec string, f0 float64) {
	pb, ok := x.pairBandwidth(prim, sec, f0)
	check, has := x.get("bw")
	if !ok || !has {
		return
	}
	sv := &figure.Figure{Name: "bw", Unit: figure.Hertz, Value: pb.hi - pb.lo,
		Origin: figure.BySolver("−3 dB band of V("+sec+") for 1 A into "+prim, gangMid.at)}
	x.putChecked(sv, &check, func() string {
		kr, _ := x.get("k_ratio")
		return fmt.Sprintf("the formula holds at critical coupling with the windings' own Q; here k is %s·kc and the pair works into its loads in circuit",
			figure.Plain(kr.Value))
	})
	x.pairPassFigures(pb)
}
