package layout

import (
	"slices"
	"sort"
	"strings"

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
	tail := ly.besideNet(st)
	for _, s := range tail {
		keys[key{s, tailRank}] = true
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
			if s, ok := tail[cl]; ok {
				cl.col = colOf[key{s, tailRank}]
			}
		default:
			cl.col = colOf[key{st[cl.ref], ly.column(cl)}]
		}
	}
	ly.netColumns()
	ly.stageOf = st
}

// tailRank is the column key, within a stage, of the ports that stand
// after the stage's last layer.
const tailRank = 1 << 30

// besideNet gives each port on the right (a socket, a part of the set) the
// stage it stands after: the last stage with a part on its net, when every
// later stage is a branch (branches). A branch's place follows the net it
// hangs on: a loudspeaker's extension socket stands with the loudspeaker,
// and a tone control hanging on the output valve's anode no longer stands
// between them as if in series. The output flags, where the signal leaves
// the sheet, stay at its right edge.
func (ly *state) besideNet(st map[string]int) map[*cell]int {
	out := map[*cell]int{}
	byNet := ly.cellsByNet()
	branch := ly.branches(st, byNet)
	for _, cl := range ly.cells {
		if cl.edge != 1 || cl.conn || len(cl.part.Pins) != 1 || strings.HasPrefix(cl.ref, outRef) {
			continue
		}
		s := -1
		for _, nb := range byNet[cl.part.Pins[0].Net] {
			if v, ok := st[nb.ref]; ok && nb.edge == 0 {
				s = max(s, v)
			}
		}
		if s >= 0 && s+1 < len(branch) && branch[s+1] {
			out[cl] = s
		}
	}
	return out
}

// branches says, for each framed stage, whether it and every framed stage
// after it hang on earlier stages only: each net a part of theirs shares
// with a part outside the stage belongs to an earlier stage, and no later
// stage, flag or port takes the signal on from them.
func (ly *state) branches(st map[string]int, byNet map[string][]*cell) []bool {
	n := len(ly.o.Frames)
	own := make([]bool, n) // the stage hangs on earlier stages only
	for i := range own {
		own[i] = true
	}
	for _, cls := range byNet {
		lo, hi := n, -1 // the stages of the net's parts
		edge := false
		for _, cl := range cls {
			if s, ok := st[cl.ref]; ok && cl.edge == 0 {
				lo, hi = min(lo, s), max(hi, s)
			} else {
				edge = true
			}
		}
		for _, cl := range cls {
			if s, ok := st[cl.ref]; ok && cl.edge == 0 && s < n && (edge || s == lo && hi > s) {
				own[s] = false // the net leaves the stage other than to an earlier one
			}
		}
	}
	out := make([]bool, n)
	tail := true
	for i := n - 1; i >= 0; i-- {
		tail = tail && own[i]
		out[i] = tail
	}
	return out
}

