package align

import (
	"fmt"
	"math"

	"pare/graph"
	"pare/rules/stages"
)

// A lone tuned oscillator (a VFO, a bench generator's: no mixer, no IF) is
// aligned by its coverage (common practice: the inductance at the low end
// of the dial, the capacitance at the high end, repeated, since each pulls
// the other): its tuning capacitor fully open, the trimmer across the tank
// sets the top; fully meshed, the coil's core sets the bottom. The ends are
// the circuit's declared band where it gives one, else the oscillator's own
// range as the solver finds it with the parts as captured; a frequency
// counter on the output reads them, no generator needed.

// calibrate adds the coverage steps of the first stage whose loop runs
// across a tuning capacitor's travel, when the set has no mixer.
func (g *Guide) calibrate(c *graph.Circuit, sts []stages.Stage) {
	if mixerStage(sts) != nil || len(g.Steps) > 0 {
		return
	}
	for i := range sts {
		lo, hi := loopRange(&sts[i])
		if !(hi > lo) {
			continue
		}
		coil, tuner := tankOf(c, sts[i])
		if coil == nil || tuner == nil {
			continue
		}
		g.coverageSteps(c, &sts[i], coil, tuner, lo, hi)
		return
	}
}

// tankOf is a stage's tank coil (the first inductor or transformer it
// holds) and the variable capacitor across it in the circuit as captured.
func tankOf(c *graph.Circuit, st stages.Stage) (coil, tuner *graph.Part) {
	for _, ref := range st.Parts {
		if p := c.Part(ref); p != nil && (p.Kind == graph.Inductor || p.Kind == graph.Transformer) {
			coil = p
			break
		}
	}
	if coil == nil {
		return nil, nil
	}
	nets := netsOf(coil)
	for _, p := range c.Parts {
		if p.Kind != graph.Capacitor || p.Type != graph.CapVariable {
			continue
		}
		for _, n := range netsOf(p) {
			if !c.RoleOf(n).IsACGround() && contains(nets, n) {
				return coil, p
			}
		}
	}
	return coil, nil
}

// coverageNear is how near the declared band's ends the oscillator's range
// as captured must lie for the band to be taken as the coverage it is set
// to: a trimmer and a core pull a tank some per cent, not a band apart
// (common practice).
const coverageNear = 0.05

func near(a, b float64) bool { return math.Abs(a-b) <= coverageNear*b }

func contains(ns []string, n string) bool {
	for _, m := range ns {
		if m == n {
			return true
		}
	}
	return false
}

// coverageSteps adds the trimmer at the top and the core at the bottom
// (either missing: a warning), read on a counter at the output.
func (g *Guide) coverageSteps(c *graph.Circuit, st *stages.Stage, coil, tuner *graph.Part, lo, hi float64) {
	out := "the oscillator's output"
	if len(c.Outputs) > 0 {
		out = "net " + c.Outputs[0]
	}
	wantLo, wantHi, from := lo, hi, fmt.Sprintf("%s's loop as captured, %s to %s", st.Name, hz(lo), hz(hi))
	if b := c.Band; b.Min > 0 && b.Max > b.Min {
		if near(lo, b.Min) && near(hi, b.Max) {
			wantLo, wantHi = b.Min, b.Max
			from = fmt.Sprintf("the circuit's declared band; as captured %s's loop runs %s to %s", st.Name, hz(lo), hz(hi))
		} else {
			from += fmt.Sprintf("; the declared band, %s to %s, is not within %.0f %% of it, so the steps keep the coverage as captured", hz(b.Min), hz(b.Max), 100*coverageNear)
		}
	}
	trims := trimmersOn(c, netsOf(coil))
	core := coreOf(coil)
	if len(trims) == 0 && core == nil {
		return // nothing on the tank turns: a fixed oscillator
	}
	first := len(g.Steps)
	if tr := trims; len(tr) > 0 {
		g.Steps = append(g.Steps, Step{Phase: "oscillator", Part: tr[0].Ref, What: "oscillator trimmer " + tr[0].Ref, Freq: wantHi, Osc: wantHi, Counter: out,
			Watch: fmt.Sprintf("set %s fully open (the high end) and turn %s until the counter reads %s", tuner.Ref, tr[0].Ref, hz(wantHi)), From: from})
		g.trimmerReach(tr[0], coil, hi, wantHi)
	} else {
		g.Warnings = append(g.Warnings, fmt.Sprintf("no trimmer is captured across %s: the top of the coverage cannot be set", coil.Ref))
	}
	if core != nil {
		g.Steps = append(g.Steps, Step{Phase: "oscillator", Part: core.Ref, What: describe(core), Freq: wantLo, Osc: wantLo, Counter: out,
			Watch: fmt.Sprintf("set %s fully meshed (the low end) and turn the core of %s until the counter reads %s", tuner.Ref, core.Ref, hz(wantLo)), From: from})
	} else {
		g.Warnings = append(g.Warnings, fmt.Sprintf("no adjustable core is captured on %s (add adjust = \"core\" if it has one): the bottom of the coverage cannot be set", coil.Ref))
	}
	if len(g.Steps)-first == 2 {
		g.Repeat = append(g.Repeat, "repeat the two oscillator steps until both ends hold: each pulls the other (common practice)")
	}
}

// trimmerReach warns when the trimmer cannot bring the top of the coverage
// to want: the tank's capacitance at the top, taken from the coil's
// inductance and the loop's top hi (C = 1/((2πf)²L), handbook; the strays
// and the divider included, so an estimate), less what the trimmer gives
// up from its setting to its least, or plus what it adds to its most.
func (g *Guide) trimmerReach(tr, coil *graph.Part, hi, want float64) {
	l := coil.Inductance()
	if l <= 0 || tr.Set <= 0 || hi <= 0 || tr.Value.Max <= tr.Value.Min {
		return
	}
	c := 1 / (math.Pow(2*math.Pi*hi, 2) * l)
	top := hi * math.Sqrt(c/(c-(tr.Set-tr.Value.Min)))
	bottom := hi * math.Sqrt(c/(c+(tr.Value.Max-tr.Set)))
	switch {
	case want > top*(1+bandSlack):
		g.Warnings = append(g.Warnings, fmt.Sprintf("%s at its least (%s) brings the top of the coverage only to about %s: the step's %s is beyond its reach (an estimate from %s's inductance); check the coil, the tuning capacitor's minimum and the band in the netlist",
			tr.Ref, pf(tr.Value.Min), hz(top), hz(want), coil.Ref))
	case want < bottom*(1-bandSlack):
		g.Warnings = append(g.Warnings, fmt.Sprintf("%s at its most (%s) brings the top of the coverage down only to about %s: the step's %s is beyond its reach (an estimate from %s's inductance); check the coil and the band in the netlist",
			tr.Ref, pf(tr.Value.Max), hz(bottom), hz(want), coil.Ref))
	}
}
