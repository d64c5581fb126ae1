package stages

import (
	"fmt"

	"pare/graph"
	"pare/graph/figure"
)

// Overall negative feedback into a stage's common lead
// (patterns/amp-common-feedback.toml): a resistor Rf from a later point of
// the signal path (an output transformer's secondary) to the top of the
// unbypassed part Ru of the stage's lead. The feedback in decibels is
// 20·log10|1 + T|, T the loop's return ratio solved with the loop broken
// at Rf's far end (returnratio.go; docs/references.md §49), at the middle
// of the band; the formula 20·log10|1 + A·β| with β = Ru/(Ru + Rf) is its
// cross-check (handbook feedback amplifier, from memory; §38). The gains
// from the control electrode to Rf's far end with the loop closed and
// opened the usual loaded way (Rf's far end put at chassis, so the lead
// and the output keep the load Rf puts on them) are shown beside it. A
// DC-blocking capacitor in series with Rf is part of the path: the solver
// counts its reactance.
func init() {
	calcs["overall-feedback"] = calc{args: []string{"device", "feedback", "series", "lead", "bias", "bypass"}, required: []string{"device", "feedback", "lead"}, fn: calcOverallFeedback}
}

var byFeedbackFraction = figure.ByFormula("feedback = 20·log10|1 + A·β|, β = Ru/(Ru + Rf), A the complex open-loop gain in circuit")

func calcOverallFeedback(x *figCtx) {
	q, rf, ru := x.part("device"), x.part("feedback"), x.part("lead")
	if q == nil || rf == nil || ru == nil || len(rf.Pins) != 2 {
		return
	}
	k := q.NetOf(q.PinWithRole(graph.RoleCommon))
	g := q.NetOf(q.PinWithRole(graph.RoleControl))
	near := k
	if cs := x.part("series"); cs != nil && len(cs.Pins) == 2 {
		// a DC block between the lead and Rf: Rf's far end is past it
		near = farEnd(cs, k)
	}
	fb := farEnd(rf, near)
	if fb == "" || g == "" || fb == q.NetOf(q.PinWithRole(graph.RoleOutput)) {
		return // feedback from the stage's own output is local, not overall
	}
	beta := ru.Value.Max / (ru.Value.Max + rf.Value.Max)
	x.set("nfb_fraction", figure.Ratio, beta, figure.ByFormula("β = Ru/(Ru + Rf)"))
	if !x.solve {
		return
	}
	open, closed, f, ok := x.loopGains(q, rf, g, fb)
	if !ok {
		return
	}
	a, ok := transferAtC(feedbackOpened(x.solverCircuit(), rf, fb, x.w.names[groundNet]), g, fb, f)
	if !ok {
		x.st.unconfirmed = fmt.Sprintf("the solver gives no gain from %s to %s with the loop through %s opened", g, fb, rf.Ref)
		return
	}
	check := figure.Figure{Value: feedbackDB(a * complex(beta, 0)), Origin: byFeedbackFraction}
	why := func() string {
		return fmt.Sprintf("the formula takes β from %s and %s alone with %s's control electrode held; in circuit the valve's own cathode impedance (or the transistor's emitter's) shunts %s and the source driving %s moves with the returned signal",
			ru.Ref, rf.Ref, q.Ref, ru.Ref, g)
	}
	at := hz(f) + ", " + gangMid.at
	x.put(figure.Figure{Name: "gain_open_loop", Unit: figure.Ratio, Value: open,
		Origin: figure.BySolver("V("+fb+")/V("+g+") with "+rf.Ref+"'s far end at chassis", at)})
	x.put(figure.Figure{Name: "gain_closed_loop", Unit: figure.Ratio, Value: closed,
		Origin: figure.BySolver("V("+fb+")/V("+g+")", at)})
	x.st.Notes = append(x.st.Notes, fmt.Sprintf("%s brings %s's signal back into %s's %s across %s (the feedback injection); %s is the stage's bias",
		rf.Ref, fb, q.Ref, electrodeWord(q), ru.Ref, x.biasRefs()))
	x.putLoopFeedback(false, q, rf, fb, f, check, why)
}

// biasRefs names the bypassed part of the lead with its capacitor.
func (x *figCtx) biasRefs() string {
	b, c := x.part("bias"), x.part("bypass")
	if b == nil || c == nil {
		return "the rest of the lead"
	}
	return b.Ref + " bypassed by " + c.Ref
}

// feedbackOpened is c with the feedback resistor's far end moved from fb to
// chassis: the loop opened with its loading kept on the injection side.
func feedbackOpened(c *graph.Circuit, rf *graph.Part, fb, gnd string) *graph.Circuit {
	p := rf.Clone()
	for i := range p.Pins {
		if p.Pins[i].Net == fb {
			p.Pins[i].Net = gnd
		}
	}
	return withPart(c, p)
}

// OverallFeedbackTopology is the overall feedback loop named on its own
// (patterns/feedback-overall.toml): a resistor from a later stage's output
// to an earlier stage's lead. Sheets draw it as the loop's lead between
// the two stages, unframed: a frame round it alone took a row of its own
// and drew its two ends as a wire looping back on itself.
const OverallFeedbackTopology = "feedback-overall"
