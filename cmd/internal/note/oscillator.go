package note

import (
	"fmt"
	"strings"

	"pare/graph"
	"pare/graph/dc"
	"pare/graph/value"
	"pare/rules/stages"
)

// OscillatorNotes says, for each oscillator, what a running one shows. A DC
// analysis has no oscillation, so the chart gives the stopped value; on
// the bench the oscillation is rectified at the control electrode (grid
// current in a valve's grid leak, a JFET's gate junction, a transistor's
// base–emitter junction) and charges its coupling capacitor, which biases
// that electrode towards cut-off: grid-leak bias (common practice). The
// electrode that shows it is the one with the leak and the coupling
// capacitor (dc.Shift.Shows), not an electrode tied to chassis through a
// winding, which does not move. The oscillators are those of the stages
// and those whose loop starts on its own (dc.Point.Oscillators), in that
// order.
func OscillatorNotes(found []stages.Stage, pt *dc.Point) []string {
	pt.AddOscillators(StageOscillators(found))
	byRef := map[string]dc.Oscillator{}
	for _, o := range pt.Oscillators() {
		byRef[o.Ref] = o
	}
	var notes []string
	seen := map[string]bool{}
	for _, s := range found {
		if !oscillates(s) {
			continue
		}
		for _, ref := range s.Parts {
			p := pt.Circuit.Part(ref)
			if p == nil || !p.IsActive() || seen[ref] {
				continue
			}
			seen[ref] = true
			notes = append(notes, oscillatorNote(s.Name+" "+s.Title, p, byRef[ref], pt))
		}
	}
	for _, o := range pt.Oscillators() {
		if !seen[o.Ref] {
			name := fmt.Sprintf("Oscillator (its loop starts on its own near %s)", value.FormatPrec(o.F, value.Hertz, value.Symbol, 3))
			notes = append(notes, oscillatorNote(name, pt.Circuit.Part(o.Ref), o, pt))
		}
	}
	return notes
}

// StageOscillators are the active parts of the stages named oscillators.
func StageOscillators(found []stages.Stage) []string {
	var out []string
	for _, s := range found {
		if !oscillates(s) {
			continue
		}
		out = append(out, s.Parts...)
	}
	return out
}

// oscillates says whether a stage's device runs an oscillation: a stage
// named an oscillator or a self-oscillating mixer, not a mixer whose title
// names the separate oscillator injected into it (its grids carry the
// oscillator's bias, which the oscillator's own note gives; a blind
// reviewer read "the grid reads more negative" on a triode-hexode's signal
// grid, which stays at the AGC bias).
func oscillates(s stages.Stage) bool {
	if strings.HasPrefix(s.Topology, "mixer-") {
		return false
	}
	return strings.Contains(strings.ToLower(s.Title), "oscillat")
}

// electrodeWord names an electrode for a repairer.
var electrodeWord = map[string]string{"b": "base", "e": "emitter", "c": "collector", "g": "gate", "s": "source",
	"d": "drain", "g1": "grid", "k": "cathode", "a": "anode"}

func oscillatorNote(name string, p *graph.Part, o dc.Oscillator, pt *dc.Point) string {
	show, ok := shows(o)
	if !ok {
		ctl := p.PinWithRole(graph.RoleControl)
		v, _ := pt.Volts(p.NetOf(ctl))
		return fmt.Sprintf("%s (%s): the chart gives the %s at %s, the value with the oscillator stopped. "+
			"No electrode of it has a leak and a coupling capacitor to rectify the oscillation into a DC shift: "+
			"check it running with a receiver or an oscilloscope, not the meter.", name, p.Ref, electrodeWord[ctl], Volts(v))
	}
	v, _ := pt.Volts(show.Net)
	word := electrodeWord[show.Pin]
	towards := "more negative"
	if show.Dir > 0 {
		towards = "more positive"
	}
	if p.Kind == graph.BJT {
		towards = map[bool]string{true: "higher", false: "lower"}[show.Dir > 0]
	}
	follow := ""
	for _, s := range o.Shifts {
		if s.Ref == p.Ref && !s.Shows && s.Dir != 0 {
			follow += fmt.Sprintf("; the %s goes %s", electrodeWord[s.Pin], map[bool]string{true: "up", false: "down"}[s.Dir > 0])
		}
	}
	return fmt.Sprintf("%s (%s): the chart gives the %s at %s, the value with the oscillator stopped. "+
		"Running, %s, and the %s reads %s%s; "+
		"a %s reading at the chart's value points to an oscillator that is not running (readings files say oscillators = \"stopped\" when the tank is shorted out).",
		name, p.Ref, word, Volts(v), rectifies[p.Kind], word, towards, follow, word)
}

// rectifies says where a running oscillator's bias comes from.
var rectifies = map[graph.Kind]string{
	graph.Valve: "grid current charges the grid capacitor through the grid leak",
	graph.FET:   "the gate junction's current charges the gate capacitor through the gate leak",
	graph.BJT:   "the base–emitter junction's current charges the base capacitor through the bias resistors",
}

// shows is the electrode that shows the oscillator running.
func shows(o dc.Oscillator) (dc.Shift, bool) {
	for _, s := range o.Shifts {
		if s.Shows && s.Ref == o.Ref {
			return s, true
		}
	}
	return dc.Shift{}, false
}
