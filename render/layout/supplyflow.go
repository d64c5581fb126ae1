package layout

import (
	"sort"
	"strings"

	"pare/graph"
)

// A power supply drawn as the trade draws it (common practice): the
// current's own path left to right, mains plug, fuse and switch, the
// transformer, the rectifier, the reservoir, each smoothing section, and
// the rails at the right. The layered placement ranks parts by their
// distance from the signal input, which reaches a supply through its HT
// line and so draws it backwards (smoothing first, mains last); a supply
// frame (Frame.Supply) is ranked afresh from its transformer instead. A
// four-diode bridge is drawn as a diamond with its corners at the four
// compass points: the AC corners at the top and bottom, fed from the
// secondary's two ends without crossing, the − corner at the left and the
// + corner at the right, towards the reservoir. The diodes are upright
// symbols (the grid has no 45° parts), each one on the side of the diamond
// between the two corners it joins.

// supplyCells are the cells of the supply frames, by ref.
func (ly *state) supplyCells() map[string]*cell {
	in := map[string]bool{}
	for _, f := range ly.o.Frames {
		if f.Supply {
			for _, r := range f.Parts {
				in[r] = true
			}
		}
	}
	out := map[string]*cell{}
	for _, cl := range ly.cells {
		if in[cl.ref] && cl.edge == 0 && !cl.conn {
			out[cl.ref] = cl
		}
	}
	return out
}

// supplyRanks ranks the supply frames' parts along the supply's flow:
// the unframed parts before the transformer's primary (switch, fuse, the
// mains ports) first, farthest first, then the transformer, then the parts
// after its secondary by their distance from it over every net but
// chassis (a rail the netlist declares is the supply's own line here),
// a bridge's − diodes a rank before its + diodes, the parts on a rail
// alone last. The mains ports stand in the supply's first column, not at
// the sheet's edge (supplyPorts). The supply's ranks start at the lowest
// rank its parts had, so it keeps its place among the stages.
func (ly *state) supplyRanks(rank map[string]int) {
	in := ly.supplyCells()
	ly.bridges = nil
	ly.supplyPorts = map[string]bool{}
	ly.supplyRanked = map[string]bool{}
	defer func() {
		for r := range in {
			ly.supplyRanked[r] = true
		}
	}()
	if len(ly.o.SupplyFlow) > 0 {
		ly.rankByFlow(rank, ly.o.SupplyFlow)
		return
	}
	t := ly.supplyTransformer(in)
	if t == nil {
		return
	}
	sec := ly.secondaryNets(t, in)
	if len(sec) == 0 {
		return
	}
	var list []*cell
	for _, cl := range ly.cells {
		if in[cl.ref] != nil {
			list = append(list, cl)
		}
	}
	ly.bridges = findBridges(list)
	up := ly.upstream(t, sec, in)
	down := ly.downstream(t, sec, in)
	base := rank[t.ref]
	for r := range in {
		base = min(base, rank[r])
	}
	for r := range up {
		base = min(base, rank[r])
	}
	far := 0
	for _, d := range up {
		far = max(far, d)
	}
	for r, d := range up {
		rank[r] = base + far - d
		ly.supplyRanked[r] = true
	}
	rank[t.ref] = base + far
	last := 0
	for r, e := range down {
		ly.supplyRanked[r] = true
		rank[r] = base + far + e
		last = max(last, e)
	}
	for r := range in {
		if _, ok := down[r]; !ok && r != t.ref {
			rank[r] = base + far + last + 1
		}
	}
}

// SupplyFlow is each supply part's step along its supply's flow on the
// whole sheet (supplyRanks), for the rows a paged sheet is cut into: a
// row holding the smoothing sections but not the transformer they flow
// from keeps them in the whole supply's order (Options.SupplyFlow).
func SupplyFlow(c *graph.Circuit, o Options) map[string]int {
	o.SupplyFlow = nil
	ly := &state{c: c, o: o, cells: makeCells(c, o)}
	rank := map[string]int{}
	ly.supplyRanks(rank)
	out := map[string]int{}
	for r, v := range rank {
		if ly.supplyRanked[r] {
			out[r] = v
		}
	}
	return out
}

