package layout

import "slices"

// A wire of one of a two-terminal part's own nets run beside the part,
// parallel and close, reads as a strap across it: the part looks shorted
// (render/check's AlongParts; review18 b04's R2, review19 b05's R16 with its
// anode wire looped under it). Once every net is wired and the other passes
// are done, each net with such a run is wired again with each step of it
// priced (for that net only), and the new wiring is kept only when it runs
// beside fewer of its parts and nothing undot weighs grows (its crossings,
// crossings by a junction or lead, steps beside other wires and pin tips,
// foreign frames, crossings in a supply's frame), nor the sheet's ends in
// line or crossed connector runs, except that each crossing the new wiring
// takes away (one beside a junction or lead counted twice) may buy one run
// end in line (review19 b05: R16's anode wire looped under it and crossed
// the HT feed by its pin; wired over the stage it ends in line twice).
// Priced in the search itself, every wire
// paid it and the detours drew wires through other stages' frames, round
// parts and in line with others' ends.

const (
	// alongCost is a step of a net's wire running beside a part with a
	// pin on that net, within alongReach grid lines of the line through
	// its pins and between them: over a resistor's span of four steps the
	// run costs about a crossing's price, so a short detour wins and a
	// long one does not.
	alongCost = 8
	// alongReach is render/check's alongReach: how far from the line
	// through the pins a wire reads as beside the part.
	alongReach = 2
)

// alongMark is one grid point beside a part: a step of net's wire into it
// along axis (0 horizontal, 1 vertical) runs beside the part.
type alongMark struct {
	net  int32
	axis uint8
}

// unalongRounds bounds the passes over nets running beside their parts, and
// unalongShare is the part of the router's budget they may spend on top of
// what the passes before them spent.
const (
	unalongRounds = 2
	unalongShare  = 4
)

// unalong wires again each net that runs beside a part of its own, as the
// file's comment says.
func (rt *router) unalong() {
	if rt.alongAt == nil {
		return
	}
	stop := rt.pops + rt.budget()/unalongShare
	for round := 0; round < unalongRounds; round++ {
		improved := false
		for id := range rt.nets {
			if rt.pops > stop {
				return // a deterministic work bound, as uncross's
			}
			if rt.nets[id].ok && rt.alongRuns(id) > 0 && rt.unalongNet(id) {
				improved = true
			}
		}
		if !improved {
			return
		}
	}
}

// unalongNet wires net id again with its runs beside its parts priced, and
// keeps the new wiring when it has fewer of them and grows nothing else.
func (rt *router) unalongNet(id int) bool {
	was, runs, ends, far, knots := rt.readingOf(id), rt.alongRuns(id), rt.inLineEnds(), rt.farInLineEnds(), 0
	conn := rt.ledToConnector(id)
	if conn {
		knots = rt.connectorKnots()
	}
	s := rt.save(id)
	rt.ripUp(id)
	rt.along = true
	ok := rt.routeNet(id)
	rt.along = false
	if ok && rt.alongRuns(id) < runs {
		now := rt.readingOf(id)
		// a crossing the new wiring took away (one by a junction or lead
		// counted twice) may buy one run end in line: the part no longer
		// reads as shorted, nor the crossing as a joint
		gain := was.shy - now.shy + was.crossed - now.crossed
		if now.shy <= was.shy && now.crossed <= was.crossed && now.beside <= was.beside && now.tips <= was.tips &&
			now.strays <= was.strays && now.framed <= was.framed && rt.inLineEnds() <= ends+gain &&
			moreLines(rt.farInLineEnds(), far) <= gain && (!conn || rt.connectorKnots() <= knots) {
			return true
		}
	}
	rt.ripUp(id)
	rt.restore(id, s)
	return false
}

// farLine is the longest gap, in grid steps, across which two collinear
// wires of different nets read as one: render/check counts gaps shorter
// than its inLineGap of six.
const farLine = 5

// farInLineEnds counts the sheet's run ends pointing at another net's wire
// running the same way within farLine steps, whatever stands between (the
// checker lets a label or title in the gap stand, where the router's own
// count, inLineEnds, stops at it), by the pair of nets: a detour round a
// part must not leave a wire reading on into another, not even in trade
// for one such end gone elsewhere (which the checker may not have read).
func (rt *router) farInLineEnds() map[[2]int32]int {
	n := map[[2]int32]int{}
	for id, nr := range rt.nets {
		if !nr.ok {
			continue
		}
		net := int32(id + 1)
		for _, c := range nr.cells {
			if rt.g[c].own[1] != 0 {
				continue // a crossing runs straight through
			}
			arms := rt.arms(c, net)
			for d := 0; d < 4; d++ {
				if arms&(1<<(d^2)) != 0 && arms&(1<<d) == 0 {
					if o := rt.pointsAt(c, d, net); o != 0 {
						n[[2]int32{min(net, o), max(net, o)}]++
					}
				}
			}
		}
	}
	return n
}

// moreLines counts the ends in line now has beyond was, pair of nets by
// pair.
func moreLines(now, was map[[2]int32]int) int {
	more := 0
	for k, n := range now {
		more += max(0, n-was[k])
	}
	return more
}

