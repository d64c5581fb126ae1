package pipeline

import (
	"sort"
	"strings"

	"pare/graph"
)

// withSupplyReturns is the reduced circuit for its sheet with every
// terminal that returned to an undeclared supply line drawn returning to
// that line, not to chassis: only ground nets get the earth symbol
// (docs/netlist.md). A line is a net the original circuit feeds with power
// (a declared supply, or a reservoir the DC solution estimates from a
// captured rectifier) directly or through series chokes, and resistors
// into a net with no resistor or choke to chassis (a divider's tap is a
// bias point, not a supply line). An anode load fed from an undeclared
// rectifier's decoupled line was drawn to a chassis symbol. The circuit is
// copied only when a terminal changes.
func (r *Result) withSupplyReturns(c *graph.Circuit) *graph.Circuit {
	lines := r.supplyLines()
	if len(lines) == 0 {
		return c
	}
	var out *graph.Circuit
	for _, p := range c.Parts {
		orig := r.Circuit.Part(p.Ref)
		if orig == nil {
			continue
		}
		for i, pn := range p.Pins {
			was := orig.NetOf(pn.Name)
			from, ok := lines[was]
			if !ok || pn.Rail != "" || pn.Net == was || !c.RoleOf(pn.Net).IsACGround() || c.RoleOf(pn.Net).IsRail() {
				continue
			}
			if out == nil {
				out = c.Clone()
			}
			out.Part(p.Ref).Pins[i].Rail = was
			if out.Net(was) == nil && !hasRail(out, was) {
				n := graph.Net{Name: was, Role: graph.Supply, Fed: from, Label: lineLabel(r.Circuit, lines, was)}
				out.Rails = append(out.Rails, &n)
				sort.Slice(out.Rails, func(a, b int) bool { return out.Rails[a].Name < out.Rails[b].Name })
			}
		}
	}
	if out == nil {
		return c
	}
	return out
}

func hasRail(c *graph.Circuit, name string) bool {
	for _, n := range c.Rails {
		if n.Name == name {
			return true
		}
	}
	return false
}

// lineLabel is a supply line's tag: its own label, else that of the
// nearest labelled line feeding it ("HT2 smoothed" for a line decoupled
// from it), without a voltage; else its name in capitals ("HT3"), as a
// service sheet names an undeclared line.
func lineLabel(c *graph.Circuit, lines map[string]string, net string) string {
	for n, seen := net, map[string]bool{}; !seen[n]; n = lines[n] {
		seen[n] = true
		if nn := c.Net(n); nn != nil && nn.Label != "" {
			return graph.WithoutVolts(nn.Label)
		}
		if _, ok := lines[n]; !ok {
			break
		}
	}
	return strings.ToUpper(net)
}

// supplyLines maps each undeclared net of the original circuit that
// carries a supply to the net it is fed from (itself for a reservoir).
func (r *Result) supplyLines() map[string]string {
	c := r.Circuit
	out := map[string]string{}
	var queue []string
	if r.DC != nil {
		for _, e := range r.DC.Estimates {
			if n := c.Net(e.Net); n != nil && n.Role == graph.Signal {
				out[e.Net] = e.Net
				queue = append(queue, e.Net)
			}
		}
	}
	for _, n := range c.Nets {
		if n.Role == graph.Supply {
			queue = append(queue, n.Name)
		}
	}
	for len(queue) > 0 {
		net := queue[0]
		queue = queue[1:]
		for _, cn := range c.ConnsOf(net) {
			p := cn.Part
			if (p.Kind != graph.Resistor && p.Kind != graph.Inductor) || len(p.Pins) != 2 {
				continue
			}
			next := p.Pins[0].Net
			if next == net {
				next = p.Pins[1].Net
			}
			nn := c.Net(next)
			if _, seen := out[next]; seen || nn == nil || nn.Role != graph.Signal {
				continue
			}
			if p.Kind == graph.Resistor && legToChassis(c, next) {
				continue
			}
			out[next] = net
			queue = append(queue, next)
		}
	}
	return out
}

// legToChassis says whether a resistor or choke runs from net to chassis:
// a divider's tap, or a line with a bleeder, whose far side is a bias
// point when it is fed through a resistor.
func legToChassis(c *graph.Circuit, net string) bool {
	for _, cn := range c.ConnsOf(net) {
		p := cn.Part
		if (p.Kind != graph.Resistor && p.Kind != graph.Inductor) || len(p.Pins) != 2 {
			continue
		}
		for _, pn := range p.Pins {
			if pn.Net != net && c.RoleOf(pn.Net) == graph.Ground {
				return true
			}
		}
	}
	return false
}
