package rules

import (
	"pare/graph"
)

// series: two resistors, capacitors or uncoupled inductors joined by a net
// that has nothing else on it are one part. A variable section in series
// with a padder becomes a variable capacitor of range
// Cmin·Cp/(Cmin+Cp) .. Cmax·Cp/(Cmax+Cp). The middle net must not be a
// declared signal end, AC ground, or a labelled point of the diagram.
var series = seriesRule("series", LevelTidy, false,
	"merge two resistors, capacitors or uncoupled inductors joined by a net with nothing else on it")

// padder is the series merge of a gang section with its padder. It is exact
// at both ends of the travel but not in between: the series combination is
// not linear in the gang's setting, and a netlist range is (at mid-travel the
// frequency changer example moves by about 20 dB in the AC check). So it
// belongs to the ideal view, where the sheet shows the effective tuning
// range and accepts the approximation.
var padder = seriesRule("padder", LevelIdeal, true,
	"merge a gang section with its series padder into one variable capacitor (exact at the ends of the travel only)")

func seriesRule(name string, level Level, variable bool, purpose string) Rule {
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
			cs := x.conns[mid]
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
			if isVariable := p.Kind == graph.Capacitor && (capClass(p) == 3 || capClass(q) == 3); isVariable != variable {
				return nil
			}
			qa, qb := Ends(q, false)
			if qa != mid && qb != mid {
				return nil
			}
			s, o := survivor(p, q)
			return &Plan{Parts: []*graph.Part{s, o}, Nets: []string{mid}}
		},
		Apply: func(x *Ctx, m *Plan) Step {
			s, o, mid := m.Parts[0], m.Parts[1], m.Nets[0]
			var r *graph.Part
			var note string
			switch s.Kind {
			case graph.Capacitor:
				r, note = mergedCap(s, o, recip)
				if capClass(s) == 3 {
					note += ": a padder in series narrows the range at the top (Cmin·Cp/(Cmin+Cp) .. Cmax·Cp/(Cmax+Cp)); exact at both ends of the travel, in between only approximately a linear range"
				}
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
