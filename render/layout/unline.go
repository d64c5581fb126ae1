package layout

import "math/bits"

// Wires that end in line with another net's.
//
// The search prices a run that stops short in line with another net's wire
// (search.go, ahead), but only as one cost among others: where a detour
// costs more, the cheaper wiring leaves two nets' runs on one line with a
// step or two between their ends, and a reader joins them (the blind
// reviewers read a valve's cathode and anode leads, and a transistor's
// collector and the pair's mid-point, as one wire). So once every net is
// wired and the crossings are removed, each net with a run ending in line
// with another's is wired again with that priced above a crossing and looked
// for as far as render/check's in-line test looks, and the new wiring is
// kept only when the sheet has fewer such ends, the net runs through no
// more foreign stage frames, and it crosses at most one wire more per pair
// of ends cleared.

// unlineReach is how far beyond a run's end, in grid steps, another net's
// wire running the same way reads as the same wire broken: render/check
// counts gaps shorter than six steps with nothing drawn between.
const unlineReach = 5

// unlineCosts price what lies in line beyond a run's end (as ahead finds it)
// while a net is wired again to clear such ends: above a crossing when
// close, as a close end is priced otherwise when further.
var unlineCosts = [3]int32{0, closeCost, crossCost + closeCost}

// unlineRounds bounds the passes over the nets with such ends.
const unlineRounds = 2

// unlineShare is the part of the router's budget the last pass (spare)
// may spend: on a large sheet (the every-kind fixture's reduced view) the
// crossings took the whole budget before unline ran, so its ends in line
// were never looked at.
const unlineShare = 4

// unline wires again the nets with runs ending in line with another net's
// wire, keeping each new wiring that leaves fewer such ends, within the
// router's budget; with spare, as a last pass after undot on a share of
// the budget of its own, keeping only wirings that grow nothing else
// (unlineNet).
func (rt *router) unline(spare bool) {
	stop := rt.budget()
	if spare {
		stop = rt.pops + rt.budget()/unlineShare
	}
	for round := 0; round < unlineRounds; round++ {
		total := rt.inLineEnds()
		if total == 0 {
			return
		}
		improved := false
		for id := range rt.nets {
			if rt.pops > stop {
				return // a deterministic work bound, as uncross's
			}
			if !rt.nets[id].ok || rt.netInLineEnds(id) == 0 {
				continue
			}
			if now, ok := rt.unlineNet(id, total, spare); ok {
				total, improved = now, true
			}
		}
		if !improved {
			return
		}
	}
}

// unlineNet wires net id again with in-line ends priced high and keeps the
// new wiring when the sheet's in-line ends fall below total at the price
// unline's comment allows; it returns the new total. On the last pass
// (spare) a new wiring is kept only when it grows nothing: no crossing
// more, none beside a junction or a lead (on the net or anywhere), no pin
// tip passed closer, no step beside another net's wire, no knot of off-row
// connectors' runs (undot has cleared what it could by then; the cheaper
// trade, tried before undot, let greyed wires cross black ones and
// connector runs knot on paged sheets).
func (rt *router) unlineNet(id, total int, spare bool) (int, bool) {
	crossed, framed, strays := rt.crossingsOf(id), rt.framedCrossingsOf(id), rt.foreignFramesOf(id)
	var was reading
	knots, conn, shy := 0, spare && rt.ledToConnector(id), 0
	if spare {
		was, shy = rt.readingOf(id), len(rt.shyCrossings())
	}
	if conn {
		knots = rt.connectorKnots()
	}
	s := rt.save(id)
	rt.ripUp(id)
	rt.strict = true
	ok := rt.routeNet(id)
	rt.strict = false
	if ok && rt.foreignFramesOf(id) <= strays && rt.framedCrossingsOf(id) <= framed {
		// a crossing reads as no joint (no dot), two ends in line as one
		// wire: one crossing more is worth a pair of such ends fewer, if
		// not inside a supply's frame
		now := rt.inLineEnds()
		allow := (total - now) / 2
		if spare {
			after := rt.readingOf(id)
			if after.shy > was.shy || after.tips > was.tips || after.beside > was.beside ||
				len(rt.shyCrossings()) > shy || conn && rt.connectorKnots() > knots {
				now = total
			}
			allow = 0
		}
		if now < total && rt.crossingsOf(id) <= crossed+allow {
			return now, true
		}
	}
	rt.ripUp(id)
	rt.restore(id, s)
	return total, false
}

// inLineEnds counts the run ends of every net in line with another net's
// wire (inLineEnd).
func (rt *router) inLineEnds() int {
	n := 0
	for id, nr := range rt.nets {
		if nr.ok {
			n += rt.netInLineEnds(id)
		}
	}
	return n
}

// netInLineEnds counts net id's run ends in line with another net's wire.
func (rt *router) netInLineEnds(id int) int {
	net := int32(id + 1)
	n := 0
	for _, c := range rt.nets[id].cells {
		g := &rt.g[c]
		if g.own[1] != 0 {
			continue // a crossing runs straight through
		}
		arms := rt.arms(c, net)
		for d := 0; d < 4; d++ {
			if arms&(1<<(d^2)) != 0 && arms&(1<<d) == 0 && rt.inLineEnd(c, d, net) {
				n++
			}
		}
	}
	return n
}

// inLineEnd says whether a run of net heading d and ending at cell c points
// at another net's wire running the same way (or, within closeReach, at
// another net's pin tip or a local symbol's stub) within unlineReach steps
// with nothing drawn between: the two read as one wire.
func (rt *router) inLineEnd(c, d int, net int32) bool {
	along := alongArms[d]
	x, y := c%rt.w, c/rt.w
	for i := 1; i <= unlineReach; i++ {
		x, y = x+dirStep[d][0], y+dirStep[d][1]
		if x < 0 || y < 0 || x >= rt.w || y >= rt.h {
			return false
		}
		g := &rt.g[y*rt.w+x]
		switch {
		case g.own[0] == net || g.own[1] == net:
			return false
		case g.runsAlong(along, net):
			return true
		case i <= closeReach && (g.flags&fStub != 0 || (g.flags&fPin != 0 && g.resv != net)):
			return true
		case g.flags&fBlocked != 0:
			return false
		}
	}
	return false
}

// foreignFramesOf counts the stage frames net id's wire runs through
// without a pin of its own there (render/check's foreign frames): clearing
// an end in line must not send a wire through another stage.
func (rt *router) foreignFramesOf(id int) int {
	home := rt.nets[id].home
	var seen uint64
	for _, c := range rt.nets[id].cells {
		if fr := rt.g[c].flags >> frameShift; fr != 0 && home&(1<<(fr-1)) == 0 {
			seen |= 1 << (fr - 1)
		}
	}
	return bits.OnesCount64(seen)
}

// framedCrossingsOf counts the cells where net id crosses another net
// inside a supply's frame: a supply is drawn in its own flow, mains to
// rails, without a crossing (render/supplyflow's test holds it).
func (rt *router) framedCrossingsOf(id int) int {
	n := 0
	for _, c := range rt.nets[id].cells {
		g := &rt.g[c]
		if fr := int(g.flags >> frameShift); g.own[1] != 0 && fr > 0 && fr <= len(rt.ly.frameStage) && rt.ly.o.Frames[rt.ly.frameStage[fr-1]].Supply {
			n++
		}
	}
	return n
}
