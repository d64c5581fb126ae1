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
func withHeaterJunctions(c *graph.Circuit) *graph.Circuit {
	var out *graph.Circuit
	for i, n := range c.Nets {
		if n.Role != graph.Heater {
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
