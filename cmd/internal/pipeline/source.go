package pipeline

import (
	"fmt"

	"pare/graph"
	"pare/graph/ac"
	"pare/graph/figure"
)

// An oscillator is the source of its own signal: a circuit whose active
// device starts by its loop (the return ratio of its controlled source at
// 0° of loop phase above 0 dB, ac.FindLoop, the test the stage recognition
// and the DC chart use) needs no declared input. graph.Check cannot solve
// a loop, so its warning is weighed here: for such a circuit it becomes a
// note that says why, which `check --strict` does not count; an amplifier
// with no input and no loop that starts keeps the warning.

// sourceGangs are the gang settings a loop is tried at: both ends and the
// middle (an oscillator that starts anywhere on the dial is one).
var sourceGangs = []float64{0, 0.5, 1}

// weighNoInput moves the no-input warning to r.Notes when a device of the
// circuit oscillates by its loop.
func (r *Result) weighNoInput() {
	at := -1
	for i, w := range r.Warnings {
		if w.Msg == graph.NoInputWarning {
			at = i
		}
	}
	if at < 0 {
		return
	}
	ref, f, db, ok := selfSource(r.Circuit)
	if !ok {
		return
	}
	r.Notes = append(r.Notes, &graph.Error{Pos: r.Warnings[at].Pos, Msg: fmt.Sprintf(
		"no signal input declared, and none needed: %s oscillates by its loop (0° of loop phase at %s, loop gain %+.1f dB), so it is the circuit's signal source",
		ref, figure.Format(f, figure.Hertz, figure.Text), db)})
	r.Warnings = append(r.Warnings[:at:at], r.Warnings[at+1:]...)
}

// selfSource is the first active part (in ref order) whose loop starts at
// some gang setting, with its best crossing.
func selfSource(c *graph.Circuit) (ref string, f, db float64, ok bool) {
	lp := ac.NewLoops(c)
	for _, p := range c.Parts {
		if !p.IsActive() {
			continue
		}
		for _, g := range sourceGangs {
			l, err := lp.Find(p.Ref, ac.LoopOptions{Options: ac.Options{VarFrac: g, VarSet: true}})
			if err == nil && l.F > 0 && l.MarginDB > 0 && (!ok || l.MarginDB > db) {
				ref, f, db, ok = p.Ref, l.F, l.MarginDB, true
			}
		}
		if ok {
			return ref, f, db, ok
		}
	}
	return "", 0, 0, false
}
