package layout

import (
	"sort"

	"pare/graph"
)

// order sorts the blocks of each column by the barycentre of their
// neighbours in the columns before (sweeping right) and after (sweeping
// left), the crossing reduction of layered drawing, starting from and
// ending in the trade's order of kinds (kindRank).
func (ly *state) order(cols [][]*block) {
	for _, col := range cols {
		sort.SliceStable(col, func(i, j int) bool { return kindRank(col[i]) < kindRank(col[j]) })
		for i, b := range col {
			b.pos = float64(i)
		}
	}
	byNet := map[string][]*block{}
	for _, col := range cols {
		for _, b := range col {
			for _, cl := range b.cells {
				for _, n := range ly.signalNets(cl) {
					byNet[n] = append(byNet[n], b)
				}
			}
		}
	}
	for it := 0; it < 2; it++ {
		for i := 1; i < len(cols); i++ {
			ly.sweep(cols[i], i-1, byNet)
		}
		for i := len(cols) - 2; i >= 0; i-- {
			ly.sweep(cols[i], i+1, byNet)
		}
	}
	// the signal path stays on top of its column (active parts, then series
	// parts, then the shunts hanging below), in barycentre order within
	// each kind; parts the orientation search sent down go last
	for _, col := range cols {
		rank := func(b *block) int {
			k := kindRank(b)
			if len(ly.signalNets(b.cells[0])) == 0 && b.cells[0].edge == 0 {
				// a part on rails only (a battery, a heater bypass) stands
				// under the signal path's parts, not among them
				k = 3
			}
			if ly.entersCommon(b.cells[0]) {
				// a source entering on a common electrode (an injected
				// oscillator) stands under the input that enters on the
				// control electrode, as the electrodes stand
				k = 2
			}
			if _, sunk := ly.turns[sinkKey+b.cells[0].ref]; sunk {
				k += 3
			}
			return k
		}
		sort.SliceStable(col, func(a, b int) bool { return rank(col[a]) < rank(col[b]) })
	}
}

// kindRank orders a column's blocks: active parts first, then parts lying
// along the signal path, then the shunts standing upright.
func kindRank(b *block) int {
	cl := b.cells[0]
	switch {
	case cl.part.IsActive():
		return 0
	case !isVertical(cl):
		return 1
	}
	return 2
}

// sweep sorts one column by the mean position of each block's neighbours in
// column from; a block without neighbours there keeps its position.
func (ly *state) sweep(col []*block, from int, byNet map[string][]*block) {
	if len(col) < 2 {
		return
	}
	key := make(map[*block]float64, len(col))
	for _, b := range col {
		sum, n := 0.0, 0.0
		for _, cl := range b.cells {
			for _, net := range ly.signalNets(cl) {
				for _, nb := range byNet[net] {
					if nb.col == from {
						sum += nb.pos
						n++
					}
				}
			}
		}
		if n > 0 {
			key[b] = sum / n
		} else {
			key[b] = b.pos
		}
	}
	sort.SliceStable(col, func(a, c int) bool { return key[col[a]] < key[col[c]] })
	for k, b := range col {
		b.pos = float64(k)
	}
}

// entersCommon says whether cl is a port on the left edge whose net meets
// the nearest active parts at their common electrodes only (a page's
// connector bringing a row's signal on is no source of its own).
func (ly *state) entersCommon(cl *cell) bool {
	if cl.edge >= 0 || cl.part.Kind != graph.Port || len(cl.part.Pins) != 1 || ly.continued(cl.part.Pins[0].Net) {
		return false
	}
	e := ly.nearestElectrodes(cl.part.Pins[0].Net, ly.carries)
	return e.common && !e.control && !e.output
}

// continued says whether net is carried to or from another row or page
// by a connector.
func (ly *state) continued(net string) bool {
	for _, k := range ly.o.Continues {
		if k.Net == net {
			return true
		}
	}
	return false
}
