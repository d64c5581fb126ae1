package layout

import (
	"math"
	"pare/graph"
	"pare/render/geom"
	"sort"
)

// Wires in line through a device.
//
// A valve's or a transistor's body is small beside its leads: an input lead
// coming in level from one side and another net's wire leaving level on the
// same line from the far side read as one wire running through the device
// (review21 a01: a cathode follower's output rose to the grid line's height
// beside its valve and ran on right, and the grid line seemed to run
// through the valve into the coupling capacitor). The search cannot see it
// (its in-line test stops at a symbol), so once the sheet is wired each such
// wire is wired again with the line beyond the device fenced off, and the
// new wiring is kept only when it grows nothing a reader would misread:
// crossings, foreign frames, frame edges crossed, ends in line (near or
// far), crossings beside a junction or a lead, steps beside another net's
// wire or pin tip or beside a part of its own, knots of connector runs,
// nor the net's length by more than throughGrow (render/check's
// ThroughDevices counts what is left).

// throughReach is how far beyond a device's side, in grid steps, another
// net's wire on a lead's line reads as the lead carried on (render/check's
// throughReach); fenceReach bounds the fence laid on that line, which runs
// on to the first symbol there: a wire fenced off only as far as the
// reach came back to the line a step beyond it, no better to read.
// A new wiring may be throughGrow steps longer than the old: enough to drop
// or raise a run a step and turn at the far end, not to take the net round
// its stage (review21 b01's buffer collector, fenced off its base line,
// was first wired round the whole stage to its coupling capacitor).
const (
	throughReach = 15
	fenceReach   = 60
	throughGrow  = 12
)

// deviceKinds are the parts whose bodies a reader looks through.
var deviceKinds = map[graph.Kind]bool{graph.Valve: true, graph.BJT: true, graph.FET: true}

// throughWire is a net wired on a device lead's line beyond the device, and
// the free points of that line to fence while it is wired again.
type throughWire struct {
	id    int
	fence []int
}

// unthrough wires again each net found on a device lead's line beyond the
// device (throughWires), keeping the new wiring only when it leaves that
// line and grows nothing else, within a share of the router's budget.
func (rt *router) unthrough() {
	stop := rt.pops + rt.budget()/unlineShare
	for _, tw := range rt.throughWires() {
		if rt.pops > stop {
			return // a deterministic work bound, as unline's
		}
		rt.unthroughNet(tw)
	}
}

// unthroughNet wires tw.id again with tw.fence blocked and keeps it when the
// net no longer runs on the fenced line and nothing else grew.
func (rt *router) unthroughNet(tw throughWire) {
	id := tw.id
	was, shy, ends, cuts, long := rt.readingOf(id), len(rt.shyCrossings()), rt.inLineEnds(), rt.edgeCutsOf(id), rt.lengthOf(id)
	runs, far := rt.ownRuns(id), rt.farInLineEnds()
	conn := rt.ledToConnector(id)
	knots := 0
	if conn {
		knots = rt.connectorKnots()
	}
	s := rt.save(id)
	rt.ripUp(id)
	var fenced []int
	for _, c := range tw.fence {
		if g := &rt.g[c]; g.flags&(fBlocked|fPin) == 0 && g.own[0] == 0 && g.resv == 0 {
			g.flags |= fBlocked
			fenced = append(fenced, c)
		}
	}
	ok := rt.routeNet(id)
	for _, c := range fenced {
		rt.g[c].flags &^= fBlocked
	}
	if ok {
		after := rt.readingOf(id)
		if after.crossed <= was.crossed && after.shy <= was.shy && after.tips <= was.tips && after.beside <= was.beside &&
			after.strays <= was.strays && after.framed <= was.framed && len(rt.shyCrossings()) <= shy &&
			rt.inLineEnds() <= ends && rt.edgeCutsOf(id) <= cuts && rt.lengthOf(id) <= long+throughGrow &&
			rt.ownRuns(id) <= runs && moreLines(rt.farInLineEnds(), far) == 0 && (!conn || rt.connectorKnots() <= knots) && !rt.onFence(id, tw.fence[:min(len(tw.fence), throughReach+1)]) {
			return
		}
	}
	rt.ripUp(id)
	rt.restore(id, s)
}

// edgeCutsOf counts the steps of net id's wire through a stage frame's
// edge: a wire sent round the fence must not leave its stage's frame and
// come back (review13 b01's oscillator collector, sent out of its frame,
// drew the phase-shift ladder's return out after it).
func (rt *router) edgeCutsOf(id int) int {
	net := int32(id + 1)
	n := 0
	for _, c := range rt.nets[id].cells {
		f, a := rt.g[c].flags, rt.arms(c, net)
		if f&fCutE != 0 && a&armE != 0 {
			n++
		}
		if f&fCutS != 0 && a&armS != 0 {
			n++
		}
	}
	return n
}

