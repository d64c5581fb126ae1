package stages

import (
	"math"
	"math/cmplx"
	"slices"

	"pare/graph"
	"pare/graph/ac"
)

// The amount of overall feedback is |1 + T|, T the loop's return ratio: a
// complex number, so a loop through transformers and coupling capacitors
// (each turning the phase towards the band's ends) has less feedback there
// than 1 + |T| says, and can have less than none (handbook feedback
// amplifier, Black's formula, from memory; docs/references.md §49). The
// loop is broken at the feedback resistor's far end, the usual loaded
// way: that end lifted off the output and driven by 1 V, a replica of the
// resistor (and of whatever stands across it: a phase-advance capacitor)
// loading the output to chassis so the output keeps its load, the
// circuit's declared inputs held at 0 V as a source of low impedance holds
// them. Where the output's own impedance is far below the resistor's (a
// speaker winding) this is the return ratio to well within the parts'
// tolerance.

// loopBreak is the circuit with the loop opened at rf's end on fb: that
// end (and the same end of every two-pin part in parallel with rf) moved
// to a new net, the drive, and replicas of those parts from fb to chassis.
// It returns the drive net's name.
func loopBreak(c *graph.Circuit, rf *graph.Part, fb, gnd string) (*graph.Circuit, string) {
	near := farEnd(rf, fb)
	across := func(p *graph.Part) bool { return len(p.Pins) == 2 && onBoth(p, near, fb) }
	drive := "loop~" + rf.Ref
	// the lifted parts are the clone's own copies, rewired before the
	// clone builds its connection index (on its first edit below)
	out := c.CloneSharing(across)
	var replicas []*graph.Part
	for _, p := range out.Parts {
		if !across(p) {
			continue
		}
		replica := p.Clone()
		replica.Ref = p.Ref + "~replica"
		for i := range p.Pins {
			if p.Pins[i].Net == fb {
				p.Pins[i].Net = drive
			} else {
				replica.Pins[i].Net = gnd
			}
		}
		for _, r := range out.Regions {
			if slices.Contains(r.Parts, p.Ref) {
				r.Parts = append(r.Parts, replica.Ref)
			}
		}
		replicas = append(replicas, replica)
	}
	if len(replicas) == 0 {
		return out, drive
	}
	out.EnsureNet(drive, rf.Pins[0].Pos)
	for _, r := range replicas {
		out.AddPart(r)
	}
	return out, drive
}

// onBoth says whether a two-pin part joins nets a and b.
func onBoth(p *graph.Part, a, b string) bool {
	n0, n1 := p.Pins[0].Net, p.Pins[1].Net
	return (n0 == a && n1 == b) || (n0 == b && n1 == a)
}

// loopReturn is the solved loop of rf back to fb: T = −V(fb)/V(drive) with
// the loop broken at rf's far end (positive real for pure negative
// feedback), as a response to read at any frequency.
type loopReturn struct{ r *ac.Response }

func newLoopReturn(c *graph.Circuit, rf *graph.Part, fb, gnd string) (loopReturn, bool) {
	broken, drive := loopBreak(c, rf, fb, gnd)
	r, err := ac.NewTransfer(broken, drive, fb, gangMid.options())
	if err != nil {
		return loopReturn{}, false
	}
	return loopReturn{r}, true
}

// at is T at f.
func (l loopReturn) at(f float64) (complex128, bool) {
	h, err := l.r.At(f)
	if err != nil || cmplx.IsNaN(h) || cmplx.IsInf(h) {
		return 0, false
	}
	return -h, true
}

// feedbackDB is 20·log10|1 + T|: the amount of feedback, negative where
// the loop's phase has turned so far that it raises the gain.
func feedbackDB(t complex128) float64 { return 20 * math.Log10(cmplx.Abs(1+t)) }
