package pipeline

import "pare/graph"

// withHeaterJunctions is the full and faded views' circuit with each
// junction of a series heater chain labelled by what it joins, in the
// chain's order from the mains ("htr V5→V1", graph
// JunctionText): every heater pin's tag said only "heater chain", so the
// order a technician follows to find an open heater was lost. The labels
// are read on the whole circuit here, before the drawing cuts it into
// rows that each hold only part of the chain. The circuit is copied only
// when a net is relabelled, so the netlist written beside the sheets keeps
// the user's labels.
//
// Only a label several heater nets share is replaced: it cannot tell one
// junction from another. An unlabelled net's tag is its own name (hc1,
// hc2), which tells them apart and finds the net in the netlist; those
// sheets are left as they were drawn (relabelling them re-routed the
// every-kind and review17-acdc pages past the wire ratchets).
func withHeaterJunctions(c *graph.Circuit) *graph.Circuit {
	shared := map[string]int{}
	for _, n := range c.Nets {
		if n.Role == graph.Heater && n.Label != "" {
			shared[n.Label]++
		}
	}
	var out *graph.Circuit
	for i, n := range c.Nets {
		if n.Role != graph.Heater || shared[n.Label] < 2 {
			continue
		}
		text, ok := c.JunctionText(n.Name, n.Label)
		if !ok {
			continue
		}
		if out == nil {
			out = c.Clone()
		}
		out.Nets[i].Label = text
	}
	if out == nil {
		return c
	}
	return out
}
