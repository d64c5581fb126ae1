package align

import (
	"fmt"
	"math"
	"strings"

	"pare/graph"
	"pare/rules/stages"
)

// A delayed AGC holds its diode off with a standing DC (a bypassed cathode
// or bias point) until the IF's peak at the diode passes it: with the low
// generator level the IF steps ask for, the AGC line does not move, so it
// is no indicator. The delay is the stage's DC figure (the operating
// point's), and the carrier that passes it is solved: the delay over the
// AC solver's gain from where the generator goes to the diode's own side.

// delayedAGC is the delayed AGC diode's stage, its diode's own side (the
// net its load holds to chassis) and its delay in volts; ok false when the
// set has none with a solved delay.
func delayedAGC(c *graph.Circuit, sts []stages.Stage) (st *stages.Stage, side string, delay float64, ok bool) {
	for i := range sts {
		s := &sts[i]
		d, has := s.Figures.Get("delay")
		if s.Topology != "agc-diode-delayed" || !has || d.Value <= 0 {
			continue
		}
		// the load: the stage's resistor with one end on chassis
		for _, ref := range s.Parts {
			p := c.Part(ref)
			if p == nil || p.Kind != graph.Resistor || len(p.Pins) != 2 {
				continue
			}
			for i, pin := range p.Pins {
				if c.RoleOf(pin.Net) == graph.Ground {
					return s, p.Pins[1-i].Net, d.Value, true
				}
			}
		}
	}
	return nil, "", 0, false
}

// delayedWatch is what to watch on the IF steps of a set whose AGC is
// delayed, "" when it is not: the output meter or the detector's DC, with
// the carrier at into that passes the delay (solved at the IF).
func delayedWatch(c *graph.Circuit, sts []stages.Stage, into string, ifHz float64, agc string) string {
	st, side, delay, ok := delayedAGC(c, sts)
	if !ok || agc == "" {
		return ""
	}
	meter := "the output meter for a maximum"
	if det := detectorStage(c, sts); det != nil {
		meter += fmt.Sprintf(", or the detector's DC (%s%s) for its %s reading", det.Name, detOn(c, sts), detWord(detectorSign(c, sts)))
	}
	w := fmt.Sprintf("%s; not the AGC line (%s): the AGC is delayed (%s), and the line does not move until the IF's peak at the AGC diode (%s) passes the delay, %s (DC operating point)",
		meter, agc, st.Name, side, volts(delay))
	if into == "" {
		return w
	}
	g, err := Response(diodeOff(c, side), into, side, ifHz, 0.5)
	if err != nil || g <= 0 || math.IsNaN(g) || math.IsInf(g, 0) {
		return w
	}
	// an unmodulated carrier's peak is √2 times its RMS
	return w + fmt.Sprintf(", about %s RMS of unmodulated carrier at %s (gain ×%.3g to %s at the IF, AC solver, the diode held off); below that the line stays at its no-signal reading",
		volts(delay/(math.Sqrt2*g)), into, g, side)
}

// diodeOff is c with every diode lead on net side lifted: below the delay
// the AGC diode conducts nothing, so it loads the IF not at all (pare's
// AC model gives a diode its conducting resistance).
func diodeOff(c *graph.Circuit, side string) *graph.Circuit {
	m := c.CloneSharing(func(p *graph.Part) bool { return p.Kind == graph.Diode || p.Kind == graph.Valve })
	for _, p := range m.Parts {
		if p.Kind != graph.Diode && !(p.Kind == graph.Valve && strings.Contains(p.Type, "diode")) {
			continue
		}
		for i, pin := range p.Pins {
			if pin.Net == side {
				p.Pins[i].Net = side + "~off"
			}
		}
	}
	return m
}
