package dc

import (
	"fmt"
	"slices"

	"pare/graph"
)

// rectifierWinding finds the one winding (or centre-tapped pair) of p that
// feeds the rectifier: the winding with a rectifying junction's anode on an
// end off chassis. A winding touched only by cathodes is not a source: the
// filament winding of a directly heated rectifier valve has an end on the
// cathode (the filament is the cathode, at full HT) and a heater winding
// with one end at chassis meets the cathodes strapped there; both are the
// cathodes' connections, not rectifier windings. Without any anode on an
// end, the windings any junction touches are taken, so that a negative
// supply or a stray diode gets its own message.
func rectifierWinding(c *graph.Circuit, p *graph.Part, diodes []rectDiode) (secondary, error) {
	anodeOn := func(n string) bool {
		return n != "" && c.RoleOf(n) != graph.Ground && slices.ContainsFunc(diodes, func(d rectDiode) bool { return d.a == n })
	}
	touches := func(n string) bool {
		return n != "" && slices.ContainsFunc(diodes, func(d rectDiode) bool { return d.a == n || d.k == n })
	}
	var fed, touched []secondary
	for _, s := range secondaries(p) {
		if anodeOn(s.e1) || anodeOn(s.e2) {
			fed = append(fed, s)
		}
		if touches(s.e1) || touches(s.e2) {
			touched = append(touched, s)
		}
	}
	if len(fed) == 0 {
		fed = touched
	}
	switch len(fed) {
	case 0:
		return secondary{}, fmt.Errorf("vac is given but no rectifier diode is connected to its windings")
	case 1:
		return fed[0], nil
	}
	return secondary{}, fmt.Errorf("vac is given but rectifier anodes hang on %d windings: pare estimates one rectifier winding per transformer", len(fed))
}

// secondaries lists p's windings with their end nets, a centre-tapped
// winding (two halves NAMEa, NAME1–NAMEt, and NAMEb, NAMEt–NAME2) as one
// with its tap.
func secondaries(p *graph.Part) []secondary {
	var out []secondary
	for i := 0; i < len(p.Windings); i++ {
		w := p.Windings[i]
		s := secondary{name: w.Name, e1: p.NetOf(w.From), e2: p.NetOf(w.To)}
		if i+1 < len(p.Windings) && w.To == p.Windings[i+1].From && w.To[len(w.To)-1] == 't' {
			s = secondary{name: w.Name[:len(w.Name)-1], e1: p.NetOf(w.From), e2: p.NetOf(p.Windings[i+1].To), tap: p.NetOf(w.To)}
			i++
		}
		out = append(out, s)
	}
	return out
}

// windingR is the DC resistance in the conducting path: the rectifier
// winding's own rdc (a centre-tapped winding's first half: tap to end),
// else the part's, else the default.
func windingR(p *graph.Part, sec secondary) float64 {
	for _, name := range []string{sec.name, sec.name + "a"} {
		if w := p.Winding(name); w != nil && w.Rdc > 0 {
			return w.Rdc
		}
	}
	if r, ok := p.Param("rdc"); ok {
		return r
	}
	return def("winding", "rdc")
}
