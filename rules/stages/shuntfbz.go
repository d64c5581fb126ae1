package stages

import (
	"fmt"
	"math"

	"pare/graph"
	"pare/graph/figure"
)

// Overall shunt feedback into a control electrode the signal reaches
// through a coupling capacitor (patterns/amp-shunt-feedback-coupled.toml):
// a resistor Rf from a later point of the signal path (an output pair's
// midpoint) back to the driver's base or grid. With no series input
// resistor in the circuit the gain from the input is the source's business;
// what the feedback does in circuit is lower the impedance into the
// control electrode by the loop (Miller's theorem: Rf looks like
// Rf/(1 + |A|) to chassis, A the gain from the electrode to Rf's far end;
// handbook, from memory). The solver gives that impedance with Rf as wired
// and with its far end at chassis (the loop opened the loaded way, as for
// the other feedback calcs); negative feedback lowers it, and the ratio
// is the feedback in decibels. A resistor from the stage's own output or
// common lead is local: no figures, and the guard drops the match.
func init() {
	calcs["shunt-feedback-z"] = calc{args: []string{"device", "feedback"}, required: []string{"device", "feedback"}, fn: calcShuntFeedbackZ}
}

// minFeedbackShare is the least share of the device's output signal that
// Rf's far end must carry for Rf to bring signal back. A feedback point (an
// output pair's midpoint, a later stage's output) carries most of it: 0.73
// to 0.99 over the fixtures with such feedback (solved); a decoupled supply
// line carries only what its capacitor lets through (review21 b05's driver
// line: 0.05 %). A tenth splits the two with a wide margin on each side.
const minFeedbackShare = 0.1

var byMillerZ = figure.ByFormula("Zin = Rf/(1 + |A|) ∥ the rest (Miller's theorem)")

func calcShuntFeedbackZ(x *figCtx) {
	q, rf := x.part("device"), x.part("feedback")
	if q == nil || rf == nil || len(rf.Pins) != 2 || rf.Value.Max <= 0 {
		return
	}
	g := q.NetOf(q.PinWithRole(graph.RoleControl))
	fb := farEnd(rf, g)
	if g == "" || fb == "" || fb == q.NetOf(q.PinWithRole(graph.RoleOutput)) || fb == q.NetOf(q.PinWithRole(graph.RoleCommon)) {
		return
	}
	x.set("r_feedback", figure.Ohm, rf.Value.Max, figure.FromNetlist(rf.Ref))
	if !x.solve {
		return
	}
	b := x.w.c.BandOf(q)
	if b.Min <= 0 || b.Max <= b.Min {
		return
	}
	f := math.Sqrt(b.Min * b.Max)
	// the electrode's own input freed (seriesInputs), any input further
	// off held at 0 V as its source holds it
	c := freeInputs(x.solverCircuit(), seriesInputs(x.solverCircuit(), g)...)
	closed, ok1 := drivenZ(c, g, f)
	open, ok2 := drivenZ(feedbackOpened(c, rf, fb, x.w.names[groundNet]), g, f)
	a, ok3 := transferAt(c, g, fb, f)
	if !ok1 || !ok2 || !ok3 {
		x.st.unconfirmed = fmt.Sprintf("the solver gives no impedance at %s: the loop through %s is not confirmed", g, rf.Ref)
		return
	}
	if ao, ok := transferAt(c, g, q.NetOf(q.PinWithRole(graph.RoleOutput)), f); ok && math.Abs(a) < minFeedbackShare*math.Abs(ao) {
		// Rf's far end is a line a capacitor holds at AC ground: Rf is a
		// bias feed, and what little signal the line carries is ripple
		x.st.unconfirmed = fmt.Sprintf("in circuit %s carries ×%s of %s's signal, %s of what %s's %s carries: an AC-grounded line, so %s is a bias feed, not feedback",
			fb, figure.Plain(a), g, figure.Format(100*math.Abs(a/ao), figure.Ratio, figure.Text)+" %", q.Ref, outputWord(q), rf.Ref)
		return
	}
	if a >= 0 || closed >= open {
		// in phase at Rf's far end, or the impedance not lowered: the
		// loop is positive (or no loop), not negative feedback
		x.st.unconfirmed = fmt.Sprintf("in circuit %s brings back ×%s of %s's signal and takes the impedance there from %s to %s: no negative feedback",
			rf.Ref, figure.Plain(a), g, figure.Format(open, figure.Ohm, figure.Text), figure.Format(closed, figure.Ohm, figure.Text))
		return
	}
	at := hz(f) + ", " + gangMid.at
	zin := figure.Figure{Name: "z_in_fb", Unit: figure.Ohm, Value: closed, Origin: figure.BySolver("|Z| into "+g, at)}
	if rest := 1 / (1/open - 1/rf.Value.Max); rest > 0 {
		zm := rf.Value.Max / (1 + math.Abs(a))
		check := figure.Figure{Name: "z_in_fb", Unit: figure.Ohm, Value: zm * rest / (zm + rest), Origin: byMillerZ}
		zin.Check = &check
		if figure.Differs(closed, check.Value) {
			zin.Why = fmt.Sprintf("Miller's theorem takes the gain as real; in circuit the loop's phase at %s and what loads %s move it", hz(f), fb)
		}
	}
	x.put(zin)
	x.put(figure.Figure{Name: "z_in_open", Unit: figure.Ohm, Value: open,
		Origin: figure.BySolver("|Z| into "+g+" with "+rf.Ref+"'s far end at chassis", at)})
	x.st.Notes = append(x.st.Notes, fmt.Sprintf("%s brings %s's signal back to %s's %s in antiphase: the impedance there falls from %s to %s in circuit",
		rf.Ref, fb, q.Ref, ControlWord(q), figure.Format(open, figure.Ohm, figure.Text), figure.Format(closed, figure.Ohm, figure.Text)))
	// Blackman's impedance formula: with the electrode's own source open
	// the impedance there falls by |1 + T| (handbook, from memory; §49)
	check := figure.Figure{Value: 20 * math.Log10(open/closed), Origin: byBlackmanZ}
	x.putLoopFeedback(true, q, rf, fb, f, check, func() string {
		return fmt.Sprintf("the impedance with %s's far end at chassis is not quite the loop's own with T at 0: %s then loads %s", rf.Ref, rf.Ref, g)
	})
}

