package stages

import (
	"fmt"
	"math"

	"pare/graph"
	"pare/graph/figure"
)

// Overall negative feedback into a stage's common lead
// (patterns/amp-common-feedback.toml): a resistor Rf from a later point of
// the signal path (an output transformer's secondary) to the top of the
// unbypassed part Ru of the stage's lead. The feedback in decibels is how
// far the loop lowers the gain from the stage's control electrode to Rf's
// far end: 20·log10(A open / A closed) = 20·log10(1 + Aβ) (handbook
// feedback amplifier, from memory; docs/references.md §38), with the loop
// opened the usual loaded way: Rf's far end put at chassis, so the lead
// and the output keep the load Rf puts on them. A DC-blocking capacitor in
// series with Rf is part of the path: the solver counts its reactance.
func init() {
	calcs["overall-feedback"] = calc{args: []string{"device", "feedback", "series", "lead", "bias", "bypass"}, required: []string{"device", "feedback", "lead"}, fn: calcOverallFeedback}
}

var byFeedbackFraction = figure.ByFormula("feedback = 20·log10(1 + |A|·β), β = Ru/(Ru + Rf), A the open-loop gain in circuit")

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
	at := hz(f) + ", " + gangMid.at
	fdb := 20 * math.Log10(math.Abs(open)/math.Abs(closed))
	check := figure.Figure{Name: "nfb", Unit: figure.Decibel, Value: 20 * math.Log10(1+math.Abs(open)*beta), Origin: byFeedbackFraction}
	nfb := figure.Figure{Name: "nfb", Unit: figure.Decibel, Value: fdb,
		Origin: figure.BySolver("20·log10 of V("+fb+")/V("+g+") with "+rf.Ref+"'s far end at chassis over the same closed", at)}
	nfb.Check = &check
	if figure.Differs(fdb, check.Value) {
		nfb.Why = fmt.Sprintf("the formula takes β from %s and %s alone; in circuit the valve's own cathode impedance (or the transistor's emitter's) shunts %s and the loop's phase is not 0° at %s",
			ru.Ref, rf.Ref, ru.Ref, hz(f))
	}
	x.put(nfb)
	x.put(figure.Figure{Name: "gain_open_loop", Unit: figure.Ratio, Value: open,
		Origin: figure.BySolver("V("+fb+")/V("+g+") with "+rf.Ref+"'s far end at chassis", at)})
	x.put(figure.Figure{Name: "gain_closed_loop", Unit: figure.Ratio, Value: closed,
		Origin: figure.BySolver("V("+fb+")/V("+g+")", at)})
	x.st.Notes = append(x.st.Notes, fmt.Sprintf("%s brings %s's signal back into %s's %s across %s (the feedback injection); %s is the stage's bias",
		rf.Ref, fb, q.Ref, electrodeWord(q), ru.Ref, x.biasRefs()))
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
