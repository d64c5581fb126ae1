package stages

import (
	"fmt"
	"math"

	"pare/graph"
	"pare/graph/figure"
)

// Overall shunt feedback (patterns/amp-shunt-feedback.toml): Rf from a
// later point of the signal path back to a device's control electrode, the
// signal coming in through Rin. With enough loop gain the control
// electrode is a virtual earth and the gain from Rin's far end to Rf's is
// −Rf/Rin (handbook inverting feedback amplifier, from memory;
// docs/references.md §38): that is the cross-check, the solver's figure on
// the circuit as wired is the one shown. The loop is opened the loaded way,
// as for feedback into a common lead: Rf's far end put at chassis. The
// amount of feedback is |1 + T|, T the return ratio with the loop broken at
// Rf's far end, with its margins (loopfb.go; §49).
func init() {
	calcs["shunt-feedback"] = calc{args: []string{"device", "input", "feedback"}, required: []string{"device", "input", "feedback"}, fn: calcShuntFeedback}
}

var byVirtualEarth = figure.ByFormula("gain = −Rf/Rin, the control electrode a virtual earth")

func calcShuntFeedback(x *figCtx) {
	q, rin, rf := x.part("device"), x.part("input"), x.part("feedback")
	if q == nil || rin == nil || rf == nil || len(rin.Pins) != 2 || len(rf.Pins) != 2 {
		return
	}
	g := q.NetOf(q.PinWithRole(graph.RoleControl))
	src, fb := farEnd(rin, g), farEnd(rf, g)
	if src == "" || fb == "" || g == "" || fb == src {
		return
	}
	// The pattern's two resistors have the same shape, and the matcher
	// keeps one binding of a set of parts: the input is the one whose far
	// end lies nearer the set's inputs, its drawing slot with it.
	ds, df := x.farDist(src, rin, rf), x.farDist(fb, rin, rf)
	if ds == df {
		return
	}
	if ds > df {
		rin, rf, src, fb = rf, rin, fb, src
		swapPlaces(x.st.Draw, rin.Ref, rf.Ref)
	}
	if fb == q.NetOf(q.PinWithRole(graph.RoleOutput)) || fb == q.NetOf(q.PinWithRole(graph.RoleCommon)) {
		x.st.unconfirmed = fmt.Sprintf("%s returns %s's own %s: local feedback, not overall", rf.Ref, q.Ref, fb)
		return
	}
	check := figure.Figure{Name: "gain_closed_loop", Unit: figure.Ratio, Value: -rf.Value.Max / rin.Value.Max, Origin: byVirtualEarth}
	x.set("nfb_fraction", figure.Ratio, rin.Value.Max/(rin.Value.Max+rf.Value.Max), figure.ByFormula("β = Rin/(Rin + Rf)"))
	if !x.solve {
		return
	}
	open, closed, f, ok := x.loopGains(q, rf, src, fb)
	if !ok {
		return
	}
	at := hz(f) + ", " + gangMid.at
	gain := figure.Figure{Name: "gain_closed_loop", Unit: figure.Ratio, Value: closed, Origin: figure.BySolver("V("+fb+")/V("+src+")", at)}
	gain.Check = &check
	if figure.Differs(closed, check.Value) {
		gain.Why = fmt.Sprintf("the formula takes the %s for a virtual earth; in circuit the loop gain is finite and what else hangs on %s (bias resistors, the device's own input) takes part of the signal",
			ControlWord(q), g)
	}
	x.put(gain)
	x.put(figure.Figure{Name: "gain_open_loop", Unit: figure.Ratio, Value: open,
		Origin: figure.BySolver("V("+fb+")/V("+src+") with "+rf.Ref+"'s far end at chassis", at)})
	x.st.Notes = append(x.st.Notes, fmt.Sprintf("%s brings %s's signal back to %s's %s, where it meets the input through %s: the gain is set by the two resistors",
		rf.Ref, fb, q.Ref, ControlWord(q), rin.Ref))
	// the formula's loop: the gain from the electrode to Rf's far end, the
	// loop opened, returned through the divider Rf and Rin make (an
	// inverting gain, so T = −A·β)
	a, ok := transferAtC(feedbackOpened(x.solverCircuit(), rf, fb, x.w.names[groundNet]), g, fb, f)
	if !ok {
		x.st.unconfirmed = fmt.Sprintf("the solver gives no gain from %s to %s with the loop through %s opened", g, fb, rf.Ref)
		return
	}
	beta := rin.Value.Max / (rin.Value.Max + rf.Value.Max)
	nfbCheck := figure.Figure{Value: feedbackDB(-a * complex(beta, 0)), Origin: byShuntFraction}
	x.putLoopFeedback(false, q, rf, fb, f, nfbCheck, func() string {
		return fmt.Sprintf("the formula returns the signal through %s and %s alone; in circuit what else hangs on %s (bias resistors, the device's own input) takes part of it, and what drives %s moves with it",
			rf.Ref, rin.Ref, g, src)
	})
}

var byShuntFraction = figure.ByFormula("feedback = 20·log10|1 − A·β|, β = Rin/(Rin + Rf), A the complex open-loop gain in circuit from the control electrode")

// farDist is netDist for a circuit net, leaving out the given parts.
func (x *figCtx) farDist(net string, skip ...*graph.Part) int {
	id, ok := x.w.netID[net]
	if !ok {
		return math.MaxInt
	}
	var idx []int
	for _, p := range skip {
		idx = append(idx, x.partIndex(p))
	}
	return x.netDist(id, idx...)
}

// lowersGain tells whether closing a loop took the gain from open to
// closed the way negative feedback does: open/closed = 1 + T with T the
// loop gain, so the two keep their sign and the closed gain is the
// smaller. A positive loop with T above 1 also gives a smaller gain, but of
// the opposite sign (1 − T < 0): that is no negative feedback.
func lowersGain(open, closed float64) bool {
	return closed != 0 && open/closed > 1
}

// swapPlaces trades the drawing slots of two parts.
func swapPlaces(pl []Place, a, b string) {
	for i := range pl {
		switch pl[i].Part {
		case a:
			pl[i].Part = b
		case b:
			pl[i].Part = a
		}
	}
}

// loopGains is the gain from net in to the feedback resistor rf's far end
// fb at the middle of q's band, with the loop opened (rf's far end at
// chassis) and closed as wired, and that middle frequency. Where the solver
// gives no gain, or the loop does not lower it as negative feedback does,
// the stage is left unconfirmed and ok is false.
func (x *figCtx) loopGains(q, rf *graph.Part, in, fb string) (open, closed, f float64, ok bool) {
	b := x.w.c.BandOf(q)
	if b.Min <= 0 || b.Max <= b.Min {
		return 0, 0, 0, false
	}
	f = math.Sqrt(b.Min * b.Max)
	c := x.solverCircuit()
	closed, ok1 := transferAt(c, in, fb, f)
	open, ok2 := transferAt(feedbackOpened(c, rf, fb, x.w.names[groundNet]), in, fb, f)
	if !ok1 || !ok2 || closed == 0 {
		x.st.unconfirmed = fmt.Sprintf("the solver gives no gain from %s to %s: the loop through %s is not confirmed", in, fb, rf.Ref)
		return 0, 0, 0, false
	}
	if !lowersGain(open, closed) {
		x.st.unconfirmed = fmt.Sprintf("in circuit %s raises the gain from %s to %s (×%s open, ×%s closed): no negative feedback",
			rf.Ref, in, fb, figure.Plain(open), figure.Plain(closed))
		return 0, 0, 0, false
	}
	return open, closed, f, true
}
