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

// quietConnectors ranks at 0, as an input connector, each off-row connector
// from an earlier row (at the left edge) whose nets are all quiet and carry
// no part the signal's walk ranked: the cold end of a winding drawn on the
// row before (a base link's bias point). A connector to a later row stands
// at the right edge and keeps its parts where they were.
// Ranked by the row's first quiet part instead, the bias divider, its
// decoupler and the AGC feed there started a piece of their own after
// everything the walk reached and stood at the row's far right, past the
// RF transformer, not at the base they bias (review17 b02's faded view).
// quietLayers then ranks them one after the connector, the first layer of
// the stage they are drawn in, and inFirst stands them before that layer's
// device, between the connector and the base: behind it, its emitter or
// cathode lead down to its bypass crossed the greyed line in.
func (ly *state) quietConnectors(rank map[string]int, byNet map[string][]*cell) {
	ly.quietIn = map[string]bool{}
	for _, cl := range ly.cells {
		if _, ok := rank[cl.ref]; ok || !cl.conn || cl.edge >= 0 {
			continue
		}
		sig := ly.signalNets(cl)
		quiet := len(sig) > 0
		for _, n := range sig {
			if !ly.o.Quiet[n] || slices.ContainsFunc(byNet[n], func(nb *cell) bool { _, r := rank[nb.ref]; return r }) {
				quiet = false
			}
		}
		if quiet {
			rank[cl.ref] = 0
			for _, n := range sig {
				ly.quietIn[n] = true
			}
		}
	}
}

// inFirst marks the shunts (one signal net, the other end at AC ground or
// on a rail) quietLayers ranked first on a net quietIn holds as standing
// before their layer's devices, the column controlShunts gives a shunt
// from a control electrode. A series part on such a net (a feed from a
// decoupled supply) stays in the device's column: before it, its lead on
// to the supply crossed the base wire.
func (ly *state) inFirst(rank map[string]int) {
	for _, cl := range ly.cells {
		if rank[cl.ref] != 1 || cl.edge != 0 || cl.part.IsActive() {
			continue
		}
		if sig := ly.signalNets(cl); len(sig) == 1 && ly.quietIn[sig[0]] {
			ly.before[cl.ref] = true
		}
	}
}
