package layout

import (
	"math/bits"
	"sort"
)

// Crossings beside a junction or a lead.
//
// A wire crossing another net's right beside a junction dot of either net,
// or within two steps of a part's pin on either net, reads as joined there
// (the blind reviewers took an anode lead crossing a cathode lead by its
// dot, and a collector wire crossing a tank capacitor's lead, as joins;
// render/check's NearDots and NearPins). The search prices a crossing
// beside a junction, but only as one cost among others, and a plain price
// for a crossing near a lead, tried in the search itself, drew other
// misreadings elsewhere. So once every net is wired, the crossings cleared
// and the ends in line cleared, each such crossing is taken in turn: one of
// its two nets is wired again with a crossing there priced well above a
// crossing elsewhere, and the new wiring is kept only when the sheet has
// fewer such crossings and nothing else the reader trips on grows (the
// net's crossings, its steps beside other wires and pin tips, its passages
// through foreign frames, its crossings inside a supply's frame, and the
// sheet's ends in line).

// shyCost is what a crossing beside a junction or within leadClear of a
// pin tip costs on top of a crossing while such crossings are cleared: a
// reader takes it for a joint, which is worse than a crossing.
const shyCost = crossCost

// leadClear is render/check's distance from a pin within which a crossing
// reads as a joint at the lead, in grid steps; leadReach lists the points
// that near a point, itself left out.
const leadClear = 2

var leadReach = func() [][2]int {
	var out [][2]int
	for dy := -leadClear; dy <= leadClear; dy++ {
		for dx := -leadClear; dx <= leadClear; dx++ {
			if (dx != 0 || dy != 0) && dx*dx+dy*dy <= leadClear*leadClear {
				out = append(out, [2]int{dx, dy})
			}
		}
	}
	return out
}()

// undotRounds bounds the passes over such crossings.
const undotRounds = 2

// undotShare is the part of the router's budget the pass may spend, on
// top of whatever the passes before it spent: a sheet whose crossings took
// the whole budget still has its crossings beside junctions looked at.
const undotShare = 4

// undot wires again one net of each crossing beside a junction or a lead
// of either net, keeping a new wiring as the package comment above says.
func (rt *router) undot() {
	stop := rt.pops + rt.budget()/undotShare
	for round := 0; round < undotRounds; round++ {
		xs := rt.shyCrossings()
		if len(xs) == 0 {
			return
		}
		improved := false
		for _, c := range xs {
			if rt.pops > stop {
				return // a deterministic work bound, as uncross's
			}
			o := rt.g[c].own
			if o[1] == 0 || !rt.shyAt(c, o[0], o[1]) {
				continue // cleared by an earlier wiring
			}
			for _, id := range rt.undotOrder(int(o[0])-1, int(o[1])-1) {
				if rt.undotNet(id) {
					improved = true
					break
				}
			}
		}
		if !improved {
			return
		}
	}
}

// undotOrder is the order two crossing nets are tried in: the one with
// fewer pins first (its wiring is the smaller change), then by number.
func (rt *router) undotOrder(a, b int) []int {
	if len(rt.nets[b].pins) < len(rt.nets[a].pins) || (len(rt.nets[b].pins) == len(rt.nets[a].pins) && b < a) {
		a, b = b, a
	}
	return []int{a, b}
}

// shyCrossings lists the crossings beside a junction or a lead, in grid
// order.
func (rt *router) shyCrossings() []int {
	var out []int
	for c := range rt.g {
		if o := rt.g[c].own; o[1] != 0 && rt.shyAt(c, o[0], o[1]) {
			out = append(out, c)
		}
	}
	return out
}

// shyAt says whether the crossing of nets a and b at c stands closer than
// two steps to a junction of either (a neighbouring point, diagonals too,
// with three arms of it) or within leadClear steps of a part's pin on
// either: render/check's NearDots and NearPins.
func (rt *router) shyAt(c int, a, b int32) bool {
	x, y := c%rt.w, c/rt.w
	for dy := -1; dy <= 1; dy++ {
		for dx := -1; dx <= 1; dx++ {
			nx, ny := x+dx, y+dy
			if (dx == 0 && dy == 0) || nx < 0 || ny < 0 || nx >= rt.w || ny >= rt.h {
				continue
			}
			n := ny*rt.w + nx
			if bits.OnesCount8(rt.arms(n, a)) >= 3 || bits.OnesCount8(rt.arms(n, b)) >= 3 {
				return true
			}
		}
	}
	for _, id := range [2]int32{a, b} {
		for _, p := range rt.nets[id-1].pins {
			px, py := p.cell%rt.w, p.cell/rt.w
			if dx, dy := px-x, py-y; p.lead && dx*dx+dy*dy <= leadClear*leadClear {
				return true
			}
		}
	}
	return false
}

// reading is what undot weighs on one net's wiring: its crossings beside a
// junction or a lead, and what it must not make worse.
type reading struct {
	shy, crossed, beside, tips, strays, framed int
}

// readingOf reads net id's wiring.
func (rt *router) readingOf(id int) reading {
	net := int32(id + 1)
	cells := append([]int(nil), rt.nets[id].cells...)
	sort.Ints(cells)
	cells = uniq(cells)
	r := reading{strays: rt.foreignFramesOf(id), framed: rt.framedCrossingsOf(id)}
	for _, c := range cells {
		g := &rt.g[c]
		if g.own[1] != 0 {
			r.crossed++
			other := g.own[0]
			if other == net {
				other = g.own[1]
			}
			if rt.shyAt(c, net, other) {
				r.shy++
			}
		}
		r.beside += rt.besideAt(c, net)
		if g.flags&fNearPin != 0 && rt.foreignTipBeside(c, net) {
			r.tips++
		}
	}
	return r
}