// rankByFlow ranks the cells a whole sheet's SupplyFlow gives in its
// order, from the lowest rank they had; the ports in it stand in the
// flow, and the bridges whose four diodes are here are drawn as diamonds.
func (ly *state) rankByFlow(rank map[string]int, flow map[string]int) {
	base, lo := -1, 0
	var list []*cell
	for _, cl := range ly.cells {
		f, ok := flow[cl.ref]
		if !ok || cl.conn {
			continue
		}
		if base < 0 || rank[cl.ref] < base {
			base = rank[cl.ref]
		}
		if len(list) == 0 || f < lo {
			lo = f
		}
		list = append(list, cl)
	}
	for _, cl := range list {
		ly.supplyRanked[cl.ref] = true
		rank[cl.ref] = base + flow[cl.ref] - lo
		if cl.part.Kind == graph.Port {
			ly.supplyPorts[cl.ref] = true
		}
	}
	ly.bridges = findBridges(list)
}

// supplyTransformer is the first transformer among the supply's cells
// (the mains transformer: the rectifier stage holds it), nil for none.
func (ly *state) supplyTransformer(in map[string]*cell) *cell {
	for _, cl := range ly.cells {
		if in[cl.ref] != nil && cl.part.Kind == graph.Transformer {
			return cl
		}
	}
	return nil
}

// secondaryNets are the transformer's nets a rectifier of the supply (a
// diode or a valve) has an anode on: the windings it feeds.
func (ly *state) secondaryNets(t *cell, in map[string]*cell) map[string]bool {
	mine := map[string]bool{}
	for _, n := range ly.signalNets(t) {
		mine[n] = true
	}
	out := map[string]bool{}
	for _, cl := range in {
		if cl.part.Kind != graph.Diode && cl.part.Kind != graph.Valve {
			continue
		}
		for _, pn := range cl.part.Pins {
			// an anode: a rectifier's heater winding at HT (a directly
			// heated valve's) is the output side, not the feed
			if mine[pn.Net] && strings.HasPrefix(pn.Name, "a") {
				out[pn.Net] = true
			}
		}
	}
	return out
}

// upstream is, by ref, each part before the transformer's primary (its
// wired nets the rectifier is not on) with its distance from the primary:
// parts no other frame holds, and no port on the signal's input or output.
func (ly *state) upstream(t *cell, sec map[string]bool, in map[string]*cell) map[string]int {
	framed := map[string]bool{}
	for _, f := range ly.o.Frames {
		for _, r := range f.Parts {
			framed[r] = true
		}
	}
	ends := map[string]bool{}
	for _, n := range append(append([]string{}, ly.c.Inputs...), ly.c.Outputs...) {
		ends[n] = true
	}
	var from []string
	for _, n := range ly.signalNets(t) {
		if !sec[n] && !ends[n] {
			from = append(from, n)
		}
	}
	ok := func(cl *cell) bool {
		return cl != t && (in[cl.ref] != nil || !framed[cl.ref]) && !cl.conn && (cl.edge == 0 || cl.part.Kind == graph.Port)
	}
	dist := ly.walkFrom(from, ok, func(cl *cell) []string { return ly.signalNets(cl) }, ends)

	for r := range dist {
		if cl := ly.cellOf(r); cl != nil && cl.part.Kind == graph.Port {
			ly.supplyPorts[r] = true
		}
	}
	return dist
}

// downstream is, by ref, each supply part after the transformer's
// secondary with its rank after the transformer's, from its nets'
// distances from the secondary (over every net but chassis and the
// primary's): three ranks a net, the parts across it first (a snubber,
// the reservoir), then a bridge's − diodes into it, then the parts that
// lead on from it to the next net (a bridge's + diodes, the smoothing
// resistor or choke), so the supply reads reservoir, series part,
// smoothing capacitor.
func (ly *state) downstream(t *cell, sec map[string]bool, in map[string]*cell) map[string]int {
	var from []string
	for n := range sec {
		from = append(from, n)
	}
	sort.Strings(from)
	ok := ly.onSupply(t, in)
	dist, netAt := ly.walkNets(from, ok, ly.supplyNets, nil)
	minus := map[*cell]bool{}
	for _, b := range ly.bridges {
		minus[b.minus[0]], minus[b.minus[1]] = true, true
	}
	out := map[string]int{}
	for r := range dist {
		cl := ly.cellOf(r)
		lo, hi := -1, -1
		for _, n := range ly.supplyNets(cl) {
			if lo < 0 || netAt[n] < lo {
				lo = netAt[n]
			}
			hi = max(hi, netAt[n])
		}
		switch {
		case minus[cl] || cl.part.Kind == graph.Port:
			// a port taking the line on to a stage cut away stands
			// after the parts across the line, before the next section
			out[r] = 3*lo + 2
		case hi > lo:
			out[r] = 3*lo + 3
		default:
			out[r] = 3*lo + 1
		}
	}
	return out
}

