package device

import (
	"math"

	"pare/graph"
)

// WindingLoss gives the series loss resistance of each of p's windings (in
// p.Windings order) for a coil whose q is its unloaded Q at the winding's
// QAt (the part's q_at, or the resonance of the tank it tunes,
// graph.Circuit.ReferQ), else at angular frequency w0 (the centre of its
// band): R = w·L/Q for a whole winding.
//
// The sections of a tapped winding (two windings that share a pin: 1–t and
// t–2, or NAME1–NAMEt and NAMEt–NAME2) are one coil, and q is the Q of that
// whole coil, end to end: its loss is w0·Lwhole/Q, with Lwhole = La + Lb +
// 2k·√(La·Lb), shared between the sections in proportion to their turns
// (√L, the length of wire in each). Giving each section w0·Lsection/Q
// instead would leave out the mutual inductance and overstate Q: a
// centre-tapped coil would run at twice the Q asked for. The whole coil
// then has exactly the Q asked for, and a section used alone has the loss
// of its share of the wire (docs/devices.md, docs/references.md §16).
func WindingLoss(p *graph.Part, w0 float64) []float64 {
	r := make([]float64, len(p.Windings))
	at := func(w graph.Winding) float64 {
		if w.QAt > 0 {
			return 2 * math.Pi * w.QAt
		}
		return w0
	}
	for i, w := range p.Windings {
		if w.Q > 0 && w.L > 0 {
			r[i] = at(w) * w.L / w.Q
		}
	}
	for i := range p.Windings {
		for j := range p.Windings {
			a, b := p.Windings[i], p.Windings[j]
			if i == j || a.To != b.From || a.Q <= 0 || a.Q != b.Q || a.L <= 0 || b.L <= 0 {
				continue
			}
			k := p.K(a.Name, b.Name)
			sa, sb := math.Sqrt(a.L), math.Sqrt(b.L)
			whole := a.L + b.L + 2*k*sa*sb
			loss := at(a) * whole / a.Q
			r[i], r[j] = loss*sa/(sa+sb), loss*sb/(sa+sb)
		}
	}
	for i, w := range p.Windings {
		r[i] = math.Max(r[i], WindingRdc(p, w))
	}
	return r
}

// WindingRdc is the DC resistance the netlist declares for a winding (its
// own rdc, else the part's), 0 when none is declared. The copper is in
// series with the winding at every frequency, so the small-signal model
// never takes less loss than it: at audio, where ω·L/Q of an output
// transformer or a choke is a fraction of an ohm, the copper is the loss
// (an output transformer's primary resistance costs gain and raises the
// anode load; handbook transformer equivalent circuit, from memory). At
// radio frequencies ω·L/Q already includes the copper and is the larger. A
// default used for DC work (graph/dc) is not a declaration and is left out.
func WindingRdc(p *graph.Part, w graph.Winding) float64 {
	if w.Rdc > 0 {
		return w.Rdc
	}
	if v, ok := p.Param("rdc"); ok && v > 0 {
		return v
	}
	return 0
}
