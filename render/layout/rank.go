package layout

import (
	"slices"

	"pare/graph"
)

// rank gives every cell a layer along the signal flow, marks the shunts that
// stand before an active part's control electrode, sends ports to the left
// or right edge, and turns the layers into columns.
func (ly *state) rank() {
	byNet := ly.cellsByNet()
	rank := ly.signalRank(byNet)
	ly.quietLayers(rank)
	ly.railLayers(rank)
	ly.supplyRanks(rank)
	ly.commonUnder(rank)
	ly.before = ly.controlShunts(rank)
	ly.inFirst(rank)
	for _, cl := range ly.cells {
		if d, ok := ly.turns[shiftKey+cl.ref]; ok && rank[cl.ref]+d >= 0 {
			rank[cl.ref] += d
		}
	}
	ly.tankOf = ly.findTanks()
	ly.tankRanks(rank)
	ly.coldUnder(rank)
	ly.injectionRanks(rank)
	ly.rankOf = rank
	ly.portSides(byNet)
	ly.assignColumns()
}

// cellsByNet lists the cells on each wired net, in cell order.
func (ly *state) cellsByNet() map[string][]*cell {
	byNet := map[string][]*cell{}
	for _, cl := range ly.cells {
		for _, n := range ly.signalNets(cl) {
			byNet[n] = append(byNet[n], cl)
		}
	}
	return byNet
}

// signalRank is the breadth-first distance of every cell from the signal
// input nets over shared signal nets (graph.Walk): the parts on an input at
// 1, input flags and ports there at 0; each piece the inputs do not reach
// follows, from its first cell, one layer after the highest so far.
func (ly *state) signalRank(byNet map[string][]*cell) map[string]int {
	parts := make([]*graph.Part, len(ly.cells))
	for i, cl := range ly.cells {
		parts[i] = cl.part
	}
	view := graph.NewView(graph.NewIndex(parts, nil), parts)
	w := graph.NewWalk(view)
	w.Follow = ly.carries
	// a part from a device's control or common electrode to a net the
	// signal reaches after the device (graph.FeedbackParts) carries it
	// only into that electrode, never out of it; one the walk reaches
	// later than the electrode (a feedback part) takes its layer
	fb := graph.FeedbackParts(parts, view, w.Follow)
	// a transformer an output electrode feeds is entered from that
	// electrode's net only (fedNets)
	fed := ly.fedNets(parts)
	w.Enter = func(p *graph.Part, pin string) bool {
		if nets, ok := fed[p]; ok && !nets[p.NetOf(pin)] {
			return false
		}
		into, ok := fb[p]
		return !ok || p.NetOf(pin) != into
	}
	var inputs []string
	for _, in := range ly.c.Inputs {
		if w.Follow(in) {
			inputs = append(inputs, in)
		}
	}
	inputs = append(inputs, ly.enteringNets(w.Follow, inputs)...)
	w.FromNets(inputs, 1)
	rank := map[string]int{}
	maxR := 0
	collect := func() {
		for _, cl := range ly.cells {
			if r, ok := w.PartDist(cl.part); ok {
				if _, done := rank[cl.ref]; !done {
					rank[cl.ref] = r
					if cl.part.Kind == graph.Port && slices.Contains(inputs, cl.part.NetOf("1")) {
						rank[cl.ref] = 0 // an input flag, port or off-row connector (cl.edge < 0 is one)
					}
					maxR = max(maxR, rank[cl.ref])
				}
			}
		}
	}
	collect()
	ly.quietConnectors(rank, byNet)
	quietRanked := func(n string) bool {
		if !ly.o.Quiet[n] {
			return false
		}
		for _, nb := range byNet[n] {
			if _, ok := rank[nb.ref]; ok {
				return true
			}
		}
		return false
	}
	for _, cl := range ly.cells {
		sig := ly.signalNets(cl)
		if _, ok := rank[cl.ref]; ok || len(sig) == 0 {
			continue
		}
		switch {
		case slices.ContainsFunc(sig, ly.carries):
			w.FromPart(cl.part, maxR+1)
		case slices.ContainsFunc(sig, quietRanked):
			continue // one after its ranked neighbour (quietLayers)
		default:
			// a piece that starts at a part on quiet nets only (an
			// oscillator's base bypass, first by name) starts from
			// those nets, as it did before they were told apart
			w.FromNets(sig, maxR+1)
		}
		collect()
	}
	for _, cl := range ly.cells {
		if into, back := fb[cl.part]; back {
			if r, ok := w.NetDist(into); ok && r < rank[cl.ref] {
				rank[cl.ref] = r
			}
		}
	}
	return rank
}

