package layout

import (
	"maps"
	"slices"

	"pare/graph"
)

// carries says whether the signal passes through net n: a wired net
// neither at AC ground on the circuit drawn nor tied to it by the
// reduction (Options.Quiet). A part on such nets only stands with its
// neighbours (railLayers), as a part on rails does.
func (ly *state) carries(n string) bool {
	return n != notConnected && n != "" && !ly.c.RoleOf(n).IsACGround() && !ly.o.Quiet[n]
}

// quietLayers ranks the parts the walk left because the signal reaches
// them only over nets the reduction tied to AC ground (Options.Quiet: a
// decoupler on its supply line, a bias divider behind its bypass) one
// layer after the lowest-ranked part on such a net, breadth first through
// further such parts, as the walk ranked them when it crossed those nets,
// while the parts beyond keep the signal's own order.
func (ly *state) quietLayers(rank map[string]int) {
	if len(ly.o.Quiet) == 0 {
		return
	}
	onNet := map[string][]*cell{}
	control := map[string]string{} // a quiet net's device, by its control electrode
	for _, cl := range ly.cells {
		for _, pn := range cl.part.Pins {
			if ly.o.Quiet[pn.Net] {
				onNet[pn.Net] = append(onNet[pn.Net], cl)
				if cl.part.IsActive() && graph.RoleOfPin(cl.part.Kind, pn.Name) == graph.RoleControl {
					control[pn.Net] = cl.ref
				}
			}
		}
	}
	// level[r] are the quiet nets first reached from a part of rank r
	level := map[int][]string{}
	reached := map[string]bool{}
	lo, hi := -1, -1
	reach := func(n string, r int) {
		if !reached[n] {
			reached[n] = true
			level[r] = append(level[r], n)
			hi = max(hi, r)
			if lo < 0 || r < lo {
				lo = r
			}
		}
	}
	for _, n := range slices.Sorted(maps.Keys(onNet)) {
		best := -1
		for _, cl := range onNet[n] {
			if r, ok := rank[cl.ref]; ok && (best < 0 || r < best) {
				best = r
			}
		}
		if best >= 0 {
			reach(n, best)
		}
	}
	for r := lo; r >= 0 && r <= hi; r++ {
		for i := 0; i < len(level[r]); i++ {
			n := level[r][i]
			for _, cl := range onNet[n] {
				if _, ok := rank[cl.ref]; ok {
					continue
				}
				rank[cl.ref] = r + 1
				if d, ok := control[n]; ok && rank[d] == r {
					// a shunt from a device's control electrode stands
					// in the device's layer, before it (controlShunts)
					rank[cl.ref] = r
				}
				for _, pn := range cl.part.Pins {
					if ly.o.Quiet[pn.Net] {
						reach(pn.Net, r+1)
					}
				}
			}
		}
	}
}
