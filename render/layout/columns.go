package layout

import (
	"sort"

	"pare/graph"
)

// assignColumns turns ranks (and stages, when frames are given) into
// columns: the stages left to right in frame order, the layers of a stage
// in rank order; input flags in column 0, output flags after the last.
func (ly *state) assignColumns() {
	st := ly.stages()
	type key struct{ stage, rank int }
	keys := map[key]bool{}
	for _, cl := range ly.cells {
		if cl.edge == 0 {
			keys[key{st[cl.ref], ly.column(cl)}] = true
		}
	}
	list := make([]key, 0, len(keys))
	for k := range keys {
		list = append(list, k)
	}
	sort.Slice(list, func(i, j int) bool {
		if list[i].stage != list[j].stage {
			return list[i].stage < list[j].stage
		}
		return list[i].rank < list[j].rank
	})
	colOf := map[key]int{}
	for i, k := range list {
		colOf[k] = i + 1
	}
	for _, cl := range ly.cells {
		switch cl.edge {
		case -1:
			cl.col = 0
		case 1:
			cl.col = len(list) + 1
		default:
			cl.col = colOf[key{st[cl.ref], ly.column(cl)}]
		}
	}
	ly.netColumns()
	ly.stageOf = st
}

// stages gives every part a stage (an index into Options.Frames): its own
// frame's, or a merged part's, or that of its nearest framed neighbour;
// parts no frame reaches get a stage of their own after the frames. Without
// frames no part has a stage.
func (ly *state) stages() map[string]int {
	st := map[string]int{}
	if len(ly.o.Frames) == 0 {
		return st
	}
	stage := map[string]int{}
	for i, f := range ly.o.Frames {
		for _, r := range f.Parts {
			if _, ok := stage[r]; !ok {
				stage[r] = i
			}
		}
	}
	stageOf := func(cl *cell) (int, bool) {
		if s, ok := stage[cl.ref]; ok {
			return s, true
		}
		if to, ok := ly.o.Merged[cl.ref]; ok {
			if s, ok := stage[to]; ok {
				return s, true
			}
		}
		return 0, false
	}
	byNet := ly.cellsByNet()
	var queue []*cell
	for _, cl := range ly.cells {
		if s, ok := stageOf(cl); ok && cl.part.Kind != graph.Port {
			st[cl.ref] = s
			queue = append(queue, cl)
		}
	}
	for len(queue) > 0 {
		cl := queue[0]
		queue = queue[1:]
		for _, n := range ly.signalNets(cl) {
			for _, nb := range byNet[n] {
				if _, ok := st[nb.ref]; !ok && nb.edge == 0 {
					st[nb.ref] = st[cl.ref]
					queue = append(queue, nb)
				}
			}
		}
	}
	for _, cl := range ly.cells {
		if _, ok := st[cl.ref]; !ok && cl.edge == 0 {
			st[cl.ref] = len(ly.o.Frames)
		}
	}
	return st
}

// netColumns records each net's mean column and number of pins, what the
// orientation score weighs a pin's direction by.
func (ly *state) netColumns() {
	ly.netCol = map[string]float64{}
	sum, cnt := map[string]float64{}, map[string]float64{}
	ly.netCount = map[string]int{}
	for _, cl := range ly.cells {
		for _, pn := range cl.part.Pins {
			if pn.Net == notConnected {
				continue
			}
			sum[pn.Net] += float64(cl.col)
			cnt[pn.Net]++
			ly.netCount[pn.Net]++
		}
	}
	for n, s := range sum {
		ly.netCol[n] = s / cnt[n]
	}
}

// column is a cell's place along the signal flow: two per rank, the first
// for the shunts that stand before an active part's control electrode.
func (ly *state) column(cl *cell) int {
	c := 2 * ly.rankOf[cl.ref]
	if ly.before[cl.ref] {
		c--
	}
	return c
}
