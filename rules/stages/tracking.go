package stages

import (
	"errors"
	"fmt"
	"math"
	"slices"
	"strings"

	"pare/graph"
	"pare/graph/figure"
)

// The tracking figures of a ganged frequency changer, by the names a
// figure's origin gives them (docs/references.md §2; numerical solutions).
// The solver's walk is the figure; the parts' formula is its cross-check.
var (
	byTrackError    = figure.ByFormula("fosc − (fsig + IF) on the tanks' own parts, worst over the dial")
	byTrackAt       = figure.ByFormula("fsig where the tracking error is worst")
	byTrackFit      = figure.ByFormula("fosc = fsig + IF on the tanks' own parts, crossings over the dial")
	byThreePoint    = figure.ByFormula("three-point tracking at 6 %, 49 % and 91.5 % of the signal range, on the tanks' own parts")
	byThreePointInC = figure.ByFormula("three-point tracking at 6 %, 49 % and 91.5 % of the signal range in circuit, signal tank fitted to its ends in circuit, oscillator tank's own parts (strays across it not counted)")
	trackWhat       = "fosc − (fsig + IF), each the peak of |Z| across its coil"
)

// trackWhatOf is how the solver's walk w found its two frequencies.
func trackWhatOf(w trackWalk) string {
	if w.oscDev == "" {
		return trackWhat
	}
	return "fosc − (fsig + IF), fosc where " + w.oscDev + "'s loop phase is 0°, fsig the peak of |Z| across the signal coil"
}

// trackingFormulaRefine is the bisection steps of the formula's crossings:
// the formula costs nothing, so to the bottom of float64.
const trackingFormulaRefine = 60

// tracking compares the oscillator tank osc (in the reduced circuit; oc
// its coil) with the signal tank ganged to it: in circuit by the solver
// (solveTracking), with the formula on the original parts beside it. Both
// sections turn together; capacitance is taken as linear in rotation (the
// gang's plate shape is not in the netlist).
func (x *figCtx) tracking(osc *tankModel, oc coilEnds, ifHz float64) {
	model := osc.original(oc, x.w.orig)
	gangCap := gangSection(model.caps)
	if gangCap == nil {
		return
	}
	sig := findGangTank(model.w, gangCap, model.caps)
	if sig == nil {
		return
	}
	formula, ok := formulaWalk(sig, model, ifHz)
	if !ok {
		return
	}
	walk, solvedOK := x.solveTracking(osc, sig, model, ifHz)
	var sv *trackWalk
	if solvedOK {
		sv = &walk
	}
	why := func() string { return trackWhy(sig, model, walk) }
	x.trackingError(formula, sv, ifHz, why)
	x.trackingFits(formula, sv, why)
	x.trackingNote(gangCap.Ref+" and "+sig.gangRef(gangCap.Gang), formula, sv, sig)
	if threePointAsCaptured(sv) {
		return
	}
	x.suggestDesign(sig, gangCap.Gang, ifHz, sv)
	if sv != nil {
		x.designInCircuit(osc, oc, gangCap, sig, ifHz, *sv)
	}
}

// formulaWalk is the formula's tracking walk of the signal tank sig and
// the oscillator tank osc (both on the same world), remembered on that
// world: the candidates the pattern search evaluates for one mixer (a
// pattern per topology, several bindings each) walk the same two tanks,
// each walk some 2,000 settings of two capacitor networks, and the walk
// depends on nothing but the tanks and the IF.
func formulaWalk(sig, osc *tankModel, ifHz float64) (trackWalk, bool) {
	k := formulaWalkKey{sig: sig.key(), osc: osc.key(), ifHz: ifHz}
	w := osc.w
	w.lazy.Lock()
	e, ok := w.walks[k]
	w.lazy.Unlock()
	if ok {
		return cloneWalk(e.walk), e.ok
	}
	// walked outside the lock: two stages asking at once both walk, to
	// the same result, and neither waits on the other's walk
	walk, ok := walkDial(func(th float64) (float64, float64, bool) { return sig.f(th), osc.f(th), true },
		ifHz, trackingScan, trackingFormulaRefine)
	w.lazy.Lock()
	if w.walks == nil {
		w.walks = map[formulaWalkKey]walkMemo{}
	}
	w.walks[k] = walkMemo{walk: walk, ok: ok}
	w.lazy.Unlock()
	return cloneWalk(walk), ok
}

