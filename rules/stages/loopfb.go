package stages

import (
	"fmt"
	"math"
	"math/cmplx"
	"strings"

	"pare/graph"
	"pare/graph/figure"
	"pare/graph/value"
)

// putLoopFeedback writes what the overall-feedback calcs share, solved
// with the loop broken at rf's end on fb (returnratio.go), on the circuit
// loopCircuit chooses, its declared inputs held at 0 V, or freed where
// free (the electrode's own source open, as an impedance is solved): the
// amount of feedback |1 + T| at f in decibels, with check (the calc's
// formula) beside it and why saying why they differ; the loop's phase and
// gain margins (loopmargin.go); and notes saying what T is at f, at the
// band's ends and 1 kHz, and where the margins were found. Where the
// solver gives no return ratio the stage is left unconfirmed and it
// returns false.
func (x *figCtx) putLoopFeedback(free bool, q, rf *graph.Part, fb string, f float64, check figure.Figure, why func() string) bool {
	c, where := x.loopCircuit(q, rf)
	if free {
		g := q.NetOf(q.PinWithRole(graph.RoleControl))
		c = freeInputs(c, seriesInputs(c, g)...)
	}
	loop, ok := newLoopReturn(c, rf, fb, x.w.names[groundNet])
	t, ok2 := loop.at(f)
	if !ok || !ok2 {
		x.st.unconfirmed = fmt.Sprintf("the solver gives no return ratio for the loop through %s broken at %s", rf.Ref, fb)
		return false
	}
	at := hz(f) + ", " + gangMid.at
	nfb := figure.Figure{Name: "nfb", Unit: figure.Decibel, Value: feedbackDB(t),
		Origin: figure.BySolver("20·log10|1 + T|, T the return ratio on "+where+": "+rf.Ref+"'s end on "+fb+" lifted and driven, a replica of it loading "+fb+", "+inputsWord(free), at)}
	check.Name, check.Unit = "nfb", figure.Decibel
	nfb.Check = &check
	if figure.Differs(nfb.Value, check.Value) {
		nfb.Why = why()
	}
	x.put(nfb)
	band := x.w.c.BandOf(q)
	x.st.Notes = append(x.st.Notes, loopNote(loop, t, f, band))
	below, above, ok := loop.margins(f, band.Min, band.Max)
	if !ok {
		x.st.Notes = append(x.st.Notes, fmt.Sprintf("the solver could not sweep the loop through %s: no stability margin is stated", rf.Ref))
		return true
	}
	x.putMargins(rf, below, above, band.Min/marginReach, band.Max*marginReach)
	return true
}

// loopCircuit is the circuit a feedback loop is solved on, and its name
// in an origin: the circuit as captured where it holds rf between the
// same nets and q (the reduction is proven over the band, not three
// decades past it: a decoupler it took for AC ground turns the loop's
// phase below the band, where its margin is read), else the solver's.
func (x *figCtx) loopCircuit(q, rf *graph.Part) (*graph.Circuit, string) {
	if x.w.orig != nil {
		oc := x.w.orig.c
		p, d := oc.Part(rf.Ref), oc.Part(q.Ref)
		if p != nil && d != nil && len(p.Pins) == 2 && onBoth(p, rf.Pins[0].Net, rf.Pins[1].Net) {
			return oc, "the circuit as captured"
		}
	}
	return x.solverCircuit(), "the reduced circuit"
}

// inputsWord says how the loop's solve treats the declared inputs.
func inputsWord(free bool) string {
	if free {
		return "the electrode's own input freed"
	}
	return "the inputs held at 0 V"
}

// loopNote says what the loop is at f and how much feedback is left at
// the band's ends and at 1 kHz, so a reader comparing with a figure taken
// elsewhere sees how fast it moves.
func loopNote(l loopReturn, t complex128, f float64, band value.Range) string {
	s := fmt.Sprintf("the loop gain |T| at %s is %.3g, the returned signal %.0f° from antiphase: the feedback is 20·log10|1 + T|, not 1 + |T|",
		hz(f), cmplx.Abs(t), math.Abs(cmplx.Phase(t)*180/math.Pi))
	// the band's ends, and 1 kHz between them: where audio feedback is
	// usually quoted (common practice)
	points := []float64{band.Min}
	if band.Min < 1e3 && band.Max > 1e3 && math.Abs(f-1e3) > 1 {
		points = append(points, 1e3)
	}
	points = append(points, band.Max)
	var ends []string
	raises := false
	for _, e := range points {
		te, ok := l.at(e)
		if !ok {
			return s
		}
		ends = append(ends, fmt.Sprintf("%s at %s", figure.Format(feedbackDB(te), figure.Decibel, figure.Text), hz(e)))
		raises = raises || feedbackDB(te) < 0
	}
	s += "; it is " + strings.Join(ends, ", ")
	if raises {
		s += " (below 0 dB the loop raises the gain: the response peaks there)"
	}
	return s
}

