package align

import "pare/graph"

// switched is the circuit as its switches leave it at their set positions:
// a copy with the nets each closed contact joins made one and the switches
// taken out. A tuned circuit reached through a wavechange wafer (gang
// section on one side, coil, padder and trimmer on the other) is then one
// tank to the searches for trimmers and padders, as it is to the AC solver.
// It returns c itself when no switch closes anything.
func switched(c *graph.Circuit) *graph.Circuit {
	var out *graph.Circuit
	for _, p := range c.Parts {
		pos := int(p.Set)
		if p.Kind != graph.Switch || pos < 1 || pos > len(p.Closes) {
			continue
		}
		if out == nil {
			out = c.Clone()
		}
		q := out.Part(p.Ref)
		for _, pr := range p.Closes[pos-1] {
			a, b := q.NetOf(pr[0]), q.NetOf(pr[1])
			if a == "" || b == "" || a == "nc" || b == "nc" || a == b {
				continue
			}
			out.JoinNets(out.ChooseKeep(a, b))
		}
		out.RemovePart(p.Ref)
	}
	if out == nil {
		return c
	}
	return out
}
