package stages

import (
	"errors"
	"fmt"
	"math"
	"sort"
	"strings"

	"pare/graph"
)

// calcDoubleTuned: both resonances of a coupled pair of tuned windings; with
// the coupling k and the windings' Q the critical coupling kc = 1/√(Q1Q2)
// and the bandwidth at critical coupling √2·f0/Q, with Q = √(Q1Q2)
// (reference-values §6; exact for equal Q).
func calcDoubleTuned(x *figCtx) {
	i := x.index(x.spec.Args["xfmr"][0])
	if i < 0 {
		return
	}
	ci := x.m.parts[i]
	p := x.w.parts[ci]
	as := x.m.coils[i]
	if len(as) < 2 {
		return
	}
	c1, c2 := x.w.coils[ci][as[0]], x.w.coils[ci][as[1]]
	f1 := x.windingTank(ci, c1, x.parts("caps1"), "1")
	f2 := x.windingTank(ci, c2, x.parts("caps2"), "2")
	k := p.K(c1.name, c2.name)
	x.set("k", k)
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
		q := math.Sqrt(q1 * q2)
		kc := 1 / q
		x.set("q1", q1)
		x.set("q2", q2)
		x.set("kc", kc)
		if f1 > 0 {
			x.set("bw_hz", math.Sqrt2*f1/q)
		}
		if k > 0 {
			x.set("k_ratio", k/kc)
			switch r := k / kc; {
			case r > 2:
				x.flag("%s is over-coupled (k = %s·kc): expect a double-humped response", p.Ref, trimFloat(r))
			case r < 0.5:
				x.flag("%s is under-coupled (k = %s·kc): low gain, narrow response", p.Ref, trimFloat(r))
			}
		}
	}
	for _, f := range []float64{f1, f2} {
		x.checkIF(p.Ref, f)
	}
}

// windingTank writes one side's resonance (f1_hz or f2_hz, or a range) and
// returns the fixed or mid-range value for later figures.
func (x *figCtx) windingTank(ci int, cl coil, caps []*graph.Part, side string) float64 {
	a, b := x.w.pinNet(ci, cl.pins[0]), x.w.pinNet(ci, cl.pins[len(cl.pins)-1])
	cmin, cmax := capBetween(x.w, caps, a, b, 0), capBetween(x.w, caps, a, b, 1)
	x.set("l"+side+"_h", cl.l)
	if cmax > cmin*1.0001 {
		x.set("f"+side+"_min_hz", resonance(cl.l, cmax))
		x.set("f"+side+"_max_hz", resonance(cl.l, cmin))
		return resonance(cl.l, (cmin+cmax)/2)
	}
	f := resonance(cl.l, cmax)
	x.set("f"+side+"_hz", f)
	return f
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
	x.flag("%s is tuned to %s, %s (%s %%) %s the declared IF %s", ref, FigureText("f_hz", f), FigureText("f_hz", math.Abs(off)),
		trimFloat(100*math.Abs(off)/ifHz), dir, FigureText("f_hz", ifHz))
}