// putMargins writes the loop's phase and gain margins, the smaller of the
// two sides' each, where the sweep from lo to hi found them, says in a
// note what each side does, and flags a loop whose phase has turned past
// 180° where |T| falls to 1: by Nyquist's test (a loop with no unstable
// poles of its own, as an amplifier's open loop is) it oscillates there.
func (x *figCtx) putMargins(rf *graph.Part, below, above marginSide, lo, hi float64) {
	sweep := "T swept from " + hz(lo) + " to " + hz(hi)
	put := func(name string, u figure.Unit, what string, v, f float64) {
		atFig := figure.Figure{Name: name + "_at", Unit: figure.Hertz, Value: f}
		x.put(figure.Figure{Name: name, Unit: u, Value: v, At: &atFig,
			Origin: figure.BySolver(what+", "+sweep, gangMid.at)})
	}
	if s, ok := worst(below, above, func(s marginSide) (float64, bool) { return s.pm, s.pmFound }); ok {
		put("phase_margin", figure.Degree, "180° − |phase of T| where |T| = 1", s.pm, s.pmAt)
	}
	if s, ok := worst(below, above, func(s marginSide) (float64, bool) { return s.gm, s.gmFound }); ok {
		put("gain_margin", figure.Decibel, "−20·log10|T| where the phase of T reaches 180°", s.gm, s.gmAt)
	}
	note := fmt.Sprintf("the loop's margins (%s): below the band %s; above it %s", sweep, below.words(), above.words())
	if above.pmFound || above.gmFound {
		// the models carry no interelectrode or junction capacitance
		// (docs/devices.md): what turns the phase above the band is
		// only what is drawn
		note += "; the solver has no interelectrode or junction capacitances, so the margin above the band is the drawn parts' alone, more than the set has"
	}
	x.st.Notes = append(x.st.Notes, note)
	for _, s := range []marginSide{below, above} {
		if s.pmFound && s.pm <= 0 {
			x.flag("the loop through %s has turned %s past 180° where its gain falls to 1 (%s): by its return ratio the amplifier is unstable and oscillates%s",
				rf.Ref, figure.Format(-s.pm, figure.Degree, figure.Text), hz(s.pmAt), oscillatesNear(s.over180At))
		}
	}
}

// worst is the side with the smaller margin of those that have one.
func worst(a, b marginSide, m func(marginSide) (float64, bool)) (marginSide, bool) {
	va, oka := m(a)
	vb, okb := m(b)
	switch {
	case oka && (!okb || va <= vb):
		return a, true
	case okb:
		return b, true
	}
	return marginSide{}, false
}

// words says what one side of the sweep found.
func (s marginSide) words() string {
	var parts []string
	switch {
	case s.pmFound:
		parts = append(parts, fmt.Sprintf("%s of phase margin where |T| crosses 1 at %s", figure.Format(s.pm, figure.Degree, figure.Text), hz(s.pmAt)))
	case s.peak < 1:
		parts = append(parts, fmt.Sprintf("|T| stays below 1 (at most %.3g): no phase margin to take", s.peak))
	default:
		parts = append(parts, fmt.Sprintf("|T| does not cross 1 (%.3g at %s, the end of the sweep): no phase margin found", s.end.mag(), hz(s.end.f)))
	}
	switch {
	case s.over180At > 0 && s.pmFound && s.pm > 0:
		parts = append(parts, fmt.Sprintf("the phase reaches 180° at %s with |T| above 1 and turns back: conditionally stable, it can burst into oscillation when the gain falls (overload, a weak device)", hz(s.over180At)))
	case s.over180At > 0:
		parts = append(parts, fmt.Sprintf("the phase passes 180° at %s with |T| above 1", hz(s.over180At)))
	}
	if s.gmFound {
		parts = append(parts, fmt.Sprintf("%s of gain margin where the phase reaches 180° at %s", figure.Format(s.gm, figure.Decibel, figure.Text), hz(s.gmAt)))
	} else {
		parts = append(parts, "its phase does not reach 180° with |T| below 1")
	}
	return strings.Join(parts, ", ")
}

// oscillatesNear says where an unstable loop runs: near the frequency its
// phase passed 180° with gain to spare (the loop's own frequency moves
// with the limiting that stops it growing), if the sweep found it.
func oscillatesNear(f float64) string {
	if f <= 0 {
		return ""
	}
	return " near " + hz(f) + ", where its phase passes 180° with |T| above 1"
}
