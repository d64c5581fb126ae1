package align

import (
	"fmt"
	"slices"

	"pare/graph"
	"pare/rules/stages"
)

// A grid forced alone inside an overall feedback loop passes next to
// nothing: the loop brings the output back into an earlier stage, which
// drives the rest of the chain against the forced grid (the other half of
// a push-pull pair in antiphase, a stage before it), so the output holds
// near still. That is the loop working, not a fault of the bias (review20
// a04: "passes only ×0.047 … see pare dc for the bias" for an output grid
// inside 20 dB of overall feedback; the reviewer's ngspice gives 0.0465
// with the loop closed). The solver confirms it: with the feedback
// resistor's far end put at chassis (the loop opened the loaded way, as
// the stage's own figure opens it) the same point passes at least
// loopCancels times more, and a generator's level there then gives the
// reference.

// loopCancels is how much more an opened loop must pass for the row to
// blame the loop: 10 dB (pare's choice: well past what the loop's
// loading alone moves; the a04 loop cancels some 19 dB at an output grid).
const loopCancels = 3.16

// feedbackCancels says why row in passes next to nothing when a stage's
// overall feedback loop holds it and opening the loop restores the
// passage; "" otherwise.
func feedbackCancels(c *graph.Circuit, sts []stages.Stage, in Injection) string {
	dist := netDistances(c)
	for _, s := range sts {
		if _, ok := s.Figures.Get("nfb"); !ok {
			continue
		}
		q := activeOf(c, s)
		if q == nil || dist(q.NetOf(q.PinWithRole(graph.RoleControl))) >= dist(in.Net) {
			continue // the point is not past the loop's injection
		}
		rf, far := feedbackPath(c, s, in, dist)
		if rf == nil {
			continue
		}
		opened := c.Clone()
		p := opened.Part(rf.Ref)
		for i := range p.Pins {
			if p.Pins[i].Net == far {
				p.Pins[i].Net = opened.GroundNet()
			}
		}
		h, err := Response(opened, in.Net, in.RefNet, in.Freq, in.Gang)
		closed := in.RefLevel / in.Level
		if err != nil || !(h > loopCancels*closed) || in.RefLevel/h > maxGenVolts {
			continue
		}
		return fmt.Sprintf("no figure: the reference (%s) would take %s here, more than a generator gives: the solver passes only ×%.3g from here to %s because the overall feedback (%s from %s back into %s's stage %s) works against a %s forced alone, not for a fault; with %s's far end at chassis (the loop opened) it passes ×%.3g and %s here gives the reference: inject before the loop (%s's %s), or open it to trace the stages inside",
			in.RefWhat, volts(in.Level), closed, in.RefNet, rf.Ref, far, q.Ref, s.Name, controlWordOn(c, in.Net), rf.Ref, h, volts(in.RefLevel/h), q.Ref, stages.ControlWord(q))
	}
	return ""
}

// activeOf is a stage's first active device.
func activeOf(c *graph.Circuit, s stages.Stage) *graph.Part {
	for _, ref := range s.Parts {
		if p := c.Part(ref); p != nil && p.IsActive() {
			return p
		}
	}
	return nil
}

// feedbackPath is the resistor that brings a later point's signal into
// stage s: one outside the stage with a pin on one of the stage's signal
// nets, its far end on the row's reference or a net no nearer the input
// than the row's point; with that far net.
func feedbackPath(c *graph.Circuit, s stages.Stage, in Injection, dist func(string) int) (*graph.Part, string) {
	nets := map[string]bool{}
	for _, ref := range s.Parts {
		if p := c.Part(ref); p != nil {
			for _, n := range netsOf(p) {
				if !c.RoleOf(n).IsACGround() {
					nets[n] = true
				}
			}
		}
	}
	for _, p := range c.Parts {
		if p.Kind != graph.Resistor || len(p.Pins) != 2 || slices.Contains(s.Parts, p.Ref) {
			continue
		}
		a, b := p.Pins[0].Net, p.Pins[1].Net
		if !nets[a] {
			a, b = b, a
		}
		if !nets[a] || nets[b] || c.RoleOf(b).IsACGround() {
			continue
		}
		if b == in.RefNet || dist(b) >= dist(in.Net) {
			return p, b
		}
	}
	return nil, ""
}

// controlWordOn is the control electrode's word ("grid", "base") of the
// active part whose control electrode is on net; "point" for none.
func controlWordOn(c *graph.Circuit, net string) string {
	for _, p := range c.Parts {
		if p.IsActive() && p.NetOf(p.PinWithRole(graph.RoleControl)) == net {
			return stages.ControlWord(p)
		}
	}
	return "point"
}
