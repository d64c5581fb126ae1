package pipeline

import (
	"slices"
	"sort"
	"strings"

	"pare/graph"
)

// withSupplyReturns is the reduced circuit for its sheet with every
// terminal that returned to an undeclared supply line drawn returning to
// that line, not to chassis: only ground nets get the earth symbol
// (docs/netlist.md). A line is a net the original circuit feeds with power
// (a declared supply, or a reservoir the DC solution estimates from a
// captured rectifier) directly or through series chokes and resistors; a
// net with a resistor or choke to chassis as well is a line only when it
// carries supply current on (carriesSupply): a smoothed HT with a bleeder
// and a dummy load is a supply line, a divider's tap that sets a base or
// grid bias is a bias point. An anode load fed from an undeclared
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
			ln, ok := lines[was]
			if !ok || pn.Rail != "" || pn.Net == was || !c.RoleOf(pn.Net).IsACGround() || c.RoleOf(pn.Net).IsRail() {
				continue
			}
			if !allReturnTo(r.Circuit, p, was) {
				continue
			}
			if out == nil {
				out = c.Clone()
			}
			out.Part(p.Ref).Pins[i].Rail = was
			if out.Net(was) == nil && !hasRail(out, was) {
				n := graph.Net{Name: was, Role: graph.Supply, Fed: ln.from, Label: lineLabel(r.Circuit, lines, was)}
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

// allReturnTo tells whether every part p stands for had a terminal on the
// line: a merged part keeps one member's ref, and where its members
// returned to different lines (review 17's b05: a screen feed merged with
// the smoothing resistor, the bleeder and four decouplers) a tag naming the
// survivor's line would say the whole bundle returns there.
func allReturnTo(orig *graph.Circuit, p *graph.Part, line string) bool {
	for _, ref := range p.Origins() {
		q := orig.Part(ref)
		if q == nil || !slices.ContainsFunc(q.Pins, func(pn graph.Pin) bool { return pn.Net == line }) {
			return false
		}
	}
	return true
}

func hasRail(c *graph.Circuit, name string) bool {
	for _, n := range c.Rails {
		if n.Name == name {
			return true
		}
	}
	return false
}

// lineLabel is a supply line's tag, as a decoupled rail's is named
// (graph.Circuit.MarkDecoupled): its own label; else the line feeding it,
// by that line's label without a voltage or its name in capitals, and the
// part it comes through ("HT via R2", "HT2 via R2"), since the line is not
// the one feeding it and its own voltage is added from the operating point;
// a reservoir, fed by no part, by its label or its name in capitals
// ("HT_RES"), as a service sheet names an undeclared line.
func lineLabel(c *graph.Circuit, lines map[string]supplyLine, net string) string {
	if nn := c.Net(net); nn != nil && nn.Label != "" {
		if graph.WithoutVolts(nn.Label) == "" {
			return "" // only a voltage: the solved one is added
		}
		return graph.RailName(nn.Label) // "+9 V line" stays whole, never "line"
	}
	ln := lines[net]
	if ln.via == "" {
		return strings.ToUpper(net)
	}
	name := strings.ToUpper(ln.from)
	if nn := c.Net(ln.from); nn != nil && nn.Label != "" {
		name = graph.FeedName(nn)
	}
	return name + " via " + ln.via
}

// A supplyLine is an undeclared net that carries a supply: the net it is
// fed from (itself for a reservoir) and the part it comes through.
type supplyLine struct{ from, via string }

// supplyLines maps each undeclared net of the original circuit that
// carries a supply to the net it is fed from and the part between.
func (r *Result) supplyLines() map[string]supplyLine {
	c := r.Circuit
	out := map[string]supplyLine{}
	var queue []string
	if r.DC != nil {
		for _, e := range r.DC.Estimates {
			if n := c.Net(e.Net); n != nil && n.Role == graph.Signal {
				out[e.Net] = supplyLine{from: e.Net}
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
			next, ok := seriesFar(p, net)
			if !ok {
				continue
			}
			nn := c.Net(next)
			if _, seen := out[next]; seen || nn == nil || nn.Role != graph.Signal {
				continue
			}
			if p.Kind == graph.Resistor && legToChassis(c, next) && !carriesSupply(c, next, net) {
				continue
			}
			out[next] = supplyLine{from: net, via: p.Ref}
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

// carriesSupply says whether a net fed from feed passes supply current on:
// whether the resistors and chokes it reaches over undeclared nets, not
// back through feed nor through chassis or a rail, end at a device's
// output, common or further grid (an anode, a screen, a collector). A
// divider's tap reaches only control electrodes (a base, a grid), or none.
func carriesSupply(c *graph.Circuit, net, feed string) bool {
	seen := map[string]bool{net: true, feed: true}
	for queue := []string{net}; len(queue) > 0; queue = queue[1:] {
		for _, cn := range c.ConnsOf(queue[0]) {
			p := cn.Part
			if p.IsActive() {
				switch graph.RoleOfPin(p.Kind, cn.Pin) {
				case graph.RoleOutput, graph.RoleGrid, graph.RoleCommon:
					return true
				}
				continue
			}
			if (p.Kind != graph.Resistor && p.Kind != graph.Inductor) || len(p.Pins) != 2 {
				continue
			}
			for _, pn := range p.Pins {
				if nn := c.Net(pn.Net); !seen[pn.Net] && nn != nil && nn.Role == graph.Signal {
					seen[pn.Net] = true
					queue = append(queue, pn.Net)
				}
			}
		}
	}
	return false
}

// seriesFar is the net at the far end of a two-pin resistor or inductor
// from net: the next point along a supply line's series chain.
func seriesFar(p *graph.Part, net string) (string, bool) {
	if (p.Kind != graph.Resistor && p.Kind != graph.Inductor) || len(p.Pins) != 2 {
		return "", false
	}
	if p.Pins[0].Net == net {
		return p.Pins[1].Net, true
	}
	return p.Pins[0].Net, true
}
