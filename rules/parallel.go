package rules

import (
	"pare/graph"
)

// parallel: two resistors, capacitors or uncoupled inductors across the same
// two nets are one part. A variable section with a trimmer or a fixed
// capacitor across it stays variable with its range shifted (this is what
// sets the real tuning range); a trimmer contributes its set value.
var parallel = Rule{
	Name:    "parallel",
	Purpose: "merge resistors, capacitors or uncoupled inductors across the same two nets",
	Level:   LevelTidy,
	Kinds:   []graph.Kind{graph.Resistor, graph.Capacitor, graph.Inductor},
	Match: func(x *Ctx, a Anchor) *Plan {
		p := a.Part
		if !plainTwoTerminal(p) {
			return nil
		}
		na, nb := Ends(p, false)
		if na == nb || na == "nc" || nb == "nc" {
			return nil
		}
		// scan the quieter net: a part to ground must not walk all of
		// ground, nor have its list put in order (Index.Count)
		side := na
		if ix := x.c.Index(); ix.Count(nb) < ix.Count(na) {
			side = nb
		}
		for _, cn := range x.Conns(side) {
			q := cn.Part
			if q == p || !plainTwoTerminal(q) {
				continue
			}
			qa, qb := Ends(q, false)
			if !(qa == na && qb == nb) && !(qa == nb && qb == na) {
				continue
			}
			if ok, _ := compatible(p, q, true); !ok {
				continue
			}
			s, o := survivor(p, q)
			return &Plan{Parts: []*graph.Part{s, o}, Nets: []string{na, nb}}
		}
		return nil
	},
	Apply: func(x *Ctx, m *Plan) Step {
		s, o := m.Parts[0], m.Parts[1]
		var r *graph.Part
		var note, exact string
		switch s.Kind {
		case graph.Capacitor:
			r, note = mergedCap(s, o, sum)
			if capClass(s) == 3 {
				note += ": the tuning range shifts by what is across the section"
			}
		default:
			r, note = mergedRL(s, o, recip)
			if s.Kind == graph.Inductor {
				exact = " (assumes the coils are not coupled)"
			}
		}
		r.From = origins(s, o)
		takeDominant(r, s, o)
		r.Note = x.mergedNote(r, s, o)
		why := x.describe(s) + " ∥ " + x.describe(o) + " = " + mergedValue(r) + note + exact
		merged := r.From
		x.Remove(s)
		x.Remove(o)
		x.Add(r)
		return Step{Merged: merged, Result: r.Ref, Why: why}
	},
}

// takeDominant gives the merged part r what its dominant member says
// where the two members return to different lines: the rail each terminal
// returns to, and for a resistor or coil its ref and note. The merged part
// otherwise keeps the survivor's ref, but a 33 kΩ bias resistor from an AGC-fed bias point
// across a 330 Ω feed from the supply is the feed (review 13's b02: "R1
// 327R ≡ R1, R4" kept R1's note and its tag "AGC line via R2" though R4
// brings +9 V). A divider's two halves, one to a line and one to chassis,
// keep the line's tag: the reader sees where the bias comes from.
func takeDominant(r, s, o *graph.Part) {
	d := dominant(s, o)
	if d == s {
		return
	}
	swapped := false
	for i := range r.Pins {
		for _, q := range d.Pins {
			if q.Net == r.Pins[i].Net && q.Rail != "" && r.Pins[i].Rail != "" && q.Rail != r.Pins[i].Rail {
				r.Pins[i].Rail, swapped = q.Rail, true
			}
		}
	}
	if swapped && r.Kind != graph.Capacitor {
		// named after the member it now speaks for: a tag "AGC via R5" must
		// name the resistor the AGC comes through
		r.Ref, r.Note, r.Pos = d.Ref, d.Note, d.Pos
	}
}

// dominant is the member of a parallel pair that carries most of the
// current: the smaller resistance or inductance, the larger capacitance;
// s on a tie.
func dominant(s, o *graph.Part) *graph.Part {
	switch s.Kind {
	case graph.Capacitor:
		if o.Value.Max > s.Value.Max {
			return o
		}
	case graph.Inductor:
		if o.Inductance() < s.Inductance() {
			return o
		}
	default:
		if o.Value.Max < s.Value.Max {
			return o
		}
	}
	return s
}
