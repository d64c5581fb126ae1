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
		why := x.describe(s) + " ∥ " + x.describe(o) + " = " + mergedValue(r) + note + exact
		merged := r.From
		x.Remove(s)
		x.Remove(o)
		x.Add(r)
		return Step{Merged: merged, Result: r.Ref, Why: why}
	},
}
