package align

import (
	"fmt"
	"math"
	"slices"
	"strings"

	"pare/graph"
	"pare/rules/stages"
)

// Tracking of a set whose oscillator is a stage of its own (a triode
// oscillator beside a heptode mixer), found by its loop: the oscillator's
// range is the loop's (0° of loop phase in circuit at each gang setting),
// the signal range the aerial tank's in-circuit resonance. pare computes no
// exact-tracking crossings for such a pair, so the procedure aligns at the
// customary three-point tracking points of the signal range (6 % and
// 91.5 %, docs/references.md §2) and says so.

// tracking adds the tracking steps of a superhet with ganged tuning, or
// says plainly in the procedure why there are none: a ganged oscillator is
// never left without its trimmers named.
func (g *Guide) tracking(c *graph.Circuit, sts []stages.Stage) {
	g.band = bandParts(c)
	c = switched(c)
	gangs := gangSections(c)
	why := "pare recognised no oscillator tuned by the gang (no mixer-oscillator and no oscillator stage on " + refList(gangs) + ")"
	mix := mixerStage(sts)
	if mix != nil {
		if why = g.trackingSteps(c, mix); why == "" {
			return
		}
	}
	// A mixer fed by an oscillator of its own (a triode-heptode's triode)
	// holds no gang section: the oscillator stage, found with its loop,
	// is tracked instead. A mixer that holds one and failed for another
	// reason (sections that cannot be paired) keeps its reason.
	if osc := loopOscillator(c, sts); osc != nil && (mix == nil || oscTank(c, mix).gang == nil) {
		if why = g.loopTracking(c, sts, osc); why == "" {
			return
		}
	}
	// A set with no IF known (a tuned RF stage or a TRF set captured
	// alone) still has its ganged circuits to set against each other.
	if len(gangs) < 2 {
		return
	}
	g.TrackNote = fmt.Sprintf("tracking steps not generated: %s; adjust by the usual method (common practice): %s", why, usualMethod(c, gangs))
}

// loopOscillator is the first stage with a loop that oscillates and a
// ganged section among its parts or beside them (loopGang), as a copy
// that holds the section.
func loopOscillator(c *graph.Circuit, sts []stages.Stage) *stages.Stage {
	for i := range sts {
		// the loop first: withGang walks the circuit, and adds parts only
		oscillates := slices.ContainsFunc(sts[i].Loop, func(l stages.Loop) bool {
			_, _, _, _, ok := l.Range()
			return ok
		})
		if !oscillates {
			continue
		}
		if st := withGang(c, sts[i]); oscTank(c, &st).gang != nil {
			return &st
		}
	}
	return nil
}

// withGang is st with the gang section that tunes it added to its parts
// when the stage does not hold it: a section on one of the stage's nets,
// or across one fixed capacitor from it (the padder in series with the
// section, which the stage recognition names apart as part of the
// oscillator's loop).
func withGang(c *graph.Circuit, st stages.Stage) stages.Stage {
	nets := map[string]bool{}
	for _, ref := range st.Parts {
		p := c.Part(ref)
		if p == nil {
			continue
		}
		if p.Kind == graph.Capacitor && p.Gang != "" && p.Type == graph.CapVariable {
			return st
		}
		for _, n := range netsOf(p) {
			if !c.RoleOf(n).IsACGround() {
				nets[n] = true
			}
		}
	}
	// Every stage of a set asks this of every capacitor, so the pins are
	// read in place (netsOf's order, a repeated net asked again, which
	// changes nothing) rather than through a slice made per part.
	// A section reached only through the line its tank returns to (a
	// decoupled supply line the stage shares, tankGround) is no section
	// of this stage's tank: the line is AC ground for it.
	onNets := func(p *graph.Part) bool {
		return slices.ContainsFunc(p.Pins, func(pin graph.Pin) bool {
			return pin.Net != "" && nets[pin.Net] && !tankGround(c, pin.Net, p)
		})
	}
	for _, hop := range []bool{false, true} {
		for _, p := range c.Parts {
			if !hop || p.Kind != graph.Capacitor || len(p.Pins) != 2 || p.Type == graph.CapVariable {
				continue
			}
			for _, pin := range p.Pins {
				// never from a line the capacitor's bypass holds (a
				// decoupled supply line): no signal crosses from it
				if n := pin.Net; n != "" && nets[n] && !c.RoleOf(otherNet(p, n)).IsACGround() && !tankGround(c, n, p) {
					nets[otherNet(p, n)] = true
				}
			}
		}
		for _, p := range c.Parts {
			if p.Kind == graph.Capacitor && p.Gang != "" && p.Type == graph.CapVariable && onNets(p) {
				st.Parts = append(slices.Clone(st.Parts), p.Ref)
				return st
			}
		}
	}
	return st
}