// ledToConnector says whether net id has an off-row connector's pin.
func (rt *router) ledToConnector(id int) bool {
	for _, p := range rt.nets[id].pins {
		if p.conn {
			return true
		}
	}
	return false
}

// connectorKnots counts the pairs of nets whose runs from an off-row
// connector cross (render/check's ConnectorWires: two such runs crossing
// knot a page's edge).
func (rt *router) connectorKnots() int {
	owner := map[int]int32{}
	pairs := map[[2]int32]bool{}
	for id, nr := range rt.nets {
		if !nr.ok {
			continue
		}
		net := int32(id + 1)
		for _, p := range nr.pins {
			if !p.conn {
				continue
			}
			for _, c := range rt.connectorRun(net, p) {
				if o, seen := owner[c]; seen && o != net {
					pairs[[2]int32{min(o, net), max(o, net)}] = true
				} else if !seen {
					owner[c] = net
				}
			}
		}
	}
	return len(pairs)
}

// connectorRun is the cells of net's wire from pin p to the first point
// where it branches, ends or meets another pin.
func (rt *router) connectorRun(net int32, p wirePin) []int {
	c, from := p.cell, opposite(int(p.pin.Dir)) // the lead into the body
	out := []int{c}
	for len(out) <= len(rt.nets[net-1].cells) {
		arms := rt.arms(c, net) &^ (1 << from)
		if bits.OnesCount8(arms) != 1 {
			break
		}
		d := bits.TrailingZeros8(arms)
		n := rt.neighbour(c, d)
		if n < 0 || !rt.owns(n, net) {
			break
		}
		out = append(out, n)
		if rt.g[n].flags&fPin != 0 {
			break
		}
		c, from = n, opposite(d)
	}
	return out
}

// besideAt counts the axes along which net's wire at c runs with another
// net's wire running the same way a step aside (the search's crowding).
func (rt *router) besideAt(c int, net int32) int {
	n, arms := 0, rt.arms(c, net)
	for axis, along := range [2]uint8{armE | armW, armN | armS} {
		if arms&along == 0 {
			continue
		}
		for _, side := range [2]int{(axis + 1) & 3, (axis + 3) & 3} {
			if s := rt.neighbour(c, side); s >= 0 && rt.g[s].runsAlong(along, net) {
				n++
				break
			}
		}
	}
	return n
}

// foreignTipBeside says whether another net's pin tip is a step from c.
func (rt *router) foreignTipBeside(c int, net int32) bool {
	for d := range dirStep {
		if n := rt.neighbour(c, d); n >= 0 && rt.g[n].flags&fPin != 0 && rt.g[n].resv != net {
			return true
		}
	}
	return false
}

// undotNet wires net id again with crossings beside junctions and leads
// priced high, and keeps the new wiring when it has fewer of them and no
// more of anything else reading weighs, nor the sheet more ends in line.
// The tree is grown first from the net's first pin in reading order, then,
// when that keeps the crossing, from its last: the search prices a crossing
// beside a junction already drawn, never one its own branch makes, so a
// net whose first two pins straddle another net's pin (a heptode's screen
// grids round the signal grid) links them tightly round that grid's lead
// and the rest of the net joins at the link's corner, a step from the
// crossing; grown from the far end, the tree reaches the two pins from
// outside and the join need not stand by the crossing.
func (rt *router) undotNet(id int) bool {
	was, ends, far, knots := rt.readingOf(id), rt.inLineEnds(), rt.farInLineEnds(), 0
	runs, sibs := 0, rt.siblingCrossingsOf(id)
	if rt.alongAt != nil {
		runs = rt.alongRuns(id)
	}
	conn := rt.ledToConnector(id)
	if conn {
		knots = rt.connectorKnots()
	}
	s := rt.save(id)
	for _, fromFar := range [2]bool{false, true} {
		rt.ripUp(id)
		rt.shy, rt.farFirst = true, fromFar
		ok := rt.routeNet(id)
		rt.shy, rt.farFirst = false, false
		if ok {
			now := rt.readingOf(id)
			// nor may the new wiring run beside a part of its own (a
			// strap across it), end in line with another net's wire,
			// or cross another lead of its own valve more than the old:
			// a detour round a crossing, grown from the far end, tends to
			if now.shy < was.shy && now.crossed <= was.crossed && now.beside <= was.beside && now.tips <= was.tips &&
				now.strays <= was.strays && now.framed <= was.framed && rt.inLineEnds() <= ends && (!conn || rt.connectorKnots() <= knots) &&
				(rt.alongAt == nil || rt.alongRuns(id) <= runs) && moreLines(rt.farInLineEnds(), far) == 0 &&
				rt.siblingCrossingsOf(id) <= sibs {
				return true
			}
		}
	}
	rt.ripUp(id)
	rt.restore(id, s)
	return false
}

// siblingCrossingsOf counts net id's crossings with another lead of one of
// its valves (siblings.go): the anode lead over its own screen feed or
// cathode lead reads as a tangle round the valve.
func (rt *router) siblingCrossingsOf(id int) int {
	n := 0
	for _, c := range rt.nets[id].cells {
		if o := rt.g[c].own; o[1] != 0 && rt.siblings(o[0], o[1]) {
			n++
		}
	}
	return n
}
