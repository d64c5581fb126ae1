package stages

import (
	"errors"
	"fmt"
	"math"
	"sort"

	"pare/graph"
	"pare/graph/figure"
)

// The tracking figures of a ganged frequency changer, by the names a
// figure's origin gives them (docs/references.md §2; numerical solutions).
var (
	byTrackError = figure.ByFormula("fosc − (fsig + IF), worst over the dial")
	byTrackAt    = figure.ByFormula("fsig where the tracking error is worst")
	byTrackFit   = figure.ByFormula("fosc = fsig + IF, crossings over the dial")
	byThreePoint = figure.ByFormula("three-point tracking at 6 %, 49 % and 91.5 % of the signal range")
)

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
	x.trackingError(sig, osc, ifHz)
	fitted := fittedTracking(sig.f, osc.f, ifHz)
	if len(fitted) > 0 {
		x.put(figure.Figure{Name: "track_fit", Unit: figure.Hertz, Points: fitted, Origin: byTrackFit})
	}
	fittedText := "the fitted set tracks exactly nowhere on the dial"
	if len(fitted) > 0 {
		fittedText = "the fitted set tracks exactly at " + hzList(fitted)
	}
	ideal := TrackingPoints(sig.f(1), sig.f(0))
	x.st.Notes = append(x.st.Notes, fmt.Sprintf("tracking: %s and %s turn together, capacitance taken as linear in rotation; %s; a suggested three-point design would be exact at %s",
		gangCap.Ref, sig.gangRef(gangCap.Gang), fittedText, hzList(ideal[:])))
	x.suggestDesign(sig, gangCap.Gang, ifHz)
}

// hzList writes frequencies as prose: "600 kHz, 1.1 MHz and 1.6 MHz".
func hzList(fs []float64) string {
	return figure.Points(fs, figure.Hertz, figure.Text)
}

// trackingError writes the worst error of the oscillator against signal +
// IF over the dial, and where on the dial it is, and flags it when it is
// large.
func (x *figCtx) trackingError(sig, osc *tankModel, ifHz float64) {
	worst, worstAt := 0.0, 0.0
	const steps = 100
	for i := 0; i <= steps; i++ {
		th := float64(i) / steps
		fs, fo := sig.f(th), osc.f(th)
		if e := fo - (fs + ifHz); math.Abs(e) > math.Abs(worst) {
			worst, worstAt = e, fs
		}
	}
	at := figure.Figure{Name: "track_err_at", Unit: figure.Hertz, Value: worstAt, Origin: byTrackAt}
	x.put(figure.Figure{Name: "track_err_max", Unit: figure.Hertz, Value: worst, At: &at, Origin: byTrackError})
	// Common practice, no source: tracking should stay well inside the IF
	// pass-band; 2 % of the IF (9 kHz at 455 kHz) is taken as the line.
	if math.Abs(worst) > 0.02*ifHz {
		x.flag("oscillator tracking is off by up to %s (at %s on the dial): check the padder and trimmers", hz(worst), hz(worstAt))
	}
}

// suggestDesign writes the oscillator coil, trimmer and padder that would
// track exactly at the three customary points of the signal tank's range.
func (x *figCtx) suggestDesign(sig *tankModel, gangName string, ifHz float64) {
	var gang *graph.Part
	for _, p := range sig.caps {
		if p.Gang == gangName && p.Type == graph.CapVariable {
			gang = p
		}
	}
	if gang == nil {
		return
	}
	fixed := capBetween(sig.w, sig.caps, sig.a, sig.b, 0) - gang.Capacitance(0)
	pts := TrackingPoints(sig.f(1), sig.f(0))
	sol, err := ThreePoint(sig.l, fixed, ifHz, pts)
	if err != nil {
		return
	}
	x.put(figure.Figure{Name: "track_f", Unit: figure.Hertz, Points: pts[:], Origin: byThreePoint})
	x.set("pad_c", figure.Farad, sol.Padder, byThreePoint)
	x.set("pad_trim", figure.Farad, sol.Trimmer, byThreePoint)
	x.set("pad_l", figure.Henry, sol.L, byThreePoint)
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