// loopTracking adds the steps for the oscillator stage osc; it returns why
// it could not, or "".
func (g *Guide) loopTracking(c *graph.Circuit, sts []stages.Stage, osc *stages.Stage) string {
	ot := oscTank(c, osc)
	sig := sigTank(c, ot.gang)
	if sig.gang == nil {
		return "no signal section is ganged with " + ot.gang.Ref
	}
	sigSt, sMin, sMax := tankRange(sts, sig.gang.Ref)
	if sigSt == "" {
		return "no signal tank found on " + sig.gang.Ref
	}
	oMin, oMax := loopRange(osc)
	if oMin <= g.IF {
		return fmt.Sprintf("%s's loop runs at %s at its lowest, not above the IF", osc.Name, hz(oMin))
	}
	g.Ends = []End{
		{Where: "gang fully meshed (low end)", Sig: sMin, Osc: oMin},
		{Where: "gang fully open (high end)", Sig: sMax, Osc: oMax},
	}
	g.mistrack(osc.Name, sigSt, oMin, oMax, sMin, sMax)
	lo, hi, of := dialPoints(c, sigSt, sMin, sMax)
	from := fmt.Sprintf("the customary tracking points at 6 %% and 91.5 %% of %s (common practice, docs/references.md §2); oscillator %s: loop, 0° of loop phase",
		of, osc.Name)
	g.trackSteps(c, ot, lo, hi, from)
	return ""
}

// loopRange is the lowest and highest frequency of a stage's oscillating
// loops.
func loopRange(st *stages.Stage) (lo, hi float64) {
	lo = math.Inf(1)
	for _, l := range st.Loop {
		if fMin, fMax, _, _, ok := l.Range(); ok {
			lo, hi = math.Min(lo, fMin), math.Max(hi, fMax)
		}
	}
	return lo, hi
}

// tankRange is the name and tuning range of the stage that holds the gang
// section ref and is tuned across the gang ("f" as a range).
func tankRange(sts []stages.Stage, ref string) (name string, lo, hi float64) {
	for _, s := range sts {
		f, ok := s.Figures.Get("f")
		if !ok || f.Range == nil {
			continue
		}
		for _, p := range s.Parts {
			if p == ref {
				return s.Name, f.Range.Min, f.Range.Max
			}
		}
	}
	return "", 0, 0
}

// mistrack warns when the oscillator's range less the IF misses the
// aerial tank's range at either end by more than trackLimit of the IF.
func (g *Guide) mistrack(osc, sig string, oMin, oMax, sMin, sMax float64) {
	lo, hi := oMin-g.IF-sMin, oMax-g.IF-sMax
	worst, end := lo, "low"
	if math.Abs(hi) > math.Abs(lo) {
		worst, end = hi, "high"
	}
	if math.Abs(worst) <= trackLimit*g.IF {
		return
	}
	g.Warnings = append(g.Warnings, fmt.Sprintf("the set mistracks as captured: %s's range less the IF, %s to %s, misses the aerial circuit's range (%s), %s to %s, by %s at the %s end, more than %s (2 %% of the IF, common practice); the tracking steps must pull it in, else check the padder and the oscillator coil",
		osc, hz(oMin-g.IF), hz(oMax-g.IF), sig, hz(sMin), hz(sMax), hz(math.Abs(worst)), end, hz(trackLimit*g.IF)))
}

// gangSections are the ganged variable capacitors, in the circuit's order.
func gangSections(c *graph.Circuit) []*graph.Part {
	var out []*graph.Part
	for _, p := range c.Parts {
		if p.Kind == graph.Capacitor && p.Gang != "" && p.Type == graph.CapVariable {
			out = append(out, p)
		}
	}
	return out
}

// usualMethod names, section by section, what the repairer turns at each
// end of the dial when pare has no tracking figures.
func usualMethod(c *graph.Circuit, gangs []*graph.Part) string {
	var parts []string
	for _, gp := range gangs {
		t := oscTank(c, &stages.Stage{Parts: []string{gp.Ref}})
		var ends []string
		if t.trimmer != nil {
			ends = append(ends, t.trimmer.Ref+" at the high end")
		}
		if low := lowSetter(t); low != nil {
			ends = append(ends, "the "+describe(low)+" at the low end")
		}
		if len(ends) == 0 {
			parts = append(parts, "nothing adjustable is captured on "+gp.Ref)
			continue
		}
		parts = append(parts, "on "+gp.Ref+" "+strings.Join(ends, " and "))
	}
	return strings.Join(parts, "; ")
}

func refList(ps []*graph.Part) string {
	var refs []string
	for _, p := range ps {
		refs = append(refs, p.Ref)
	}
	if len(refs) == 0 {
		return "the gang"
	}
	return strings.Join(refs, ", ")
}
