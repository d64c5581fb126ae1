package rules

import (
	"pare/graph"
)

// series: two resistors, capacitors or uncoupled inductors joined by a net
// that has nothing else on it are one part. The middle net must not be a
// declared signal end, AC ground, or a labelled point of the diagram.
//
// A gang section in series with a fixed capacitor (a padder) is a near miss,
// never a merge, at every level: the series combination
// C·Cp/(C+Cp) does not vary linearly with rotation, and a netlist range
// Min..Max is read as linear, so one part would be right at the two ends of
// the travel only (on the frequency changer example about 20 dB off at
// mid-travel). A technician draws the padder as its own part in series with
// the section, and so does pare.
var series = seriesRule("series", LevelTidy,
	"merge two resistors, capacitors or uncoupled inductors joined by a net with nothing else on it")

func seriesRule(name string, level Level, purpose string) Rule {
	return Rule{
		Name:      name,
		Purpose:   purpose,
		Level:     level,
		Kinds:     []graph.Kind{graph.Resistor, graph.Capacitor, graph.Inductor},
		Symmetric: true,
		Match: func(x *Ctx, a Anchor) *Plan {
			p := a.Part
			if !plainTwoTerminal(p) {
				return nil
			}
			out, mid := Ends(p, a.Flip)
			if out == mid || mid == "nc" || out == "nc" || x.IsEnd(mid) {
				return nil
			}
			n := x.Net(mid)
			if n == nil || n.Role != graph.Signal || n.Label != "" || n.Volts != 0 {
				return nil
			}
			cs := x.Conns(mid)
			if len(cs) != 2 {
				return nil
			}
			q := cs[0].Part
			if q == p {
				q = cs[1].Part
			}
			if q == p || !plainTwoTerminal(q) {
				return nil
			}
			if ok, _ := compatible(p, q, false); !ok {
				return nil
			}
			qa, qb := Ends(q, false)
			if qa != mid && qb != mid {
				return nil
			}
			s, o := survivor(p, q)
			return &Plan{Parts: []*graph.Part{s, o}, Nets: []string{mid}}
		},
		Guard: func(x *Ctx, m *Plan) (bool, string) {
			s, o := m.Parts[0], m.Parts[1]
			if s.Kind == graph.Capacitor && capClass(s) == 3 {
				return false, x.describe(s) + " in series with " + x.describe(o) + " through " + m.Nets[0] +
					": a gang section in series with a padder is not merged (the series combination C·Cp/(C+Cp) does not vary linearly with rotation; one variable capacitor would be right at the ends of the travel only)"
			}
			return true, ""
		},
		Apply: func(x *Ctx, m *Plan) Step {
			s, o, mid := m.Parts[0], m.Parts[1], m.Nets[0]
			var r *graph.Part
			var note string
			switch s.Kind {
			case graph.Capacitor:
				r, note = mergedCap(s, o, recip)
			default:
				r, note = mergedRL(s, o, sum)
				if s.Kind == graph.Inductor {
					note += " (assumes the coils are not coupled)"
				}
			}
			r.From = origins(s, o)
			// Pin 1 keeps the survivor's outer net, pin 2 takes the other part's.
			r.Pins[0] = outerPin(s, mid)
			r.Pins[1] = outerPin(o, mid)
			r.Pins[0].Name, r.Pins[1].Name = s.Pins[0].Name, s.Pins[1].Name
			why := x.describe(s) + " in series with " + x.describe(o) + " through " + mid + " (nothing else on it) = " + mergedValue(r) + note
			merged := r.From
			x.Remove(s)
			x.Remove(o)
			x.Add(r)
			return Step{Merged: merged, Result: r.Ref, Why: why}
		},
	}
}

func outerPin(p *graph.Part, mid string) graph.Pin {
	if p.Pins[0].Net == mid {
		return p.Pins[1]
	}
	return p.Pins[0]
}