// key names what the tank's formula reads on its world: its coil's
// inductance to the bit, its ends and its capacitors (the parts
// themselves, by address: the key lives only as long as the world).
func (t *tankModel) key() string {
	var b strings.Builder
	fmt.Fprintf(&b, "%x %d %d", math.Float64bits(t.l), t.a, t.b)
	for _, p := range t.caps {
		fmt.Fprintf(&b, " %p", p)
	}
	return b.String()
}

type formulaWalkKey struct {
	sig, osc string
	ifHz     float64
}

type walkMemo struct {
	walk trackWalk
	ok   bool
}

// cloneWalk is a copy of w that shares nothing with it.
func cloneWalk(w trackWalk) trackWalk {
	w.fits = slices.Clone(w.fits)
	return w
}

// trackWhy says what each coil resonates with in circuit at least
// capacitance against what the formula counts there.
func trackWhy(sig, osc *tankModel, walk trackWalk) string {
	c := func(l, f float64) string {
		return figure.Format(1/(math.Pow(2*math.Pi*f, 2)*l), figure.Farad, figure.Text)
	}
	oscWord := "the oscillator coil with"
	if walk.oscDev != "" {
		oscWord = "the oscillator runs as its coil would with"
	}
	return fmt.Sprintf("with the gang at least capacitance the signal coil resonates in circuit with %s (formula %s) and %s %s (formula %s): strays and loads the formula leaves out move the tracking",
		c(sig.l, walk.fs[0]), c(sig.l, sig.f(0)), oscWord, c(osc.l, walk.fo[0]), c(osc.l, osc.f(0)))
}

// hzList writes frequencies as prose: "600 kHz, 1.1 MHz and 1.6 MHz".
func hzList(fs []float64) string {
	return figure.Points(fs, figure.Hertz, figure.Text)
}

// trackingError writes the worst error of the oscillator against signal +
// IF over the dial, and where on the dial it is: the solver's walk (sv; nil
// when it did not solve) with the formula's beside it. It flags the error
// when it is large.
func (x *figCtx) trackingError(formula trackWalk, sv *trackWalk, ifHz float64, why func() string) {
	errFig := func(w trackWalk, o figure.Origin) *figure.Figure {
		at := figure.Figure{Name: "track_err_at", Unit: figure.Hertz, Value: w.worstAt, Origin: byTrackAt}
		if o.Source == figure.Solver {
			at.Origin = o
		}
		return &figure.Figure{Name: "track_err_max", Unit: figure.Hertz, Value: w.worst, At: &at, Origin: o}
	}
	check := errFig(formula, byTrackError)
	worst := formula
	var solved *figure.Figure
	if sv != nil {
		solved, worst = errFig(*sv, figure.BySolver(trackWhatOf(*sv), gangWalk)), *sv
	}
	x.putChecked(solved, check, why)
	if sv != nil && sv.bwAtWorst > 0 {
		x.put(figure.Figure{Name: "track_bw", Unit: figure.Hertz, Value: sv.bwAtWorst,
			Origin: figure.BySolver("−3 dB width of |Z| across the signal tank at the setting of the worst error", "that gang setting")})
	}
	if why := mistracks(worst, ifHz); why != "" {
		x.flag("oscillator tracking is off by up to %s (the oscillator %s, at %s on the dial): %s; %s", hz(math.Abs(worst.worst)),
			highLow(worst.worst), hz(worst.worstAt), why, trackingCure(worst))
	}
}

