package render

import (
	"slices"
	"strings"

	"pare/graph"
)

// subCircuit is the circuit cut to some of its parts (in its order): its
// nets and rails as they are, the inputs and outputs that still have a
// part on them. An input or output whose port part is on another row is
// left out: the layout draws a flag for an end no port sits on, and the
// row's off-row connector already leads to the port (a row held the
// output's flag and the connector to the port's row side by side).
func subCircuit(c *graph.Circuit, parts []*graph.Part) *graph.Circuit {
	sub := &graph.Circuit{File: c.File, Title: c.Title, Band: c.Band, Freqs: c.Freqs, Regions: c.Regions,
		Rails: c.Rails, Parts: parts}
	on, kept := map[string]bool{}, map[string]bool{}
	for _, p := range parts {
		kept[p.Ref] = true
		for _, pn := range p.Pins {
			on[pn.Net] = true
		}
	}
	sub.Nets = rowNets(c, on)
	for _, n := range c.Inputs {
		if on[n] && !portElsewhere(c, n, kept) {
			sub.Inputs = append(sub.Inputs, n)
		}
	}
	for _, n := range c.Outputs {
		if on[n] && !portElsewhere(c, n, kept) {
			sub.Outputs = append(sub.Outputs, n)
		}
	}
	return sub
}

// portElsewhere says whether a port on net sits on another row.
func portElsewhere(c *graph.Circuit, net string, kept map[string]bool) bool {
	for _, cn := range c.ConnsOf(net) {
		if cn.Part.Kind == graph.Port && !kept[cn.Part.Ref] {
			return true
		}
	}
	return false
}

// rowNets are the nets a row's circuit keeps: those its parts touch and
// the ground net, as the whole circuit has them, in name order (a declared
// end no part of the row is on is no end of the row's). Not the whole circuit's nets: every row's layout indexes its
// circuit, and a row carrying all of a 10,000-part set's nets made the
// paged drawing grow with the square of the set.
func rowNets(c *graph.Circuit, on map[string]bool) []*graph.Net {
	nets := make([]*graph.Net, 0, len(on)+1)
	for n := range on {
		if nt := c.Net(n); nt != nil {
			nets = append(nets, nt)
		}
	}
	if g := c.Net(c.GroundName()); g != nil && !on[g.Name] {
		nets = append(nets, g)
	}
	slices.SortFunc(nets, func(a, b *graph.Net) int { return strings.Compare(a.Name, b.Name) })
	return nets
}