// calcMixer: for a self-oscillating or separate-oscillator mixer the
// oscillator's range, the IF (declared in Circuit.Freqs["if"], else the IF
// transformer's tuning), the signal range it converts with high-side
// injection (oscillator − IF) and the image (signal + 2·IF); with ganged
// tuning, the tracking error across the dial and the three-point padder
// (reference-values §2).
func calcMixer(x *figCtx) {
	oc, ok := x.coil("coil")
	if !ok {
		return
	}
	oa, ob, lo := oc.a, oc.b, oc.l
	oscCaps := x.parts("caps")
	omin, omax := resonance(lo, capBetween(x.w, oscCaps, oa, ob, 1)), resonance(lo, capBetween(x.w, oscCaps, oa, ob, 0))
	x.set("osc_f_min_hz", omin)
	x.set("osc_f_max_hz", omax)
	ifHz := x.w.c.Freqs["if"]
	spec := x.spec
	x.spec = FigureSpec{Calc: "tank", Args: map[string][]string{"coil": spec.Args["ift"], "caps": spec.Args["ift_caps"], "winding": {"1"}}}
	ic, iok := x.coil("coil")
	x.spec = spec
	ift := math.NaN()
	if iok {
		ift = resonance(ic.l, capBetween(x.w, x.parts("ift_caps"), ic.a, ic.b, 1))
		x.set("ift_f_hz", ift)
		if p := x.part("ift"); p != nil {
			x.checkIF(p.Ref, ift)
		}
	}
	if ifHz <= 0 {
		ifHz = ift
	}
	if !(ifHz > 0) {
		return
	}
	x.set("if_hz", ifHz)
	smin, smax := omin-ifHz, omax-ifHz
	x.set("sig_f_min_hz", smin)
	x.set("sig_f_max_hz", smax)
	x.set("image_f_min_hz", smin+2*ifHz)
	x.set("image_f_max_hz", smax+2*ifHz)
	if b := x.w.c.Band; b.Max > 0 {
		// 1 % short of a band edge is within what the trimmers set.
		if smin > b.Min*1.01 || smax < b.Max*0.99 {
			x.flag("oscillator covers %s–%s: with the IF %s the set tunes %s–%s, not the whole band %s–%s",
				FigureText("f_hz", omin), FigureText("f_hz", omax), FigureText("f_hz", ifHz),
				FigureText("f_hz", smin), FigureText("f_hz", smax), FigureText("f_hz", b.Min), FigureText("f_hz", b.Max))
		}
	}
	osc := &tankModel{w: x.w, l: lo, a: oa, b: ob, caps: oscCaps}
	x.tracking(osc.original(oc, x.w.orig), ifHz)
}

// tankModel is a coil and the capacitors that tune it, between nets a and b
// of world w.
// gangRef names the tank's section of the gang.
func (t *tankModel) gangRef(gang string) string {
	for _, p := range t.caps {
		if p.Gang == gang {
			return p.Ref
		}
	}
	return "the other section"
}

type tankModel struct {
	w    *world
	l    float64
	a, b int
	caps []*graph.Part
}