// onSupply lets a cell into the supply's flow after the transformer t: a
// part of a supply frame, or an unframed part or port hanging on the
// supply frames' nets alone (a snubber across the secondary, a bleeder, a
// port taking the HT to a stage cut away, which then stands at the
// supply's end, not at the sheet's edge). A decoupler leading on to a
// stage's feed is the stage's.
func (ly *state) onSupply(t *cell, in map[string]*cell) func(*cell) bool {
	framed := map[string]bool{}
	for _, f := range ly.o.Frames {
		for _, r := range f.Parts {
			framed[r] = true
		}
	}
	nets := map[string]bool{}
	for _, cl := range in {
		for _, n := range ly.supplyNets(cl) {
			nets[n] = true
		}
	}
	for _, n := range append(append([]string{}, ly.c.Inputs...), ly.c.Outputs...) {
		delete(nets, n)
	}
	return func(cl *cell) bool {
		switch {
		case cl == t || cl.conn:
			return false
		case in[cl.ref] != nil:
			return true
		case framed[cl.ref] || cl.edge != 0 && cl.part.Kind != graph.Port:
			return false
		}
		own := ly.supplyNets(cl)
		for _, n := range own {
			if !nets[n] {
				return false
			}
		}
		if len(own) > 0 && cl.part.Kind == graph.Port {
			ly.supplyPorts[cl.ref] = true
		}
		return len(own) > 0
	}
}

// supplyNets are the nets a supply's part passes its current on: every
// pin's but chassis's and the not-connected net's.
func (ly *state) supplyNets(cl *cell) []string {
	var out []string
	for _, pn := range cl.part.Pins {
		if pn.Net != notConnected && pn.Net != "" && ly.c.RoleOf(pn.Net) != graph.Ground {
			out = append(out, pn.Net)
		}
	}
	return out
}

// walkFrom is the breadth-first distance of the cells ok lets in from the
// nets from (1 for a cell on one of them) over the nets each cell's nets
// gives, stopping at the nets in stop.
func (ly *state) walkFrom(from []string, ok func(*cell) bool, nets func(*cell) []string, stop map[string]bool) map[string]int {
	dist, _ := ly.walkNets(from, ok, nets, stop)
	return dist
}

// walkNets is walkFrom with each net's own distance: 0 for the nets
// from, one more than the cell's that first reached it.
func (ly *state) walkNets(from []string, ok func(*cell) bool, nets func(*cell) []string, stop map[string]bool) (map[string]int, map[string]int) {
	byNet := map[string][]*cell{}
	for _, cl := range ly.cells {
		if ok(cl) {
			for _, n := range nets(cl) {
				byNet[n] = append(byNet[n], cl)
			}
		}
	}
	dist := map[string]int{}
	seen := map[string]bool{}
	netAt := map[string]int{}
	frontier := from
	for d := 1; len(frontier) > 0; d++ {
		var next []string
		for _, n := range frontier {
			if seen[n] || stop[n] {
				continue
			}
			seen[n] = true
			netAt[n] = d - 1
			for _, cl := range byNet[n] {
				if _, done := dist[cl.ref]; done {
					continue
				}
				dist[cl.ref] = d
				next = append(next, nets(cl)...)
			}
		}
		frontier = next
	}
	return dist, netAt
}

// cellOf is the cell of a ref, nil for none.
func (ly *state) cellOf(ref string) *cell {
	for _, cl := range ly.cells {
		if cl.ref == ref {
			return cl
		}
	}
	return nil
}