// ownRuns is alongRuns where the sheet has parts to run beside (markAlong
// marks none on a sheet without them).
func (rt *router) ownRuns(id int) int {
	if rt.alongAt == nil {
		return 0
	}
	return rt.alongRuns(id)
}

// lengthOf is how many grid points net id's wire covers.
func (rt *router) lengthOf(id int) int {
	cells := append([]int(nil), rt.nets[id].cells...)
	sort.Ints(cells)
	return len(uniq(cells))
}

// onFence says whether net id still runs along one of the given points
// (those within throughReach: the fence ends at a pin the net may reach).
func (rt *router) onFence(id int, fence []int) bool {
	net := int32(id + 1)
	for _, c := range fence {
		if rt.arms(c, net)&(armE|armW) != 0 {
			return true
		}
	}
	return false
}

// throughWires finds, for every device's lead leaving its body sideways, the
// first wire of another net running level on the lead's line beyond the
// far side of the body within throughReach, with nothing drawn between: the
// net to wire again, and the line's points to fence. A net with a pin of the
// device on that line is left alone (a diode drawn in series: its lead is
// drawn with the symbol, and the line through it reads as it works).
func (rt *router) throughWires() []throughWire {
	var out []throughWire
	seen := map[[2]int]bool{}
	var body []bool // the points under a symbol (a label does not part a line)
	for _, cl := range rt.ly.cells {
		if cl.part == nil || realPart(cl) == nil || !deviceKinds[cl.part.Kind] {
			continue
		}
		if body == nil {
			body = rt.bodies()
		}
		b := cl.shape.Box
		for _, p := range cl.shape.Pins {
			mine := map[int32]bool{}
			for _, q := range cl.shape.Pins {
				if r := rt.g[rt.index(q.At)].resv; r != 0 && math.Abs(q.At.Y-p.At.Y) < geom.Eps {
					mine[r] = true // a pin tip is reserved for its net
				}
			}
			d, x := 0, 0.0
			switch p.Dir {
			case geom.Left: // the far side is the right
				d, x = int(geom.Right), b.X1
			case geom.Right:
				d, x = int(geom.Left), b.X0
			default:
				continue
			}
			start := rt.index(geom.Pt{X: x, Y: p.At.Y})
			if tw, ok := rt.beyond(start, d, mine, body); ok && !seen[[2]int{tw.id, start}] {
				seen[[2]int{tw.id, start}] = true
				out = append(out, tw)
			}
		}
	}
	return out
}

// beyond walks from point c (a device's side) in direction d for
// throughReach steps (fenceReach once a wire is found), up to the first
// symbol, pin tip or local symbol's stub (a part's label beside the device does not part the line: it stands
// off it, and a wire routed round it comes back to the line), and returns the
// first other net running along the line, with every point walked as the
// fence (the net wired again must not come back a step further on).
func (rt *router) beyond(c, d int, mine map[int32]bool, body []bool) (throughWire, bool) {
	along := alongArms[d]
	tw := throughWire{id: -1}
	for i := 0; i <= fenceReach && c >= 0 && c < len(rt.g) && (i <= throughReach || tw.id >= 0); i++ {
		g := &rt.g[c]
		if i > 0 && (body[c] || g.flags&(fPin|fStub) != 0) {
			break
		}
		tw.fence = append(tw.fence, c)
		for k := 0; k < 2 && tw.id < 0; k++ {
			if g.own[k] != 0 && g.arm[k]&along != 0 {
				if mine[g.own[k]] {
					return throughWire{}, false // the device's own net goes on
				}
				tw.id = int(g.own[k]) - 1
			}
		}
		c = rt.neighbour(c, d)
	}
	return tw, tw.id >= 0
}

// bodies marks the grid points inside or on every symbol's box.
func (rt *router) bodies() []bool {
	out := make([]bool, len(rt.g))
	for _, cl := range rt.ly.cells {
		b := cl.shape.Box
		for y := int(math.Floor(b.Y0+geom.Eps)) - rt.y0; y <= int(math.Ceil(b.Y1-geom.Eps))-rt.y0; y++ {
			for x := int(math.Floor(b.X0+geom.Eps)) - rt.x0; x <= int(math.Ceil(b.X1-geom.Eps))-rt.x0; x++ {
				if x >= 0 && y >= 0 && x < rt.w && y < rt.h {
					out[y*rt.w+x] = true
				}
			}
		}
	}
	return out
}
