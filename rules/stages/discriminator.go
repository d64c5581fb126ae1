package stages

import (
	"fmt"
	"math"
	"math/cmplx"

	"pare/graph"
	"pare/graph/ac"
	"pare/graph/figure"
)

// The FM detector's transformer as the solver finds it (docs/references.md
// §1 for the formula beside each resonance).
var (
	bySCurveZero = figure.BySolver("S-curve zero: both diodes driven alike, |V(s1) − V(return)| = |V(s2) − V(return)|, 1 A into the primary, the diodes at their rd", gangMid.at)
	bySCurvePeak = figure.BySolver("S-curve peak, |V(s1) − V(return)| − |V(s2) − V(return)|, 1 A into the primary, the diodes at their rd", gangMid.at)
	bySCurveSep  = figure.BySolver("between the S-curve's two peaks", gangMid.at)
)

// calcDiscriminator: an FM detector built on a transformer whose secondary
// drives two diodes (a ratio detector, a Foster–Seeley discriminator;
// tertiary or coupling capacitor alike). Each side's resonance is solved
// in circuit with the other side's coupling out, as calcDoubleTuned tunes
// each side: coupled, a primary tuned near its secondary shows two humps
// (a Foster–Seeley's, k·Q over 3, peaks 5 % either side), and which is the
// higher is no figure of either winding; a side the solver shows no tuned
// circuit (loaded Q under tankMinQ) gets no resonance, a note instead. Then
// the stage's own response: the S-curve, each diode's drive the IF voltage
// across it and its load's bypass (diodeReturns), its zero the detector's
// centre and its two peaks the span it detects linearly over.
func calcDiscriminator(x *figCtx) {
	ci, p, as, ok := x.tunedPair()
	if !ok {
		return
	}
	c1, c2 := x.w.coils[ci][as[0]], x.w.coils[ci][as[1]]
	sub := x.sub
	x.sub = withPart(x.solverCircuit(), x.w.uncoupled(ci, as[0], as[1]))
	if caps := x.parts("caps1"); len(caps) > 0 {
		x.windingTank(ci, c1, caps, "1")
		x.sideConfirmed(p.Ref, "primary", "1")
	}
	f2 := x.windingTank(ci, c2, x.parts("caps2"), "2")
	x.sideConfirmed(p.Ref, "secondary", "2")
	x.sub = sub
	if !x.solve {
		return
	}
	s1, s2 := x.w.pinNet(ci, c2.pins[0]), x.w.pinNet(ci, c2.pins[len(c2.pins)-1])
	r1, r2 := x.diodeReturns()
	formula := resonance(c2.l, capBetween(x.w, x.parts("caps2"), s1, s2, 1))
	x.sCurve(x.hotEnd(ci, c1), [4]string{x.netName(s1), x.netName(s2), r1, r2}, formula, f2)
}

// diodeReturns are the nets each diode's IF drive is read against: the
// pattern's common IF return (ret: the junction of the loads' bypasses)
// where the match binds it, else each diode's own far end (ends), whose
// load capacitor holds it; "" is chassis.
func (x *figCtx) diodeReturns() (r1, r2 string) {
	bound := func(n string) (string, bool) {
		id, ok := x.w.netID[x.st.nets[n]]
		return x.netName(id), ok
	}
	if nets := x.spec.Args["ret"]; len(nets) > 0 {
		if r, ok := bound(nets[0]); ok {
			return r, r
		}
	}
	if ends := x.spec.Args["ends"]; len(ends) == 2 {
		r1, _ = bound(ends[0])
		r2, _ = bound(ends[1])
	}
	return r1, r2
}

// sideConfirmed keeps the resonance (f<side>) and loaded Q (q<side>_loaded)
// of the winding last solved where the solver bears it out as a tuned
// circuit, else drops the resonance and says why: a winding its diodes damp
// below tankMinQ has no resonance to quote (docs: the name is confirmed by
// its behaviour).
func (x *figCtx) sideConfirmed(ref, side, n string) {
	if !x.solve {
		return
	}
	why := x.tankDoubt(ref)
	if why == "" {
		if q := x.tankLoadedQ(); q > 0 {
			x.set("q"+n+"_loaded", figure.Ratio, q, byLoadedQ)
		}
		return
	}
	x.dropFigures("f" + n)
	x.st.Notes = append(x.st.Notes, fmt.Sprintf("%s %s: no resonance figure, it is no tuned circuit in circuit (%s)", ref, side, why))
}

// dropFigures takes the named figures (before the prefix) off the stage.
func (x *figCtx) dropFigures(names ...string) {
	drop := map[string]bool{}
	for _, n := range names {
		drop[prefixed(x.spec.Prefix, n)] = true
	}
	kept := x.st.Figures[:0]
	ranks := x.st.figRanks[:0]
	for j, f := range x.st.Figures {
		if !drop[f.Name] {
			kept = append(kept, f)
			ranks = append(ranks, x.st.figRanks[j])
		}
	}
	x.st.Figures, x.st.figRanks = kept, ranks
}

// sCurveSpan is how far either side of the secondary's tuning the S-curve
// is searched: ±40 % holds the peaks of a secondary of loaded Q down to
// about 1.5 (a peak lies near f0·(1 ± 1/(2Q)), common practice).
const sCurveSpan = 1.4