func (t *tankModel) f(frac float64) float64 {
	return resonance(t.l, capBetween(t.w, t.caps, t.a, t.b, frac))
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

// tracking compares the oscillator with the signal tank ganged to it. Both
// sections turn together; capacitance is taken as linear in rotation (the
// gang's plate shape is not in the netlist).
func (x *figCtx) tracking(osc *tankModel, ifHz float64) {
	var gangCap *graph.Part
	for _, p := range osc.caps {
		if p.Gang != "" && p.Type == graph.CapVariable {
			gangCap = p
			break
		}
	}
	if gangCap == nil {
		return
	}
	sig := findGangTank(osc.w, gangCap, osc.caps)
	if sig == nil {
		return
	}
	worst, worstAt := 0.0, 0.0
	const steps = 100
	for i := 0; i <= steps; i++ {
		th := float64(i) / steps
		fs, fo := sig.f(th), osc.f(th)
		if e := fo - (fs + ifHz); math.Abs(e) > math.Abs(worst) {
			worst, worstAt = e, fs
		}
	}
	x.set("track_err_max_hz", worst)
	x.set("track_err_at_hz", worstAt)
	fitted := fittedTracking(sig.f, osc.f, ifHz)
	for i, f := range fitted {
		x.set(fmt.Sprintf("track_fit%d_hz", i+1), f)
	}
	fittedText := "the fitted set tracks exactly nowhere on the dial"
	if len(fitted) > 0 {
		var at []string
		for _, f := range fitted {
			at = append(at, FigureText("f_hz", f))
		}
		fittedText = "the fitted set tracks exactly at " + andList(at)
	}
	ideal := TrackingPoints(sig.f(1), sig.f(0))
	x.st.Notes = append(x.st.Notes, fmt.Sprintf("tracking: %s and %s turn together, capacitance taken as linear in rotation; %s; a suggested three-point design would be exact at %s",
		gangCap.Ref, sig.gangRef(gangCap.Gang), fittedText,
		andList([]string{FigureText("f_hz", ideal[0]), FigureText("f_hz", ideal[1]), FigureText("f_hz", ideal[2])})))
	// Common practice, no source: tracking should stay well inside the IF
	// pass-band; 2 % of the IF (9 kHz at 455 kHz) is taken as the line.
	if math.Abs(worst) > 0.02*ifHz {
		x.flag("oscillator tracking is off by up to %s (at %s on the dial): check the padder and trimmers", FigureText("f_hz", worst), FigureText("f_hz", worstAt))
	}
	var gang *graph.Part
	for _, p := range sig.caps {
		if p.Gang == gangCap.Gang && p.Type == graph.CapVariable {
			gang = p
		}
	}
	fixed := capBetween(sig.w, sig.caps, sig.a, sig.b, 0) - gang.Capacitance(0)
	pts := TrackingPoints(sig.f(1), sig.f(0))
	sol, err := ThreePoint(sig.l, fixed, ifHz, pts)
	if err != nil {
		return
	}
	for i, f := range pts {
		x.set("track_f"+string(rune('1'+i))+"_hz", f)
	}
	x.set("pad_c_f", sol.Padder)
	x.set("pad_trim_f", sol.Trimmer)
	x.set("pad_l_h", sol.L)
}

// trackingScan is how finely fittedTracking walks the dial before it
// closes in on a crossing: fine enough that two crossings never fall in one
// step of a broadcast gang.
const trackingScan = 2000

// fittedTracking is where the fitted parts track exactly: the dial points
// (as signal frequencies, low to high) where the oscillator minus the
// signal frequency crosses the IF, fosc − (fsig + IF) = 0. Each sign change
// over the scan is narrowed by bisection.
func fittedTracking(sig, osc func(th float64) float64, ifHz float64) []float64 {
	errAt := func(th float64) float64 { return osc(th) - (sig(th) + ifHz) }
	var out []float64
	prevTh, prevE := 0.0, errAt(0)
	if prevE == 0 {
		out = append(out, sig(0))
	}
	for i := 1; i <= trackingScan; i++ {
		th := float64(i) / trackingScan
		e := errAt(th)
		switch {
		case e == 0:
			out = append(out, sig(th))
		case prevE != 0 && math.Signbit(e) != math.Signbit(prevE):
			lo, hi, elo := prevTh, th, prevE
			for range 60 {
				mid := (lo + hi) / 2
				em := errAt(mid)
				if math.Signbit(em) == math.Signbit(elo) {
					lo, elo = mid, em
				} else {
					hi = mid
				}
			}
			out = append(out, sig((lo+hi)/2))
		}
		prevTh, prevE = th, e
	}
	sort.Float64s(out)
	return out
}

// andList joins items as prose: "a", "a and b", "a, b and c".
func andList(items []string) string {
	switch len(items) {
	case 0:
		return ""
	case 1:
		return items[0]
	}
	return strings.Join(items[:len(items)-1], ", ") + " and " + items[len(items)-1]
}

// findGangTank finds the other section of a gang and the tank it tunes: a
// coil and the capacitors across the same two nets.
func findGangTank(w *world, osc *graph.Part, exclude []*graph.Part) *tankModel {
	skip := map[*graph.Part]bool{}
	for _, p := range exclude {
		skip[p] = true
	}
	for ci, p := range w.parts {
		if p == osc || skip[p] || p.Gang != osc.Gang || p.Kind != graph.Capacitor || len(p.Pins) != 2 {
			continue
		}
		a, b := w.pins[ci][0], w.pins[ci][1]
		across := func(n1, n2 int) bool { return n1 == a && n2 == b || n1 == b && n2 == a }
		t := &tankModel{w: w, a: a, b: b}
		for cj, q := range w.parts {
			switch {
			case q.Kind == graph.Capacitor && len(q.Pins) == 2 && across(w.pins[cj][0], w.pins[cj][1]):
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
		if t.l > 0 {
			return t
		}
	}
	return nil
}

// TrackingPoints are the three dial frequencies where a padded oscillator is
// made to track exactly: at 6 %, 49 % and 91.5 % of the signal range, which
// gives the customary 600, 1100 and 1600 kHz on a 530–1700 kHz band
// (reference-values §2; the fractions are ours).
func TrackingPoints(fmin, fmax float64) [3]float64 {
	span := fmax - fmin
	return [3]float64{fmin + 0.06*span, fmin + 0.49*span, fmin + 0.915*span}
}

// Padding is a three-point tracking solution: the oscillator coil L in
// parallel with [(gang + Trimmer) in series with Padder].
type Padding struct{ L, Trimmer, Padder float64 }

// ThreePoint solves for the oscillator coil, trimmer and padder that make the
// oscillator run exactly IF above a signal tank (coil ls, fixed capacitance
// ct beside the gang) at the three signal frequencies pts. At each point the
// gang stands at Cg = 1/(ω²Ls) − Ct; the oscillator then needs
// 1/(Cg+Ct2) + 1/Cp = ωo²L2. Differences eliminate Cp; the ratio of the two
// differences is one equation in Ct2, solved by bisection; L2 and Cp follow.
func ThreePoint(ls, ct, ifHz float64, pts [3]float64) (Padding, error) {
	var cg, a [3]float64
	for i, f := range pts {
		w := 2 * math.Pi * f
		cg[i] = 1/(w*w*ls) - ct
		wo := 2 * math.Pi * (f + ifHz)
		a[i] = wo * wo
	}
	lower := math.Min(cg[0], math.Min(cg[1], cg[2]))
	if lower <= 0 {
		return Padding{}, errors.New("tracking points outside the gang's range")
	}
	g := func(t float64) float64 {
		d12 := 1/(cg[0]+t) - 1/(cg[1]+t)
		d13 := 1/(cg[0]+t) - 1/(cg[2]+t)
		return d12*(a[0]-a[2]) - d13*(a[0]-a[1])
	}
	// Scan for a sign change from just above −min(Cg) up to 1 nF of trimmer.
	lo := -lower * 0.999
	prev, prevG := lo, g(lo)
	found := false
	var hi float64
	for i := 1; i <= 4000; i++ {
		t := lo + (1e-9-lo)*float64(i)/4000
		if gt := g(t); gt == 0 || math.Signbit(gt) != math.Signbit(prevG) {
			lo, hi, found = prev, t, true
			break
		} else {
			prev, prevG = t, gt
		}
	}
	if !found {
		return Padding{}, errors.New("no three-point solution")
	}
	glo := g(lo)
	for i := 0; i < 200; i++ {
		mid := (lo + hi) / 2
		gm := g(mid)
		if math.Signbit(gm) == math.Signbit(glo) {
			lo, glo = mid, gm
		} else {
			hi = mid
		}
	}
	t := (lo + hi) / 2
	l2 := (1/(cg[0]+t) - 1/(cg[1]+t)) / (a[0] - a[1])
	invCp := a[0]*l2 - 1/(cg[0]+t)
	if l2 <= 0 || invCp <= 0 {
		return Padding{}, errors.New("three-point solution is not physical")
	}
	return Padding{L: l2, Trimmer: t, Padder: 1 / invCp}, nil
}

// OscillatorAt is the frequency of a padded oscillator (see Padding) when the
// gang stands at cg.
func (p Padding) OscillatorAt(cg float64) float64 {
	c := cg + p.Trimmer
	return resonance(p.L, c*p.Padder/(c+p.Padder))
}
