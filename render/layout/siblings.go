package layout

import (
	"slices"

	"pare/graph"
)

// A valve's leads leave it on the sides they are drawn on: the anode up to
// its load, the screen and the further grids right to their feeds, the
// cathode down to its bias. A wire of one of those nets drawn across a
// wire of another of the same valve reads as a tangle round the valve (the
// blind reviews rejected faded sheets whose anode lead crossed the screen
// feed or the cathode lead of its own valve, review19 a04 and a05), so the
// search prices such a crossing above a crossing with any other net: a
// wire goes round, or crosses a wire the valve does not own.

// siblingCost is what a crossing of two leads of one valve costs beyond a
// plain crossing: three crossings more, so a detour of up to that many
// steps, or a crossing with another net, is taken first (at one crossing
// more, the examples and review13..19 faded on A3 kept 16 of 17 such
// crossings: round a valve the way round is rarely that short).
const siblingCost = 3 * crossCost

// siblingNets lists, per net (by id-1), the nets its wires must not cross
// (none unless the sheet's Options.LeadsApart):
// for every valve on the sheet, its anode's net against the nets of its
// screen, further grids and cathode, both ways round. The control grid's
// wire enters from the left and the heaters are faded or tagged, so
// neither is counted.
func (rt *router) siblingNets() {
	if !rt.ly.o.LeadsApart {
		return
	}
	id := map[string]int32{}
	for i, nr := range rt.nets {
		id[nr.name] = int32(i + 1)
	}
	rt.sib = make([][]int32, len(rt.nets))
	add := func(a, b int32) {
		for _, v := range rt.sib[a-1] {
			if v == b {
				return
			}
		}
		rt.sib[a-1] = append(rt.sib[a-1], b)
	}
	for _, cl := range rt.ly.cells {
		p := realPart(cl)
		if p == nil || p.Kind != graph.Valve {
			continue
		}
		var anodes, others []int32
		for _, pn := range cl.shape.Pins {
			n := id[pn.Net]
			if n == 0 {
				continue // a rail or AC ground: not wired
			}
			switch graph.RoleOfPin(p.Kind, pn.Name) {
			case graph.RoleOutput:
				anodes = append(anodes, n)
			case graph.RoleGrid, graph.RoleCommon:
				others = append(others, n)
			}
		}
		for _, a := range anodes {
			for _, o := range others {
				if a != o {
					add(a, o)
					add(o, a)
				}
			}
		}
	}
}

// siblingMask marks, for the search of net, the nets it must not cross
// (indexed by net id); nil when there are none. The mask is the scratch's
// own, cleared of the last search's marks.
func (rt *router) siblingMask(net int32) []bool {
	sc := rt.sc
	for _, v := range sc.sibSet {
		sc.sib[v] = false
	}
	sc.sibSet = sc.sibSet[:0]
	if len(rt.sib) < int(net) || len(rt.sib[net-1]) == 0 {
		return nil
	}
	if len(sc.sib) <= len(rt.nets) {
		sc.sib = make([]bool, len(rt.nets)+1)
	}
	for _, v := range rt.sib[net-1] {
		sc.sib[v] = true
		sc.sibSet = append(sc.sibSet, v)
	}
	return sc.sib
}

// pricedCrossingsOf counts the cells where the given nets cross another
// net, a crossing of two leads of one valve as the search prices it (one
// crossing and siblingCost more). Rip-up and reroute of such a pair judges
// by it, so it keeps a wiring the search itself would take: judged by the
// plain count, an output pentode's anode lead kept its crossing of the
// screen feed rather than one going round past two other nets' wires
// (review17 a05's faded sheet: the anode lead over the screen feed and
// the HT line, now up and over to the transformer).
func (rt *router) pricedCrossingsOf(ids ...int) int {
	seen := map[int]bool{}
	n := 0
	for _, id := range ids {
		for _, c := range rt.nets[id].cells {
			o := rt.g[c].own
			if o[1] == 0 || seen[c] {
				continue
			}
			seen[c] = true
			n++
			if rt.siblings(o[0], o[1]) {
				n += siblingCost / crossCost
			}
		}
	}
	return n
}

// siblings says whether nets a and b (ids) lead from one valve, its anode
// and another of its electrodes.
func (rt *router) siblings(a, b int32) bool {
	if int(a) > len(rt.sib) || a < 1 {
		return false
	}
	return slices.Contains(rt.sib[a-1], b)
}
