package align

import (
	"fmt"
	"math"

	"pare/graph"
)

// trapWindow is how near the IF a tuned circuit at the aerial input must
// resonate (its parts' formula, f = 1/(2π√(LC)), docs/references.md §1) to
// be taken for an IF trap: 5 %, wider than a trap's core range is off the
// mark but far short of the broadcast band (common practice, no source).
const trapWindow = 0.05

// trap is an IF rejector at the aerial input: a coil and a capacitor in
// series from the input to AC ground (a short to chassis at the IF), or in
// parallel in series with the aerial lead (an open circuit at the IF).
type trap struct {
	coil, cap *graph.Part
	f         float64 // the parts' formula resonance
	series    bool
}

// trapSteps adds the IF trap step after the IF cans (common practice: with
// the IF aligned, the generator at the IF into the aerial and the trap's
// core or trimmer turned for the least output), or warns when a trap is
// found that nothing on it adjusts. c is the circuit as its switches leave
// it (switched).
func (g *Guide) trapSteps(c *graph.Circuit) {
	if g.IF <= 0 || g.FM || len(c.Inputs) == 0 {
		return
	}
	for _, t := range ifTraps(c, c.Inputs[0], g.IF) {
		kind := "a parallel-tuned rejector in the aerial lead"
		if t.series {
			kind = "a series-tuned rejector from the aerial to chassis"
		}
		p := coreOf(t.coil)
		if p == nil && t.cap.Type == graph.CapTrimmer {
			p = t.cap
		}
		if p == nil {
			g.Warnings = append(g.Warnings, fmt.Sprintf("%s with %s is %s at %s (its parts' formula) but neither has an adjustment captured: add adjust = \"core\" to %s if it is slug tuned", t.coil.Ref, t.cap.Ref, kind, hz(t.f), t.coil.Ref))
			continue
		}
		what := "core of " + p.Ref
		if p.Kind == graph.Capacitor {
			what = "trimmer " + p.Ref
		}
		g.Steps = append(g.Steps, Step{Phase: "IF trap", Part: p.Ref, What: what + " (IF trap: " + kind + ")", Freq: g.IF,
			Into:  fmt.Sprintf("the aerial input (net %s) through a dummy aerial (common practice), generator well up", c.Inputs[0]),
			Watch: fmt.Sprintf("tune the set to the end of the dial nearest the IF (or a quiet spot), then turn %s for the least output: the trap then takes the IF out before the first grid", p.Ref),
			From:  fmt.Sprintf("the IF; %s with %s resonate at %s by their parts' formula f = 1/(2π√(LC))", t.coil.Ref, t.cap.Ref, hz(t.f))})
	}
}

// ifTraps finds the IF rejectors on net in: a plain coil and a fixed or
// trimmer capacitor tuned within trapWindow of the IF, either in series
// between in and AC ground (through one net between them) or both across
// in and one other net.
func ifTraps(c *graph.Circuit, in string, ifHz float64) []trap {
	var out []trap
	for _, l := range c.Parts {
		if l.Kind != graph.Inductor || len(l.Pins) != 2 || !hasNet(l, in) {
			continue
		}
		mid := otherNet(l, in)
		for _, cp := range c.Parts {
			if cp.Kind != graph.Capacitor || len(cp.Pins) != 2 || cp.Type == graph.CapVariable || !hasNet(cp, mid) {
				continue
			}
			far := otherNet(cp, mid)
			series := far != in && c.RoleOf(far).IsACGround() && !c.RoleOf(mid).IsACGround()
			parallel := far == in
			if !series && !parallel {
				continue
			}
			f := 1 / (2 * math.Pi * math.Sqrt(l.Inductance()*cp.Capacitance(0.5)))
			if math.Abs(f-ifHz) <= trapWindow*ifHz {
				out = append(out, trap{coil: l, cap: cp, f: f, series: series})
			}
		}
	}
	return out
}
