package pipeline

import (
	"pare/graph"
	"pare/render"
	"pare/rules/stages"
)

// framePlaces are the drawing templates of a top-level stage and its
// sub-stages (a self-oscillating mixer's Hartley oscillator), its own
// first, on the reduced sheet, whose parts are the ones the patterns
// matched. The full and faded views keep the generic placement: the
// original circuit's bias, supply and decoupling parts crowd round the
// same devices, and a template that knows none of them cost those sheets
// wires the router could no longer lay.
func framePlaces(s stages.Stage, byName map[string]stages.Stage, reduced, full *graph.Circuit) []render.Place {
	if full != nil {
		return nil
	}
	var out []render.Place
	var walk func(s stages.Stage)
	walk = func(s stages.Stage) {
		out = append(out, stagePlaces(s.Draw, reduced)...)
		for _, c := range s.Contains {
			if sub, ok := byName[c]; ok {
				walk(sub)
			}
		}
	}
	walk(s)
	out = append(out, ladderPlaces(s.Parts, reduced)...)
	if s.Topology == "push-pull" {
		out = pairPlaces(out, s.Parts, reduced)
	}
	return out
}

// stagePlaces turns one stage's template into the sheet's; none when its
// anchor is not on the sheet.
func stagePlaces(draw []stages.Place, reduced *graph.Circuit) []render.Place {
	if len(draw) == 0 || reduced.Part(draw[0].Part) == nil {
		return nil
	}
	anchor := draw[0].Part
	out := []render.Place{{Ref: anchor, Anchor: anchor}}
	for _, pl := range draw[1:] {
		if reduced.Part(pl.Part) != nil {
			out = append(out, render.Place{Ref: pl.Part, Anchor: anchor, Col: pl.Col, Row: pl.Row, Stand: pl.Stand})
		}
	}
	return out
}