// railLayers puts the parts on rails only (no signal net) beside the
// lowest-ranked part sharing a net other than ground with them, or in
// layer 0.
func (ly *state) railLayers(rank map[string]int) {
	railNets := map[string][]*cell{}
	for _, cl := range ly.cells {
		for _, pn := range cl.part.Pins {
			if ly.c.RoleOf(pn.Net) != graph.Ground && pn.Net != notConnected {
				railNets[pn.Net] = append(railNets[pn.Net], cl)
			}
		}
	}
	for _, cl := range ly.cells {
		if _, ok := rank[cl.ref]; ok {
			continue
		}
		best := -1
		for _, pn := range cl.part.Pins {
			for _, nb := range railNets[pn.Net] {
				if r, ok := rank[nb.ref]; ok && nb != cl && (best < 0 || r < best) {
					best = r
				}
			}
		}
		rank[cl.ref] = max(best, 0)
	}
}

// commonUnder puts the parts from an active part's common terminal to
// ground (cathode or emitter resistor and bypass) in the active part's
// layer, to stand under it.
func (ly *state) commonUnder(rank map[string]int) {
	common := map[string]int{}
	for _, cl := range ly.cells {
		if !cl.part.IsActive() {
			continue
		}
		if pin := cl.part.PinWithRole(graph.RoleCommon); pin != "" {
			if n := cl.part.NetOf(pin); !ly.c.RoleOf(n).IsACGround() {
				common[n] = rank[cl.ref]
			}
		}
	}
	for _, cl := range ly.cells {
		if cl.part.IsActive() {
			continue
		}
		nets := ly.signalNets(cl)
		if len(nets) == 1 && len(cl.part.Pins) == 2 {
			if r, ok := common[nets[0]]; ok {
				rank[cl.ref] = r
			}
		}
	}
}

// controlShunts marks the shunts from an active part's control electrode
// to AC ground (a grid leak, a base bias resistor) in the active part's
// layer: each stands in a column of its own just before the active part,
// hanging from the wire into the grid, not stacked under the valve with the
// cathode parts.
func (ly *state) controlShunts(rank map[string]int) map[string]bool {
	control := map[string]int{}
	for _, cl := range ly.cells {
		if !cl.part.IsActive() {
			continue
		}
		if pin := cl.part.PinWithRole(graph.RoleControl); pin != "" {
			if n := cl.part.NetOf(pin); n != "" && n != notConnected && !ly.c.RoleOf(n).IsACGround() {
				if r, ok := control[n]; !ok || rank[cl.ref] < r {
					control[n] = rank[cl.ref]
				}
			}
		}
	}
	before := map[string]bool{}
	for _, cl := range ly.cells {
		if cl.part.IsActive() || len(cl.part.Pins) != 2 || cl.part.Kind == graph.Port {
			continue
		}
		nets := ly.signalNets(cl)
		if len(nets) != 1 {
			continue
		}
		if r, ok := control[nets[0]]; ok && r == rank[cl.ref] {
			before[cl.ref] = true
		}
	}
	return before
}

// portSides sends output flags and ports on output nets to the right edge,
// ports on input nets to the left, other ports to the side their net's
// parts are nearer.
func (ly *state) portSides(byNet map[string][]*cell) {
	maxRank := 0
	for _, r := range ly.rankOf {
		maxRank = max(maxRank, r)
	}
	outputs := map[string]bool{}
	for _, n := range ly.c.Outputs {
		outputs[n] = true
	}
	inputs := map[string]bool{}
	for _, n := range ly.c.Inputs {
		inputs[n] = true
	}
	for _, cl := range ly.cells {
		if cl.part.Kind != graph.Port || cl.edge != 0 || len(cl.part.Pins) == 0 || ly.supplyPorts[cl.ref] {
			continue
		}
		net := cl.part.Pins[0].Net
		switch {
		case inputs[net]:
			cl.edge = -1
		case outputs[net]:
			cl.edge = 1
		case !ly.continued(net) && ly.injects(net):
			// a source no input names (a separate oscillator's
			// injection) enters on the left, as an input does
			cl.edge = -1
		default:
			lo := maxRank
			for _, nb := range byNet[net] {
				if nb != cl {
					lo = min(lo, ly.rankOf[nb.ref])
				}
			}
			if len(byNet[net]) <= 1 || 2*lo <= maxRank {
				cl.edge = -1
			} else {
				cl.edge = 1
			}
		}
	}
}