// stages gives every part a stage (an index into Options.Frames): its own
// frame's, or a merged part's, or that of its nearest framed neighbour;
// parts no frame reaches get a stage of their own after the frames. Without
// frames no part has a stage.
func (ly *state) stages() map[string]int {
	st := map[string]int{}
	ly.footCol = map[string]int{}
	ly.refCell = make(map[string]*cell, len(ly.cells))
	for _, cl := range ly.cells {
		ly.refCell[cl.ref] = cl
	}
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
	st = ly.spread(stageOf, byNet, nil)
	dev := ly.deviceStages(stageOf, byNet, st)
	for cl, s := range ly.acrossStages(stageOf) {
		if _, ok := dev[cl]; !ok {
			dev[cl] = s
		}
	}
	if len(dev) > 0 {
		st = ly.spread(stageOf, byNet, dev)
	}
	ly.railStages(st, stageOf)
	ly.markFeet(stageOf, byNet)
	for cp, t := range ly.tankOf {
		// a tank capacitor no frame holds stands in its winding's stage
		if _, framed := stageOf(cp); !framed {
			if s, ok := st[t.coil.ref]; ok {
				st[cp.ref] = s
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

// spread gives the framed parts their frame's stage, the parts in dev
// theirs, and every part they reach through unframed parts the stage of
// the nearest, breadth first in the cells' order. A device whose output
// electrode sits on a net the reduction tied to AC ground that feeds
// another device's load (an emitter follower's collector on an
// oscillator's decoupled line) takes nothing in over that net while
// another stage does: the line is its AC ground, and the decoupler stands
// with the stage whose load it feeds (review16 b01's oscillator decoupler
// stood in the frame of the follower, whose name sorts before the
// oscillator's load).
func (ly *state) spread(stageOf func(*cell) (int, bool), byNet map[string][]*cell, dev map[*cell]int) map[string]int {
	st := map[string]int{}
	var queue []*cell
	for _, cl := range ly.cells {
		if s, ok := stageOf(cl); ok && cl.part.Kind != graph.Port {
			st[cl.ref] = s
			queue = append(queue, cl)
		}
	}
	for _, cl := range ly.cells {
		if s, ok := dev[cl]; ok {
			st[cl.ref] = s
			queue = append(queue, cl)
		}
	}
	fed := ly.loadLines()
	ly.spreadFrom(st, queue, byNet, fed)
	if len(fed) > 0 {
		// the parts only such a device reaches stand in its stage
		var again []*cell
		for _, cl := range ly.cells {
			if _, ok := st[cl.ref]; ok && cl.edge == 0 {
				again = append(again, cl)
			}
		}
		ly.spreadFrom(st, again, byNet, nil)
	}
	return st
}

// spreadFrom gives every unstaged part the queue reaches through unstaged
// parts the stage of the nearest, breadth first, crossing no net in fed
// from a device's output electrode on it.
func (ly *state) spreadFrom(st map[string]int, queue []*cell, byNet map[string][]*cell, fed map[string]bool) {
	for len(queue) > 0 {
		cl := queue[0]
		queue = queue[1:]
		for _, n := range ly.signalNets(cl) {
			if fed[n] && outputOn(cl, n) {
				continue
			}
			for _, nb := range byNet[n] {
				if _, ok := st[nb.ref]; !ok && nb.edge == 0 && ly.takes(st[cl.ref], nb) {
					st[nb.ref] = st[cl.ref]
					queue = append(queue, nb)
				}
			}
		}
	}
}

// outputOn says whether cl is an active part with its output electrode on
// net n.
func outputOn(cl *cell, n string) bool {
	if !cl.part.IsActive() {
		return false
	}
	for _, pn := range cl.part.Pins {
		if pn.Net == n && graph.RoleOfPin(cl.part.Kind, pn.Name) == graph.RoleOutput {
			return true
		}
	}
	return false
}

// loadLines are the nets in Options.Quiet that feed a load: a passive
// part from the net to a net the signal passes through that an active
// part's output electrode is on (a collector's load resistor; not a
// collector's own decoupler, whose far net is quiet too, nor a reservoir
// only an output pair's collectors sit on, which keeps its parts with
// them).
func (ly *state) loadLines() map[string]bool {
	if len(ly.o.Quiet) == 0 {
		return nil
	}
	outs := map[string]bool{}
	for _, d := range ly.cells {
		for _, pn := range d.part.Pins {
			if outputOn(d, pn.Net) && ly.carries(pn.Net) {
				outs[pn.Net] = true
			}
		}
	}
	fed := map[string]bool{}
	for _, cl := range ly.cells {
		if cl.part.IsActive() || cl.part.Kind == graph.Port {
			continue
		}
		load := slices.ContainsFunc(cl.part.Pins, func(p graph.Pin) bool { return outs[p.Net] })
		for _, pn := range cl.part.Pins {
			if load && ly.o.Quiet[pn.Net] {
				fed[pn.Net] = true
			}
		}
	}
	return fed
}

// takes says whether stage s takes in the unframed neighbour nb: a supply
// frame only the parts ranked along its flow (supplyflow.go), so a
// decoupler between the HT line and a stage's feed stands with the stage
// it feeds.
//
// A loudspeaker no stage claims is taken by none: it is the set's load,
// drawn after the stages at the output, never inside the frame of the
// coupling capacitor or network that feeds it (a reader takes a part
// inside a frame for one of its stage).
func (ly *state) takes(s int, nb *cell) bool {
	if nb.part.Kind == graph.Loudspeaker {
		return false
	}
	if s >= len(ly.o.Frames) || !ly.o.Frames[s].Supply {
		return true
	}
	return ly.supplyRanked[nb.ref]
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

// column is a cell's place along the signal flow: three per rank, the
// first for the shunts that stand before an active part's control
// electrode, the last for a decoupler at a winding's foot (footCol),
// which stacked under the other winding's decoupler of its rank made the
// can's frame two decouplers tall (review17 a03's IFT1: the row grew and
// the IF stage's row no longer fitted the page).
func (ly *state) column(cl *cell) int {
	if c, ok := ly.footCol[cl.ref]; ok {
		return c
	}
	c := 3 * ly.rankOf[cl.ref]
	if ly.before[cl.ref] {
		c--
	}
	return c
}
