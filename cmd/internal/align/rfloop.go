package align

import (
	"fmt"
	"maps"
	"slices"
	"strings"

	"pare/graph"
	"pare/graph/device"
	"pare/rules/stages"
)

// An RF row's gain runs to the mixer's grid. When the mixer oscillates
// itself (or an oscillator section shares the grid's circuit), the linear
// model holds its oscillator loop closed at the signal frequency too: a
// loop that has gain above 1 at the oscillator's frequency is regenerative
// a few hundred kilohertz below it and lifts the grid's response well above
// what the bench meets, where the valve runs in large-signal oscillation
// and gives the signal no such lift. The RF rows are therefore solved with
// each oscillating device's loop broken: its control-to-output
// transconductance (the oscillator section's, on a converter with its own)
// taken as zero, its input and output resistances kept, so every load on
// the signal path stays as it is.

// quietGm is what a transistor's gm is set to when its loop is broken: the
// hybrid-π model needs a positive gm, and 1 pS is nothing beside any load
// (rπ and ro are pinned to their working values, so only the gain goes).
const quietGm = 1e-12

// loopsBroken returns a copy of c with the loop of every device that
// oscillates (a stage's loop with a positive margin somewhere on the dial)
// broken, and the devices so treated; c itself and nil when none.
func loopsBroken(c *graph.Circuit, sts []stages.Stage) (*graph.Circuit, []string) {
	var refs []string
	for _, s := range sts {
		for _, l := range s.Loop {
			if _, _, _, mMax, ok := l.Range(); ok && mMax > 0 && !slices.Contains(refs, l.Device) {
				refs = append(refs, l.Device)
			}
		}
	}
	return breakLoops(c, refs)
}

// breakLoops is c with the named devices' oscillator transconductance
// zeroed (quieten), and those the model took; c itself when none.
func breakLoops(c *graph.Circuit, refs []string) (*graph.Circuit, []string) {
	if len(refs) == 0 {
		return c, nil
	}
	out := c.Clone()
	var broken []string
	for _, ref := range refs {
		if p := out.Part(ref); p != nil && quieten(p) {
			broken = append(broken, ref)
		}
	}
	if len(broken) == 0 {
		return c, nil
	}
	slices.Sort(broken)
	return out, broken
}

// Circuit is c as the row was solved: with the oscillator loops it names
// broken (Injection.Broken), else c itself.
func (in Injection) Circuit(c *graph.Circuit) *graph.Circuit {
	out, _ := breakLoops(c, in.Broken)
	return out
}

// quieten zeroes p's oscillator transconductance in place, keeping its
// resistances: false, with p unchanged, when the model will not take it.
func quieten(p *graph.Part) bool {
	s, err := device.Of(p)
	if err != nil {
		return false
	}
	was := maps.Clone(p.Params)
	if p.Params == nil {
		p.Params = map[string]float64{}
	}
	switch {
	case s.GmOsc > 0:
		p.Params["gmo"] = 0
	case p.Kind == graph.Valve:
		delete(p.Params, "mu")
		p.Params["gm"], p.Params["ra"] = 0, s.ROut
	case p.Kind == graph.FET:
		p.Params["gm"], p.Params["rd"] = 0, s.ROut
	case p.Kind == graph.BJT:
		p.Params["gm"], p.Params["rpi"], p.Params["ro"] = quietGm, s.RPi, s.ROut
	default:
		return false
	}
	q, err := device.Of(p)
	quiet := q.Gm <= quietGm
	if s.GmOsc > 0 {
		quiet = q.GmOsc == 0 && q.Gm == s.Gm
	}
	if err != nil || !quiet || q.ROut != s.ROut || q.RPi != s.RPi {
		p.Params = was
		return false
	}
	return true
}

// loopShift is how far the closed loop must move a row's gain before the
// row quotes it: half a percent, under any meter's reading error (common
// practice); a gain that never reaches the oscillator's grid circuit does
// not move at all.
const loopShift = 0.005

// levelLoopNote says what a row's level (not its gain) assumed.
func levelLoopNote(broken []string) string {
	return fmt.Sprintf("level solved with %s's oscillator loop broken (its oscillator transconductance taken as 0)", strings.Join(broken, ", "))
}

// loopNote says what an RF row assumed, with the figure the closed loop
// would have given.
func loopNote(broken []string, closed float64) string {
	return fmt.Sprintf("solved with %s's oscillator loop broken (its oscillator transconductance taken as 0, its resistances kept): with the loop closed the linear model regenerates at the signal frequency and gives ×%.3g, a lift the oscillating device does not give", strings.Join(broken, ", "), closed)
}

// tuneNet is the net an RF row peaks the gang on: the hot end of the
// signal tank (a gang section that is not the oscillator's) nearest the
// mixer on the row's way there, as a repairer tuning to the generator peaks
// the signal circuits. Peaking the mixer's grid itself would, with the
// oscillator loop broken, as readily find the oscillator tank resonating at
// the signal frequency through the grid capacitor: a setting no tuned set
// takes. The reference net when the set has no such tank.
func tuneNet(c *graph.Circuit, sts []stages.Stage, from, ref string) string {
	mix := mixerStage(sts)
	if mix == nil {
		return ref
	}
	osc := oscTank(c, mix)
	if osc.gang == nil {
		return ref
	}
	dist := netDistances(c)
	best, bestD := ref, -1
	for _, t := range sigTanks(c, osc.gang) {
		n := hotNet(c, t.gang)
		if d := dist(n); n != "" && d >= dist(from) && d <= dist(ref) && d > bestD {
			best, bestD = n, d
		}
	}
	return best
}