// enteringNets are the nets of a row of a page that bring its signal in
// from earlier rows, not in inputs already: ranked from them, the row's
// parts follow the signal on from there, where ranked from its first part
// by name an IF can could stand left of the valve feeding it. A net that
// comes in but leads first to an active part's output or common electrode
// (an overall feedback lead from the loudspeaker back to the first valve's
// cathode, on the output stage's row) is the signal going back, not coming
// in, and is left out while another net comes in to a control electrode.
func (ly *state) enteringNets(follow func(string) bool, inputs []string) []string {
	if ly.o.RankFromFirst {
		return nil
	}
	var all, in []string
	for _, k := range ly.o.Continues {
		if k.In && follow(k.Net) && !slices.Contains(inputs, k.Net) && !slices.Contains(all, k.Net) {
			all = append(all, k.Net)
			if ly.leadsToControl(k.Net, follow) {
				in = append(in, k.Net)
			}
		}
	}
	if len(in) == 0 {
		return all
	}
	return in
}

// injects says whether a port's net, one no input or output names, meets
// the nearest active parts only at their control or common electrodes: a
// separate oscillator's injection or a second input, a source.
func (ly *state) injects(net string) bool {
	e := ly.nearestElectrodes(net, ly.carries)
	return (e.control || e.common) && !e.output
}

// injectionRanks moves the passive parts between a source port no input
// names (injects) and the device it feeds to the layer before that
// device: the walk from the inputs reached them through the device's
// common electrode, after it, and they stood right of the stage with the
// port's wire run back under it (review18 b02's oscillator injection).
func (ly *state) injectionRanks(rank map[string]int) {
	named := map[string]bool{}
	for _, n := range append(slices.Clone(ly.c.Inputs), ly.c.Outputs...) {
		named[n] = true
	}
	for _, cl := range ly.cells {
		if cl.part.Kind != graph.Port || len(cl.part.Pins) != 1 || cl.conn || named[cl.part.Pins[0].Net] || ly.continued(cl.part.Pins[0].Net) || !ly.injects(cl.part.Pins[0].Net) {
			continue
		}
		chain, dev := ly.chainTo(cl.part.Pins[0].Net)
		if dev == nil {
			continue
		}
		for i, p := range chain {
			if r := rank[dev.ref] - len(chain) + i; r >= 0 && r < rank[p.ref] {
				rank[p.ref] = r
			}
		}
	}
}

// chainTo follows passive two-pin parts from net over carried nets, one
// part per net, to the first active part: the parts in order and the
// active part, or nil when the way branches or ends first. A shunt to a
// net not carried (an emitter resistor to chassis) does not branch it.
func (ly *state) chainTo(net string) ([]*cell, *cell) {
	var chain []*cell
	seen := map[*cell]bool{}
	for len(chain) <= len(ly.cells) {
		var dev, pass *cell
		for _, o := range ly.cells {
			if seen[o] || o.part.Kind == graph.Port || !slices.ContainsFunc(o.part.Pins, func(p graph.Pin) bool { return p.Net == net }) {
				continue
			}
			switch {
			case o.part.IsActive():
				dev = o
			case len(o.part.Pins) == 2 && ly.carries(o.part.Pins[0].Net) && ly.carries(o.part.Pins[1].Net):
				if pass != nil {
					return nil, nil
				}
				pass = o
			}
		}
		if dev != nil {
			return chain, dev
		}
		if pass == nil {
			return nil, nil
		}
		seen[pass] = true
		chain = append(chain, pass)
		if pass.part.Pins[0].Net == net {
			net = pass.part.Pins[1].Net
		} else {
			net = pass.part.Pins[0].Net
		}
	}
	return nil, nil
}