var byBlackmanZ = figure.ByFormula("feedback = 20·log10 of |Z| into the electrode with Rf's far end at chassis over the same as wired (Blackman: Z falls by |1 + T|)")

// seriesInputs are the declared inputs that reach net g through nothing
// but a chain of two-terminal passives (a coupling capacitor, a series
// input resistor), each inner net of the chain joining just the two parts
// either side: the electrode's own input. Held at 0 V such an input would
// short the electrode through the chain and hide the feedback, so it is
// freed. An input further off (behind a preamplifier) stays held at 0 V,
// as the source that drives it holds it: it sets how the earlier stages
// load the electrode and carry the overall loop (review22 b04: Q1's base
// held through C1 lets R19's feedback reach Q2's base through Q1's
// collector; ngspice with the input source in place, 73.8 Ω).
func seriesInputs(c *graph.Circuit, g string) []string {
	var out []string
	for _, in := range c.Inputs {
		if in == g || seriesPath(c, in, g, "", 4) {
			out = append(out, in)
		}
	}
	return out
}

// seriesPath tells whether net from reaches net to along two-terminal
// passives in series within depth parts, not turning back through the part
// it came by (skip); an inner net with a third connection ends the chain.
func seriesPath(c *graph.Circuit, from, to, skip string, depth int) bool {
	if depth == 0 {
		return false
	}
	conns := c.ConnsOf(from)
	if skip != "" && len(conns) != 2 {
		return false
	}
	for _, cn := range conns {
		p := cn.Part
		if p.Ref == skip || !p.IsTwoTerminal() || p.Kind == graph.Diode {
			continue
		}
		next := farEnd(p, from)
		if next == to || (next != "" && seriesPath(c, next, to, p.Ref, depth-1)) {
			return true
		}
	}
	return false
}
