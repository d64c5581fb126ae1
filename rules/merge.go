package rules

import (
	"pare/graph"
	"pare/graph/value"
)

// What parallel and series merges share: which parts may be combined and
// how the survivor (whose ref the result keeps) is chosen.

// capClass orders capacitor types by how much they decide about the result:
// a variable section stays variable whatever is added to it.
func capClass(p *graph.Part) int {
	switch p.Type {
	case graph.CapVariable:
		return 3
	case graph.CapTrimmer:
		return 2
	case graph.CapElectrolytic:
		return 1
	}
	return 0
}

// survivor picks the part whose ref and orientation the merged part keeps:
// the variable section, then the trimmer, the electrolytic (for polarity),
// and otherwise the first in the technician's count (C2 before C12).
func survivor(p, q *graph.Part) (s, o *graph.Part) {
	if p.Kind == graph.Capacitor && capClass(p) != capClass(q) {
		if capClass(p) > capClass(q) {
			return p, q
		}
		return q, p
	}
	if refLess(p.Ref, q.Ref) {
		return p, q
	}
	return q, p
}

// plainTwoTerminal reports whether a part is a mergeable two-terminal
// element: a resistor, a capacitor, or an uncoupled single-winding inductor.
func plainTwoTerminal(p *graph.Part) bool {
	if p.Keep || len(p.Pins) != 2 {
		return false
	}
	switch p.Kind {
	case graph.Resistor, graph.Capacitor:
		return true
	case graph.Inductor:
		return len(p.Windings) <= 1 && len(p.Coupling) == 0
	}
	return false
}

func inductorQ(p *graph.Part) float64 {
	if len(p.Windings) == 1 {
		return p.Windings[0].Q
	}
	return 0
}

// compatible reports whether two plain parts may be combined at all, and
// why not (for the log of near misses, "" when the answer is obvious).
func compatible(p, q *graph.Part, parallel bool) (bool, string) {
	if p.Kind != q.Kind {
		return false, ""
	}
	switch p.Kind {
	case graph.Inductor:
		if p.Type != q.Type {
			return false, ""
		}
		if inductorQ(p) != inductorQ(q) {
			return false, p.Ref + " and " + q.Ref + " have different Q: not combined (one Q would misstate the losses)"
		}
	case graph.Capacitor:
		if p.Gang != "" && q.Gang != "" && p.Gang != q.Gang {
			return false, ""
		}
		cp, cq := capClass(p), capClass(q)
		if parallel {
			if cp == 3 && cq == 3 && p.Gang != q.Gang {
				return false, ""
			}
			if cp == 1 && cq == 1 && p.NetOf("+") != q.NetOf("+") {
				return false, "" // electrolytics back to back in parallel: leave them as drawn
			}
			return true, ""
		}
		if cp == 1 || cq == 1 {
			return false, "" // a polarised capacitor in a series chain: leave it as drawn
		}
		if cp >= 2 && cq >= 2 {
			return false, "" // two adjustable capacitors in series: no single part describes them
		}
	}
	return true, ""
}

// mergedCap combines two capacitances. For an adjustable part the range
// (and a trimmer's setting) is transformed end by end; fixed values combine
// with worst-case tolerance.
func mergedCap(s, o *graph.Part, f func(a, b float64) float64) (*graph.Part, string) {
	r := s.Clone()
	oc := o.Capacitance(0) // a trimmer contributes its set value, a fixed part its value
	switch capClass(s) {
	case 3: // variable section: range shifts, stays variable
		if capClass(o) == 3 {
			r.Value = value.Range{Min: f(s.Value.Min, o.Value.Min), Max: f(s.Value.Max, o.Value.Max)}
		} else {
			r.Value = value.Range{Min: f(s.Value.Min, oc), Max: f(s.Value.Max, oc)}
		}
		r.Tol = value.Tolerance{}
		if r.Gang == "" {
			r.Gang = o.Gang
		}
		return r, ""
	case 2: // trimmer
		if capClass(o) == 2 {
			r.Value = value.Range{Min: f(s.Value.Min, o.Value.Min), Max: f(s.Value.Max, o.Value.Max)}
			r.Set = f(s.Set, o.Set)
		} else {
			r.Value = value.Range{Min: f(s.Value.Min, oc), Max: f(s.Value.Max, oc)}
			r.Set = f(s.Set, oc)
		}
		r.Tol = value.Tolerance{}
		return r, ""
	}
	v, tol, ok := combineTol(s, o, s.Value.Max, o.Value.Max, f)
	r.Value = value.Range{Min: v, Max: v}
	r.Tol = tol
	return r, tolNote(v, tol, ok, value.Farad, s, o)
}

// mergedRL combines two resistors or two inductors.
func mergedRL(s, o *graph.Part, f func(a, b float64) float64) (*graph.Part, string) {
	r := s.Clone()
	u := value.Ohm
	v1, v2 := s.Value.Max, o.Value.Max
	if s.Kind == graph.Inductor {
		u = value.Henry
		v1, v2 = s.Inductance(), o.Inductance()
	}
	v, tol, ok := combineTol(s, o, v1, v2, f)
	r.Value = value.Range{Min: v, Max: v}
	r.Tol = tol
	if s.Kind == graph.Inductor && len(r.Windings) == 1 {
		r.Windings[0].L = v
	}
	return r, tolNote(v, tol, ok, u, s, o)
}

func mergedValue(p *graph.Part) string {
	switch p.Kind {
	case graph.Capacitor:
		s := value.FormatRange(p.Value, value.Farad, value.Symbol)
		switch p.Type {
		case graph.CapVariable:
			s += " variable"
		case graph.CapTrimmer:
			s += " trimmer set " + farads(p.Set)
		}
		return s
	case graph.Inductor:
		return value.FormatPrec(p.Inductance(), value.Henry, value.Symbol, 5)
	}
	return value.FormatPrec(p.Value.Max, value.Ohm, value.Symbol, 5)
}
