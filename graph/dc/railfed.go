package dc

import "pare/graph"

// A rectifier into a declared rail (no vac to estimate it from) conducts
// in pulses from an AC source the DC solve cannot see: a winding is a
// resistor to it, the mains a 0 V port. Its mean current is still known:
// the reservoir passes no DC, so over a mains cycle the rectifier delivers
// exactly the DC the rail's load draws (Kirchhoff's current law on the
// reservoir node, averaged). A half-wave rectifier's one path carries all
// of it; the two paths of a full-wave or bridge rectifier (two distinct
// anode nets) carry half each, conducting on alternate half-cycles.
//
// railFedShare gives, for each anode pin of part, its mean current, and
// false when part is no rectifier into a declared positive rail.
func (p *Point) railFedShare(part *graph.Part) (map[string]float64, bool) {
	if part.Kind != graph.Diode && (part.Kind != graph.Valve || part.IsActive()) {
		return nil, false
	}
	k := part.NetOf("k")
	if k == "" || p.Circuit.RoleOf(k) != graph.Supply || p.m.netTerm[k] >= 0 || p.estimateFor(k) != nil {
		return nil, false
	}
	// The paths into k: every junction's anode net, of every rectifier
	// part whose cathode is on k; strapped anodes share one path.
	onNet := map[string]int{} // junctions per anode net
	for _, q := range p.Circuit.Parts {
		if q.Kind != graph.Diode && (q.Kind != graph.Valve || q.IsActive()) || q.NetOf("k") != k {
			continue
		}
		for _, an := range rectAnodes {
			if a := q.NetOf(an); a != "" && p.isACSource(a) {
				onNet[a]++
			}
		}
	}
	if len(onNet) == 0 {
		return nil, false
	}
	draw := p.railCurrent(k)
	out := map[string]float64{}
	for _, an := range rectAnodes {
		if a := part.NetOf(an); a != "" && onNet[a] > 0 {
			out[an] = draw / float64(len(onNet)) / float64(onNet[a])
		}
	}
	return out, len(out) > 0
}

// rectAnodes are the anode pins of a diode or valve diode.
var rectAnodes = []string{"a", "a1", "a2"}

// isACSource tells whether a rectifier's anode net can bring it AC: not
// chassis and not a held rail (a diode from chassis or another rail to
// the HT is a protection or bleed path, not a rectifier source).
func (p *Point) isACSource(net string) bool {
	switch p.Circuit.RoleOf(net) {
	case graph.Ground, graph.Supply, graph.Bias:
		return false
	}
	return true
}