// mistracks says why a tracking error is too large, or "". Two lines,
// either enough (common practice, no source): the error must stay well
// inside the IF pass-band, 2 % of the IF (9 kHz at 455 kHz); and the
// station the oscillator brings to the IF must fall inside the signal
// tank's own −3 dB band, half its loaded bandwidth either side of its
// peak, or the tank passes it more than 3 dB down.
func mistracks(w trackWalk, ifHz float64) string {
	e := math.Abs(w.worst)
	switch {
	case w.bwAtWorst > 0 && e > w.bwAtWorst/2:
		return fmt.Sprintf("%s times the signal tank's loaded bandwidth there (%s in circuit), so the station heard lies outside that tank's −3 dB band and the set loses sensitivity", figure.Plain(e/w.bwAtWorst), hz(w.bwAtWorst))
	case e > 0.02*ifHz:
		return fmt.Sprintf("more than 2 %% of the IF (%s)", hz(0.02*ifHz))
	}
	return ""
}

// highLow words the sign of a tracking error fosc − (fsig + IF).
func highLow(e float64) string {
	if e < 0 {
		return "low"
	}
	return "high"
}

// trackingCure says what sets a tracking error right. A set that already
// tracks at three points is a three-point design: its error between and
// beyond them is the design's own, and the end that strays is set by that
// end's adjuster (common practice: the oscillator trimmer at the top of
// the dial, the padder or the coil's core at the bottom), not by new parts.
func trackingCure(w trackWalk) string {
	if len(w.fits) < 3 {
		return "check the padder and trimmers"
	}
	if w.worstTh < 0.5 { // setting 0 is the gang at least capacitance: the top
		return "it tracks exactly at three points, so align the oscillator trimmer at the top of the dial before any part is changed"
	}
	return "it tracks exactly at three points, so align the padder or the oscillator coil's core at the bottom of the dial before any part is changed"
}

// threePointAsCaptured: the solver's walk crosses three times, so the set
// as captured is already a three-point design and a suggested one would
// only move its points.
func threePointAsCaptured(sv *trackWalk) bool { return sv != nil && len(sv.fits) >= 3 }

// gangWalk is where the solver's tracking figures were solved.
var gangWalk = fmt.Sprintf("%d gang settings over the travel", trackSettings+1)

// trackingFits writes where the set tracks exactly: the solver's crossings
// with the formula's beside them. Where the solver finds none, there is no
// figure (the note says so): the formula's would claim what the circuit
// does not do.
func (x *figCtx) trackingFits(formula trackWalk, sv *trackWalk, why func() string) {
	var check *figure.Figure
	if len(formula.fits) > 0 {
		check = &figure.Figure{Name: "track_fit", Unit: figure.Hertz, Points: formula.fits, Origin: byTrackFit}
	}
	if sv == nil {
		x.putChecked(nil, check, nil)
		return
	}
	if len(sv.fits) == 0 {
		return
	}
	solved := &figure.Figure{Name: "track_fit", Unit: figure.Hertz, Points: sv.fits,
		Origin: figure.BySolver("fosc = fsig + IF, crossings of "+trackWhatOf(*sv), gangWalk)}
	x.putChecked(solved, check, why)
}

// trackingNote says in words where the set tracks: in circuit, and by the
// parts' formula, and where a suggested design would.
func (x *figCtx) trackingNote(sections string, formula trackWalk, sv *trackWalk, sig *tankModel) {
	where := func(fits []float64) string {
		if len(fits) == 0 {
			return "nowhere on the dial"
		}
		return "at " + hzList(fits)
	}
	text := "the fitted set tracks exactly " + where(formula.fits)
	if sv != nil {
		text = "in circuit the set tracks exactly " + where(sv.fits) + "; by the formula on its parts alone, " + where(formula.fits)
	}
	lo, hi := sig.f(1), sig.f(0)
	if sv != nil {
		lo, hi = sv.fs[1], sv.fs[0]
	}
	ideal := TrackingPoints(lo, hi)
	design := "a suggested three-point design would be exact at " + hzList(ideal[:])
	if threePointAsCaptured(sv) {
		design = "as captured it is a three-point design already, so pare suggests none"
	}
	x.st.Notes = append(x.st.Notes, fmt.Sprintf("tracking: %s turn together, capacitance taken as linear in rotation; %s; %s",
		sections, text, design))
}

