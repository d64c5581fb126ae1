package align

import (
	"fmt"
	"regexp"
	"strings"

	"pare/graph"
	"pare/graph/safety"
	"pare/rules/stages"
)

// Every trimmer and adjustable core the set has is either turned by a
// numbered step or named, with why it has no step and what the trade
// turns it for. A guide that said "nothing to align" of a set with two
// trimmers, two cores and a gang, or left an IF can's core out, sent the
// repairer to the bench with half the procedure missing.

// adjustable reports whether a part is turned in alignment: a trimmer
// capacitor (an adjustable padder is one) or a part with a core.
func adjustable(p *graph.Part) bool {
	return p.Type == graph.CapTrimmer || len(p.Adjust) > 0
}

// account adds to LeftOut each adjustable part no step turns and no
// tracking note names, grouped by the tuning capacitor whose tank holds
// it; a band's own parts are left to AddBands.
func (g *Guide) account(c *graph.Circuit, sts []stages.Stage) {
	turned := map[string]bool{}
	for _, s := range g.Steps {
		turned[s.Part] = true
	}
	left := map[string]bool{}
	var order []*graph.Part
	off := switchedOut(c)
	for _, p := range c.Parts {
		if !adjustable(p) || turned[p.Ref] || g.band[p.Ref] || names(g.TrackNote, p.Ref) {
			continue
		}
		if off[p.Ref] {
			g.LeftOut = append(g.LeftOut, fmt.Sprintf("%s: switched out as captured (on another position of the wavechange switch): aligned with that band", adjusterName(p)))
			continue
		}
		left[p.Ref] = true
		order = append(order, p)
	}
	for _, vc := range c.Parts {
		if vc.Kind != graph.Capacitor || vc.Type != graph.CapVariable {
			continue
		}
		t := tankOn(c, vc)
		high, low := t.trimmer, lowSetter(t)
		if (high == nil || !left[high.Ref]) && (low == nil || !left[low.Ref]) {
			continue
		}
		g.LeftOut = append(g.LeftOut, g.tankLine(c, sts, t, high, low, left))
		for _, p := range []*graph.Part{high, low} {
			if p != nil {
				delete(left, p.Ref)
			}
		}
	}
	for _, p := range order {
		if left[p.Ref] {
			g.LeftOut = append(g.LeftOut, fmt.Sprintf("%s: no step: pare found no tuned circuit it sets at a frequency it knows (no IF can, no tracked or tuned tank with a range); set it as the set's own alignment data says", adjusterName(p)))
		}
	}
}

// switchedOut are the parts with a pin on a switch contact that is open at
// the switch's set position: another band's coils and trimmers, which
// AddBands aligns with the switch turned.
func switchedOut(c *graph.Circuit) map[string]bool {
	open := map[string]bool{}
	power := safety.PowerSwitches(c)
	for _, p := range c.Parts {
		pos := int(p.Set)
		if p.Kind != graph.Switch || pos < 1 || pos > len(p.Closes) || power[p.Ref] {
			continue // a power switch's open contacts switch out no band
		}
		closed := map[string]bool{}
		for _, pr := range p.Closes[pos-1] {
			for _, pin := range pr {
				closed[pin] = true
			}
		}
		for _, pin := range switchedPins(p) {
			if !closed[pin] {
				open[p.NetOf(pin)] = true
			}
		}
	}
	return partsOnNets(c, open)
}

// tankLine says how the usual method sets one tuned circuit's range (common
// practice: the trimmer at the top of the range with the capacitor near
// open, the core or adjustable padder at the bottom with it near meshed,
// repeated until both hold): an oscillator read on a counter, a signal
// circuit peaked for the largest output.
func (g *Guide) tankLine(c *graph.Circuit, sts []stages.Stage, t tank, high, low *graph.Part, left map[string]bool) string {
	top, bottom := "", ""
	what, watch := "tuned circuit", "peaking each for the largest output"
	if st, lo, hi := oscillatorOf(c, sts, t); st != "" {
		what = fmt.Sprintf("%s's oscillator, %s to %s as captured", st, hz(lo), hz(hi))
		watch = "reading the frequency on a counter"
		if g.IF == 0 && c.Band.Min > 0 && c.Band.Max > c.Band.Min {
			// An oscillator that is the set's output (a generator, a
			// VFO): its range is the declared band.
			top, bottom = " to "+hz(c.Band.Max), " to "+hz(c.Band.Min)
			watch += " (the declared band)"
		}
	} else if st, lo, hi := tankRange(sts, t.gang.Ref); st != "" {
		what = fmt.Sprintf("%s, %s to %s as captured", st, hz(lo), hz(hi))
		watch = "the generator at each end of the band, peaking each for the largest output"
	}
	var turn []string
	if high != nil && left[high.Ref] {
		turn = append(turn, fmt.Sprintf("with %s near open, set the top of the range%s with %s", t.gang.Ref, top, adjusterName(high)))
	}
	if low != nil && left[low.Ref] {
		turn = append(turn, fmt.Sprintf("with %s near fully meshed, the bottom%s with %s", t.gang.Ref, bottom, adjusterName(low)))
	}
	why := "a tuning capacitor of its own, no gang to track"
	if t.gang.Gang != "" {
		why = "no step sets it"
	}
	return fmt.Sprintf("%s (%s): no numbered step (%s); by the usual method %s, %s, %s; repeat until both ends hold", t.gang.Ref, what, why, practice, strings.Join(turn, "; "), watch)
}

// oscillatorOf is the stage whose oscillating loop the tank t tunes (one
// holding its capacitor, coil or trimmer) and the loop's range.
func oscillatorOf(c *graph.Circuit, sts []stages.Stage, t tank) (name string, lo, hi float64) {
	for i := range sts {
		st := &sts[i]
		if len(st.Loop) == 0 || !holdsAny(st, t.gang, t.coil, t.trimmer) {
			continue
		}
		if lo, hi := loopRange(st); hi > 0 {
			return st.Name, lo, hi
		}
	}
	return "", 0, 0
}

func holdsAny(st *stages.Stage, ps ...*graph.Part) bool {
	for _, p := range ps {
		if p == nil {
			continue
		}
		for _, ref := range st.Parts {
			if ref == p.Ref {
				return true
			}
		}
	}
	return false
}

// adjusterName is how the procedure names what is turned.
func adjusterName(p *graph.Part) string {
	if p.Kind == graph.Capacitor {
		return "trimmer " + p.Ref
	}
	return "the core of " + p.Ref
}

// names reports whether text names ref as a whole word.
func names(text, ref string) bool {
	return text != "" && regexp.MustCompile(`\b`+regexp.QuoteMeta(ref)+`\b`).MatchString(text)
}
