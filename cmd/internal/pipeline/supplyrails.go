package pipeline

import (
	"pare/graph"
	"pare/render"
)

// supplyRailsWired is the circuit for the full and faded sheets with each
// declared supply rail wired through the supply that makes it: a
// technician draws the reservoir, the smoothing resistor or choke and the
// smoothing capacitor joined along the rail's line, with the rail's tag
// once at its end, not each part standing alone between tags (the layout
// wires no net whose role is a rail). The pins of the supply frames' parts
// on such a rail move to a net of their own with the rail's label, and
// where the rail goes on to other stages a flag with that label ends it.
// The circuit is copied only when a pin moves; faded gets the flag of a
// rail whose supply parts are all faded.
func supplyRailsWired(c *graph.Circuit, frames []render.Frame, faded map[string]bool) *graph.Circuit {
	in := map[string]bool{}
	for _, f := range frames {
		if f.Supply {
			for _, r := range f.Parts {
				in[r] = true
			}
		}
	}
	mine, others := map[string]int{}, map[string]int{}
	for _, p := range c.Parts {
		for _, pn := range p.Pins {
			if c.RoleOf(pn.Net) != graph.Supply {
				continue
			}
			if in[p.Ref] {
				mine[pn.Net]++
			} else {
				others[pn.Net]++
			}
		}
	}
	var out *graph.Circuit
	for _, n := range c.Nets {
		if mine[n.Name] < 2 {
			continue
		}
		if out == nil {
			out = c.Clone()
		}
		wireRail(out, n, in, others[n.Name] > 0, faded)
	}
	if out == nil {
		return c
	}
	out.Sort()
	return out
}

// wireRail moves the supply parts' pins on rail n to a new net with its
// label, and adds the flag at its end when the rail goes on elsewhere.
func wireRail(c *graph.Circuit, n *graph.Net, in map[string]bool, goesOn bool, faded map[string]bool) {
	name := n.Name + "_line"
	for c.Net(name) != nil {
		name += "_"
	}
	label := render.RailText(n) // the tag its pins carried
	allFaded := true
	for _, p := range c.Parts {
		if !in[p.Ref] {
			continue
		}
		for i := range p.Pins {
			if p.Pins[i].Net == n.Name {
				p.Pins[i].Net = name
				allFaded = allFaded && faded[p.Ref]
			}
		}
	}
	c.Nets = append(c.Nets, &graph.Net{Name: name, Role: graph.Signal, Label: label, Pos: n.Pos})
	if !goesOn {
		return
	}
	ref := render.RailFlag + n.Name
	c.Parts = append(c.Parts, &graph.Part{Ref: ref, Kind: graph.Port, Label: label, Pins: []graph.Pin{{Name: "1", Net: name}}})
	if allFaded && faded != nil {
		faded[ref] = true
	}
}