// suggestDesign writes the oscillator coil, trimmer and padder that would
// track exactly at the three customary points of the signal range: the
// signal tank as the solver finds it (its coil and fixed capacitance
// fitted to its two ends in circuit; sv nil: its own parts), the
// oscillator tank's own parts alone.
func (x *figCtx) suggestDesign(sig *tankModel, gangName string, ifHz float64, sv *trackWalk) {
	var gang *graph.Part
	for _, p := range sig.caps {
		if p.Gang == gangName && p.Type == graph.CapVariable {
			gang = p
		}
	}
	if gang == nil {
		return
	}
	l := sig.l
	fixed := capBetween(sig.w, sig.caps, sig.a, sig.b, 0) - gang.Capacitance(0)
	pts := TrackingPoints(sig.f(1), sig.f(0))
	o := byThreePoint
	if sv != nil {
		// L(Cg+Ct) = 1/ω² at both ends: two equations in L and Ct
		inv := func(f float64) float64 { return 1 / math.Pow(2*math.Pi*f, 2) }
		l = (inv(sv.fs[1]) - inv(sv.fs[0])) / (gang.Capacitance(1) - gang.Capacitance(0))
		fixed = inv(sv.fs[0])/l - gang.Capacitance(0)
		pts, o = TrackingPoints(sv.fs[1], sv.fs[0]), byThreePointInC
	}
	sol, err := ThreePoint(l, fixed, ifHz, pts)
	if err != nil {
		return
	}
	x.put(figure.Figure{Name: "track_f", Unit: figure.Hertz, Points: pts[:], Origin: o})
	x.set("pad_c", figure.Farad, sol.Padder, o)
	x.set("pad_trim", figure.Farad, sol.Trimmer, o)
	x.set("pad_l", figure.Henry, sol.L, o)
}

// trackingScan is how finely the formula's walk steps over the dial before
// it closes in on a crossing: fine enough that two crossings never fall in
// one step of a broadcast gang.
const trackingScan = 2000

// TrackingPoints are the three dial frequencies where a padded oscillator is
// made to track exactly: at 6 %, 49 % and 91.5 % of the signal range, which
// gives the customary 600, 1100 and 1600 kHz on a 530–1700 kHz band
// (docs/references.md §2; the fractions are ours).
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
	var cg, fo [3]float64
	for i, f := range pts {
		w := 2 * math.Pi * f
		cg[i] = 1/(w*w*ls) - ct
		fo[i] = f + ifHz
	}
	return threePointAt(cg, fo)
}

// threePointAt solves the oscillator coil, trimmer and padder that put the
// oscillator at fo[i] with the gang section at cg[i], i = 0..2 (the
// elimination ThreePoint describes).
func threePointAt(cg, fo [3]float64) (Padding, error) {
	var a [3]float64
	for i, f := range fo {
		wo := 2 * math.Pi * f
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
	t, ok := trimmerRoot(g, -lower*0.999)
	if !ok {
		return Padding{}, errors.New("no three-point solution")
	}
	l2 := (1/(cg[0]+t) - 1/(cg[1]+t)) / (a[0] - a[1])
	invCp := a[0]*l2 - 1/(cg[0]+t)
	if l2 <= 0 || invCp <= 0 {
		return Padding{}, errors.New("three-point solution is not physical")
	}
	return Padding{L: l2, Trimmer: t, Padder: 1 / invCp}, nil
}

// trimmerRoot finds the trimmer capacitance where g changes sign: a scan
// from lo (just above −min(Cg)) up to 1 nF of trimmer for the first sign
// change, then bisection to the bottom of float64.
func trimmerRoot(g func(float64) float64, lo float64) (float64, bool) {
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
		return 0, false
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
	return (lo + hi) / 2, true
}

// OscillatorAt is the frequency of a padded oscillator (see Padding) when the
// gang stands at cg.
func (p Padding) OscillatorAt(cg float64) float64 {
	c := cg + p.Trimmer
	return resonance(p.L, c*p.Padder/(c+p.Padder))
}
