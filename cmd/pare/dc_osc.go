package main

import (
	"errors"
	"fmt"
	"strings"

	"pare/cmd/internal/pipeline"
	"pare/graph"
	"pare/graph/dc"
	"pare/rules/stages"
)

// oscillatorNotes says, for each recognised oscillator, what its control
// electrode shows when it runs. A DC analysis has no oscillation, so the
// chart gives the stopped value; on the bench a running valve oscillator
// charges its grid negative through grid current in the grid leak, and a
// reading near 0 V means it is not running (common practice). A transistor
// oscillator's junction rectifies the oscillation too: its emitter voltage
// moves when the tank is shorted out (common practice). err is the
// pipeline's failure to reduce or recognise, if any: the chart then says
// why it has no oscillator notes.
func oscillatorNotes(res *pipeline.Result, err error, pt *dc.Point) []string {
	if err != nil && !errors.Is(err, stages.ErrSearchLimit) {
		return []string{fmt.Sprintf("stages not recognised (%v): no oscillator notes", err)}
	}
	return oscillatorNotesOf(res.Stages, pt.Circuit, pt)
}

// oscillatorNotesOf writes the notes for stages already recognised.
func oscillatorNotesOf(found []stages.Stage, c *graph.Circuit, pt *dc.Point) []string {
	var notes []string
	seen := map[string]bool{}
	for _, s := range found {
		if !strings.Contains(strings.ToLower(s.Title), "oscillat") {
			continue
		}
		for _, ref := range s.Parts {
			p := c.Part(ref)
			if p == nil || !p.IsActive() || seen[ref] {
				continue
			}
			seen[ref] = true
			notes = append(notes, oscillatorNote(s, p, pt))
		}
	}
	return notes
}

func oscillatorNote(s stages.Stage, p *graph.Part, pt *dc.Point) string {
	ctl := p.PinWithRole(graph.RoleControl)
	v, _ := pt.Volts(p.NetOf(ctl))
	if p.Kind == graph.Valve {
		return fmt.Sprintf("%s %s (%s): the chart gives the grid at %s, the value with the oscillator stopped. "+
			"Running, grid current through the grid leak holds the grid a few volts negative; "+
			"a reading near 0 V at the grid points to an oscillator that is not running.", s.Name, s.Title, p.Ref, volts(v))
	}
	com := p.PinWithRole(graph.RoleCommon)
	ve, _ := pt.Volts(p.NetOf(com))
	return fmt.Sprintf("%s %s (%s): the chart gives the %s at %s and the %s at %s, the values with the oscillator stopped. "+
		"Running, the junction rectifies the oscillation and the %s voltage shifts; if it does not move when the tank is shorted out, "+
		"the oscillator is not running.", s.Name, s.Title, p.Ref, electrodeWord(ctl), volts(v), electrodeWord(com), volts(ve), electrodeWord(com))
}

func electrodeWord(pin string) string {
	return map[string]string{"b": "base", "e": "emitter", "g": "gate", "s": "source"}[pin]
}