// sCurvePoints is the grid the S-curve is first read on, before its zero
// and peaks are refined: a cell of 0.4 % in f.
const sCurvePoints = 161

// sCurve writes the detector's centre (the S-curve's zero nearest the
// secondary's tuning) and its peaks, solved with 1 A into the primary's
// hot end, the devices quiet. The formula's resonance of the secondary is
// the centre's check: a balanced discriminator's centre is its secondary's
// tuning, and where they part the circuit's coupling moves it (a tertiary
// coupled to the secondary as well as the primary puts a part of the
// secondary's current into the reference).
func (x *figCtx) sCurve(hot string, nets [4]string, formula, f2 float64) {
	centre := f2
	if math.IsNaN(centre) || !(centre > 0) {
		centre = formula
	}
	if !(centre > 0) || math.IsInf(centre, 0) {
		return
	}
	s, ok := newSCurveResp(quiet(x.solverCircuit()), hot, nets)
	if !ok {
		return
	}
	lo, hi := centre/sCurveSpan, centre*sCurveSpan
	fs, vs := s.grid(lo, hi)
	z, ok := zeroNearest(s, fs, vs, centre)
	if !ok {
		x.st.Notes = append(x.st.Notes, "the S-curve does not cross zero within ±40 % of the secondary's tuning: no reference reaches the diodes in quadrature, so no centre can be given")
		return
	}
	check := figure.Figure{Name: "f_centre", Unit: figure.Hertz, Value: formula, Origin: byResonance}
	sv := &figure.Figure{Name: "f_centre", Unit: figure.Hertz, Value: z, Origin: bySCurveZero}
	x.putChecked(sv, &check, func() string {
		return "the formula tunes the secondary alone; in circuit the reference the diodes add to it (tertiary or primary) and the loads move the point where both are driven alike"
	})
	x.checkCentre(z)
	pl, okl := s.extreme(fs, vs, lo, z)
	ph, okh := s.extreme(fs, vs, z, hi)
	if !okl || !okh {
		x.st.Notes = append(x.st.Notes, "the S-curve has no peak on both sides of its centre within ±40 %: no peak separation")
		return
	}
	x.set("s_peak_lo", figure.Hertz, pl, bySCurvePeak)
	x.set("s_peak_hi", figure.Hertz, ph, bySCurvePeak)
	x.set("s_peak_sep", figure.Hertz, ph-pl, bySCurveSep)
}

// checkCentre flags a detector whose centre misses the declared IF by more
// than ifTolerance: a carrier on the IF then gives the detector a standing
// output, its audio and AFC off centre.
func (x *figCtx) checkCentre(z float64) {
	ifHz := x.w.c.Freqs["if"]
	if ifHz <= 0 || math.Abs(z-ifHz) <= ifTolerance*ifHz || math.Abs(z-ifHz) > 0.3*ifHz {
		return
	}
	dir := "above"
	if z < ifHz {
		dir = "below"
	}
	x.flag("the detector's centre (S-curve zero) is %s in circuit, %s %% %s the declared IF %s: a carrier on the IF is detected off centre",
		hz(z), figure.Plain(100*math.Abs(z-ifHz)/ifHz), dir, hz(ifHz))
}

// sCurveResp reads the S-curve: the node voltages for 1 A into the
// primary's hot end, solved on one elaboration: each secondary end and the
// net its diode's drive is read against (nil: chassis).
type sCurveResp struct{ v [4]*ac.Response }

// newSCurveResp solves V(s1), V(s2), V(r1), V(r2) (nets in that order).
func newSCurveResp(c *graph.Circuit, hot string, nets [4]string) (sCurveResp, bool) {
	rs := ac.NewResponses(c)
	var s sCurveResp
	for i, n := range nets {
		if n == "" {
			continue // chassis: V = 0
		}
		r, err := rs.Transimpedance(hot, n, gangMid.options())
		if err != nil {
			return s, false
		}
		s.v[i] = r
	}
	return s, s.v[0] != nil && s.v[1] != nil
}

// at is S(f) = |V(s1) − V(r1)| − |V(s2) − V(r2)|, NaN where it fails.
func (s sCurveResp) at(f float64) float64 {
	var v [4]complex128
	for i, r := range s.v {
		if r == nil {
			continue
		}
		z, err := r.At(f)
		if err != nil {
			return math.NaN()
		}
		v[i] = z
	}
	return cmplx.Abs(v[0]-v[2]) - cmplx.Abs(v[1]-v[3])
}

// tunedPair is the match's "xfmr" with its first two coils: the circuit
// index, the part and the coils' indices; ok is false for a transformer
// of fewer than two windings or a mains transformer, which no tuned-pair
// calc reads (the double-tuned pair and the FM discriminator share it).
func (x *figCtx) tunedPair() (ci int, p *graph.Part, as []int, ok bool) {
	i := x.index(x.spec.Args["xfmr"][0])
	if i < 0 {
		return 0, nil, nil, false
	}
	ci, as = x.m.parts[i], x.m.coils[i]
	if len(as) < 2 || x.notMainsTuned(ci) {
		return 0, nil, nil, false
	}
	return ci, x.w.parts[ci], as, true
}