// pointsAt is the other net whose wire, running the same way, the run of
// net heading d and ending at c points at within farLine steps, or 0.
func (rt *router) pointsAt(c, d int, net int32) int32 {
	along := alongArms[d]
	x, y := c%rt.w, c/rt.w
	for i := 1; i <= farLine; i++ {
		x, y = x+dirStep[d][0], y+dirStep[d][1]
		if x < 0 || y < 0 || x >= rt.w || y >= rt.h {
			return 0
		}
		g := &rt.g[y*rt.w+x]
		if g.own[0] == net || g.own[1] == net {
			return 0
		}
		for i, o := range g.own {
			if o != 0 && g.arm[i]&along != 0 {
				return o
			}
		}
	}
	return 0
}

// alongRuns counts the points where net id's wire runs beside a part of its
// own along the part's axis (what alongStep prices).
func (rt *router) alongRuns(id int) int {
	net, n := int32(id+1), 0
	cells := append([]int(nil), rt.nets[id].cells...)
	slices.Sort(cells)
	for i, c := range cells {
		if (i > 0 && cells[i-1] == c) || rt.alongAt[c] == 0 {
			continue
		}
		arms := rt.arms(c, net)
		for _, m := range rt.alongSets[rt.alongAt[c]-1] {
			if m.net == net && arms&alongArms[m.axis] != 0 {
				n++
				break
			}
		}
	}
	return n
}

// markAlong records, for every two-terminal part with its pins on one grid
// line and on two nets, the points beside its span on either side up to
// alongReach lines away, for each of its routed nets. alongAt numbers a
// point's list in alongSets (0: none), so the search pays one load per step.
func (rt *router) markAlong() {
	ids := map[string]int32{}
	for i, nr := range rt.nets {
		ids[nr.name] = int32(i + 1)
	}
	var at map[int][]alongMark
	for _, cl := range rt.ly.cells {
		pins := cl.shape.Pins
		if realPart(cl) == nil || cl.conn || len(pins) != 2 || pins[0].Net == pins[1].Net {
			continue
		}
		a, b := rt.index(pins[0].At), rt.index(pins[1].At)
		ax, ay, bx, by := a%rt.w, a/rt.w, b%rt.w, b/rt.w
		var axis uint8
		switch {
		case ay == by && ax != bx:
			axis = 0
		case ax == bx && ay != by:
			axis = 1
		default:
			continue
		}
		for _, p := range pins {
			id, ok := ids[p.Net]
			if !ok {
				continue // a net the router does not wire (chassis)
			}
			if at == nil {
				at = map[int][]alongMark{}
			}
			rt.markSpan(at, alongMark{net: id, axis: axis}, ax, ay, bx, by)
		}
	}
	rt.storeAlong(at)
}

// markSpan adds m to the points strictly between the pins (ax, ay) and (bx,
// by) on the grid lines 1 to alongReach either side of theirs.
func (rt *router) markSpan(at map[int][]alongMark, m alongMark, ax, ay, bx, by int) {
	lo, hi := min(ax, bx), max(ax, bx)
	if m.axis == 1 {
		lo, hi = min(ay, by), max(ay, by)
	}
	for pos := lo + 1; pos < hi; pos++ {
		for off := -alongReach; off <= alongReach; off++ {
			x, y := pos, ay+off
			if m.axis == 1 {
				x, y = ax+off, pos
			}
			if off == 0 || x < 0 || y < 0 || x >= rt.w || y >= rt.h {
				continue
			}
			c := y*rt.w + x
			if !slices.Contains(at[c], m) {
				at[c] = append(at[c], m)
			}
		}
	}
}

// storeAlong turns the marks into the router's per-point index, the lists
// numbered in grid order so that nothing depends on map order.
func (rt *router) storeAlong(at map[int][]alongMark) {
	rt.alongAt, rt.alongSets, rt.alongCells = nil, nil, nil
	if len(at) == 0 {
		return
	}
	cells := make([]int, 0, len(at))
	for c := range at {
		cells = append(cells, c)
	}
	slices.Sort(cells)
	rt.alongCells = cells
	rt.alongAt = make([]int32, len(rt.g))
	rt.alongSets = make([][]alongMark, 0, len(cells))
	for _, c := range cells {
		rt.alongSets = append(rt.alongSets, at[c])
		rt.alongAt[c] = int32(len(rt.alongSets))
	}
}

// alongStep is what a step of the search's net into point n in direction nd
// costs for running beside a part of its own.
func (k *seek) alongStep(n, nd int) int32 {
	if !k.along || k.alongAt[n] == 0 {
		return 0
	}
	for _, m := range k.alongSets[k.alongAt[n]-1] {
		if m.net == k.net && m.axis == uint8(nd&1) {
			return alongCost
		}
	}
	return 0
}

// alongKey appends to b, for the memo's key, every point of the search's
// window (and margin round it) marked beside a part of the search's net,
// with its axes: what alongStep reads.
func (rt *router) alongKey(k *seek, b []byte) []byte {
	if !rt.along {
		return b
	}
	m := rt.margin()
	for _, c := range rt.alongCells {
		x, y := c%rt.w, c/rt.w
		if x < k.win.x0-m || x > k.win.x1+m || y < k.win.y0-m || y > k.win.y1+m {
			continue
		}
		var axes byte
		for _, mk := range rt.alongSets[rt.alongAt[c]-1] {
			if mk.net == k.net {
				axes |= 1 << mk.axis
			}
		}
		if axes != 0 {
			dx, dy := x-k.win.x0+m, y-k.win.y0+m
			b = append(b, byte(dx), byte(dx>>8), byte(dy), byte(dy>>8), axes)
		}
	}
	return b
}
