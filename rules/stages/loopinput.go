package stages

import (
	"fmt"
	"slices"
	"strings"

	"pare/graph"
	"pare/graph/ac"
)

// A declared input is where the repairer's generator goes, and the solver
// holds every input at 0 V while it solves a loop: an ideal source on an
// oscillator's own tank or feedback net shorts it, and the loop reads "does
// not oscillate" where the set, with no generator there, does. When a
// device's loop does not start and a declared input sits on a net of the
// stage, the loop is solved again with those inputs open; if it then
// starts, that is the loop the stage carries, and a flag says why.

// inputsOnStage are the declared inputs of c on a net of st's parts.
func inputsOnStage(c *graph.Circuit, st *Stage) []string {
	var on []string
	for _, ref := range st.Parts {
		p := c.Part(ref)
		if p == nil {
			continue
		}
		for _, pin := range p.Pins {
			if slices.Contains(c.Inputs, pin.Net) && !slices.Contains(on, pin.Net) {
				on = append(on, pin.Net)
			}
		}
	}
	slices.Sort(on)
	return on
}

// starts reports whether the loop has a 0° crossing with gain somewhere.
func starts(l Loop) bool {
	_, _, _, mMax, ok := l.Range()
	return ok && mMax >= 0
}

// loopInputsOpen is ref's loop solved with the declared inputs on st's nets
// open, and the flag that says so, when the loop as given does not start
// and the freed one does; ok is false otherwise.
func loopInputsOpen(c *graph.Circuit, st *Stage, ref string, l Loop) (Loop, string, bool) {
	if starts(l) {
		return l, "", false
	}
	on := inputsOnStage(c, st)
	if len(on) == 0 {
		return l, "", false
	}
	freed, err := loopOf(ac.NewLoops(freeInputs(c, on...)), ref)
	if err != nil || !starts(freed) {
		return l, "", false
	}
	flag := fmt.Sprintf("loop of %s solved with the declared input %s open: an input is held at 0 V, and a source "+
		"there holds the oscillator's own circuit so it would not start; couple a generator loosely, or declare "+
		"the input elsewhere", ref, strings.Join(on, ", "))
	return freed, flag, true
}
