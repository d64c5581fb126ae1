package pipeline

import (
	"pare/graph"
	"pare/render"
	"pare/rules/stages"
)

// framePlaces are the drawing templates of a top-level stage and its
// sub-stages (a self-oscillating mixer's Hartley oscillator), its own
// first, each by the refs of the sheet: on a sheet of the original circuit
// (full not nil) a reduced part stands for its one original part, and a
// part merged from several keeps its generic place (no one of them is the
// part the template means).
func framePlaces(s stages.Stage, byName map[string]stages.Stage, reduced, full *graph.Circuit) []render.Place {
	var out []render.Place
	var walk func(s stages.Stage)
	walk = func(s stages.Stage) {
		out = append(out, stagePlaces(s.Draw, reduced, full)...)
		for _, c := range s.Contains {
			if sub, ok := byName[c]; ok {
				walk(sub)
			}
		}
	}
	walk(s)
	return out
}

// stagePlaces turns one stage's template into the sheet's; none when its
// anchor is not on the sheet.
func stagePlaces(draw []stages.Place, reduced, full *graph.Circuit) []render.Place {
	if len(draw) == 0 {
		return nil
	}
	anchor, ok := sheetRef(draw[0].Part, reduced, full)
	if !ok {
		return nil
	}
	out := []render.Place{{Ref: anchor, Anchor: anchor}}
	for _, pl := range draw[1:] {
		if ref, ok := sheetRef(pl.Part, reduced, full); ok {
			out = append(out, render.Place{Ref: ref, Anchor: anchor, Col: pl.Col, Row: pl.Row, Stand: pl.Stand})
		}
	}
	return out
}

// sheetRef is the ref a reduced part is drawn under on the sheet.
func sheetRef(ref string, reduced, full *graph.Circuit) (string, bool) {
	rp := reduced.Part(ref)
	if rp == nil {
		return "", false
	}
	if full == nil {
		return ref, true
	}
	var in []string
	for _, o := range rp.Origins() {
		if full.Part(o) != nil {
			in = append(in, o)
		}
	}
	if len(in) != 1 {
		return "", false
	}
	return in[0], true
}
