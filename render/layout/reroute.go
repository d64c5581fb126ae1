package layout

import (
	"math"
	"sort"

	"pare/render/geom"
)

// routeNets wires every net: most pins first, then the widest (or the
// shortest first, when the layout asks for it); nets that fail get one round
// of rip-up and reroute.
func (rt *router) routeNets() {
	order := make([]int, len(rt.nets))
	for i := range order {
		order[i] = i
	}
	span := func(nr *netRoute) int {
		b := geom.Rect{}
		for _, p := range nr.pins {
			b = b.Union(geom.Rect{X0: p.pin.At.X, Y0: p.pin.At.Y, X1: p.pin.At.X + geom.Eps, Y1: p.pin.At.Y + geom.Eps})
		}
		return int(b.W() + b.H())
	}
	sort.SliceStable(order, func(a, b int) bool {
		na, nb := rt.nets[order[a]], rt.nets[order[b]]
		if rt.ly.shortFirst {
			return span(na) < span(nb)
		}
		if len(na.pins) != len(nb.pins) {
			return len(na.pins) > len(nb.pins)
		}
		return span(na) > span(nb)
	})
	var failed []int
	for _, id := range order {
		if !rt.routeNet(id) {
			failed = append(failed, id)
		}
	}
	for _, id := range failed {
		if !rt.nets[id].ok {
			rt.rerouteFailed(id)
		}
	}
}

// finish reroutes crossing nets (and with unline, nets ending in line with
// another's, then nets crossing beside a junction or a lead, then once more
// nets ending in line, then nets running beside a part of their own, then
// nets on a device lead's line beyond the device, each growing nothing
// else) and flags the nets that could not be wired.
func (rt *router) finish(unline bool) {
	rt.uncross()
	if unline {
		rt.unline(false)
		rt.undot()
		rt.unline(true)
		rt.unalong()
		rt.unthrough()
	}
	for id, nr := range rt.nets {
		if !nr.ok && len(nr.pins) >= 2 {
			rt.ripUp(id)
			rt.flagNet(id)
		}
	}
}

// rerouteFailed rips up the nets in a failed net's way, wires it first, then
// them again.
func (rt *router) rerouteFailed(id int) {
	rt.ripUp(id)
	box := rt.pinBox(id, 3)
	var victims []int
	for j, nr := range rt.nets {
		if j == id || !nr.ok {
			continue
		}
		for _, c := range nr.cells {
			if box.Contains(rt.point(c)) {
				victims = append(victims, j)
				break
			}
		}
	}
	for _, v := range victims {
		rt.ripUp(v)
	}
	rt.routeNet(id)
	for _, v := range victims {
		rt.routeNet(v)
	}
}

// budget bounds the search work spent removing crossings, in states taken
// off the queue: generous for a stage or two, linear in the sheet's size.
func (rt *router) budget() int { return 200000 + 50*len(rt.ly.cells) }

// saved is a net's wiring, kept while trying another.
type saved struct {
	cells []int
	arms  []uint8
	ok    bool // whether the wiring reached every pin
}

func (rt *router) save(id int) saved {
	net := int32(id + 1)
	s := saved{ok: rt.nets[id].ok}
	for _, c := range rt.nets[id].cells {
		s.cells = append(s.cells, c)
		s.arms = append(s.arms, rt.arms(c, net))
	}
	return s
}

func (rt *router) restore(id int, s saved) {
	net := int32(id + 1)
	for i, c := range s.cells {
		if !rt.owns(c, net) || rt.arms(c, net) != s.arms[i] {
			rt.addArm(c, net, s.arms[i])
		}
	}
	rt.nets[id].cells = append([]int(nil), s.cells...)
	// a net that had failed stays failed, so finish flags it: restored
	// as wired, review16 a01's tank net kept its partial wiring and the
	// divider capacitor's lead was drawn bare
	rt.nets[id].ok = s.ok
}

// crossingsOf counts the cells where the given nets cross another net.
func (rt *router) crossingsOf(ids ...int) int {
	seen := map[int]bool{}
	for _, id := range ids {
		for _, c := range rt.nets[id].cells {
			if rt.g[c].own[1] != 0 {
				seen[c] = true
			}
		}
	}
	return len(seen)
}

// netPair is two crossing nets, by index, the lower first.
type netPair struct{ a, b int }

// crossingPairs lists the pairs of nets that cross, in grid order.
func (rt *router) crossingPairs() []netPair {
	var pairs []netPair
	seen := map[netPair]bool{}
	for c := range rt.g {
		if o := rt.g[c].own; o[1] != 0 {
			p := netPair{int(min(o[0], o[1])) - 1, int(max(o[0], o[1])) - 1}
			if !seen[p] {
				seen[p] = true
				pairs = append(pairs, p)
			}
		}
	}
	return pairs
}

// uncross is rip-up and reroute for crossings: for each pair of crossing
// nets, try rerouting one of them over a wider window, then both in the
// other order, and keep whichever has fewer crossings.
func (rt *router) uncross() {
	for round := 0; round < 4; round++ {
		pairs := rt.crossingPairs()
		if len(pairs) == 0 || len(pairs) > 400 {
			return
		}
		improved := false
		for _, p := range pairs {
			if rt.pops > rt.budget() {
				return // deterministic work bound: the same input stops at the same place
			}
			if rt.uncrossPair(p, round) {
				improved = true
			}
		}
		if !improved {
			return
		}
	}
}

// uncrossPair tries to reroute one net of a crossing pair, then both, and
// keeps the first wiring with fewer crossings between them.
func (rt *router) uncrossPair(p netPair, round int) bool {
	count := rt.crossingsOf
	if rt.siblings(int32(p.a+1), int32(p.b+1)) {
		count = rt.pricedCrossingsOf // two leads of one valve
	}
	before := count(p.a, p.b)
	if before == 0 {
		return false
	}
	sa, sb := rt.save(p.a), rt.save(p.b)
	tries := [][]int{{p.b}, {p.a}, {p.b, p.a}, {p.a, p.b}}
	if round%2 == 1 {
		tries = [][]int{{p.a}, {p.b}, {p.a, p.b}, {p.b, p.a}}
	}
	for _, order := range tries {
		for _, id := range order {
			rt.ripUp(id)
		}
		rt.wide = true
		ok := true
		for _, id := range order {
			ok = rt.routeNet(id) && ok
		}
		rt.wide = false
		if ok && count(p.a, p.b) < before {
			return true
		}
		rt.ripUp(p.a)
		rt.ripUp(p.b)
		rt.restore(p.a, sa)
		rt.restore(p.b, sb)
	}
	return false
}

func (rt *router) pinBox(id int, m float64) geom.Rect {
	b := geom.Rect{}
	for _, p := range rt.nets[id].pins {
		b = b.Union(geom.Rect{X0: p.pin.At.X, Y0: p.pin.At.Y, X1: p.pin.At.X + geom.Eps, Y1: p.pin.At.Y + geom.Eps})
	}
	return b.Inset(m)
}

func (rt *router) ripUp(id int) {
	net := int32(id + 1)
	nr := rt.nets[id]
	for _, c := range nr.cells {
		g := &rt.g[c]
		switch net {
		case g.own[0]:
			g.own[0], g.arm[0] = g.own[1], g.arm[1]
			g.own[1], g.arm[1] = 0, 0
		case g.own[1]:
			g.own[1], g.arm[1] = 0, 0
		default:
			continue
		}
		if g.arm[0]&armE == 0 || g.own[0] == 0 {
			g.flags &^= fFadedE
		}
		if g.arm[0]&armS == 0 || g.own[0] == 0 {
			g.flags &^= fFadedS
		}
	}
	nr.cells, nr.ok = nil, false
}

// searchMargins are the windows a connection is searched in, round the
// tree's and the pin's box: near first, then wider, then about a page
// round it (the whole sheet of a sheet no bigger). Never the whole of a
// large sheet: a connection that no page-sized window round its own pins
// holds is better drawn as a pair of net-name flags than as a wire across
// the sheet, and a failed search over the whole grid of a whole set costs
// as much as routing a stage (docs/performance.md, "Whole sets").
func (rt *router) searchMargins() []int {
	if !rt.wide {
		return []int{6, 20, pageMargin}
	}
	if len(rt.ly.cells) <= 300 {
		return []int{12, 40} // small sheets can afford to look far
	}
	return []int{12}
}

// pageMargin is the widest margin a connection is searched in, in grid
// units: half an A3 sheet's printable width at the smallest text (render's
// pages), so the widest window is at least a page across.
const pageMargin = 68

// routeNet grows the net's tree from its first pin, joining the nearest
// pending pin each time. Whether a pin is faded plays no part: the faded view
// is the full view's wiring with the runs that serve only faded pins greyed
// (fadeRuns), so the two views draw the same wires.
func (rt *router) routeNet(id int) bool {
	nr := rt.nets[id]
	net := int32(id + 1)
	if len(nr.pins) < 2 {
		nr.ok = true
		return true
	}
	pins := append([]wirePin(nil), nr.pins...)
	sort.SliceStable(pins, func(a, b int) bool {
		pa, pb := pins[a].pin.At, pins[b].pin.At
		if rt.farFirst {
			pa, pb = pb, pa
		}
		if pa.X != pb.X {
			return pa.X < pb.X
		}
		return pa.Y < pb.Y
	})
	first := pins[0]
	rt.addArm(first.cell, net, 1<<opposite(int(first.pin.Dir)))
	nr.cells = append(nr.cells, first.cell)
	tree := rt.cellRect(first.cell)
	pending := pins[1:]
	for len(pending) > 0 {
		best := rt.nearestPending(pending, tree)
		p := pending[best]
		pending = append(pending[:best:best], pending[best+1:]...)
		var path []int
		var last window
		for _, m := range rt.searchMargins() {
			win := rt.window(tree, p, m)
			if win == last {
				break // the wider window is the same: it would fail the same way
			}
			last = win
			if path = rt.search(net, p, tree, win); path != nil {
				break
			}
		}
		if path == nil {
			nr.ok = false
			return false
		}
		rt.commit(net, p, path)
		for _, c := range path {
			tree = tree.Union(rt.cellRect(c))
		}
	}
	nr.ok = true
	return true
}

// nearestPending picks the pending pin nearest the tree.
func (rt *router) nearestPending(pending []wirePin, tree geom.Rect) int {
	best, bestD := 0, math.MaxInt
	for i, p := range pending {
		if d := rt.distRect(p.cell, tree); d < bestD {
			best, bestD = i, d
		}
	}
	return best
}

func (rt *router) cellRect(i int) geom.Rect {
	p := rt.point(i)
	return geom.Rect{X0: p.X, Y0: p.Y, X1: p.X, Y1: p.Y}
}

func (rt *router) distRect(i int, r geom.Rect) int {
	p := rt.point(i)
	dx := math.Max(0, math.Max(r.X0-p.X, p.X-r.X1))
	dy := math.Max(0, math.Max(r.Y0-p.Y, p.Y-r.Y1))
	return int(dx + dy)
}

func (rt *router) commit(net int32, p wirePin, path []int) {
	nr := rt.nets[net-1]
	rt.addArm(path[0], net, 1<<opposite(int(p.pin.Dir)))
	for k := 0; k+1 < len(path); k++ {
		a, b := path[k], path[k+1]
		d := rt.dirBetween(a, b)
		rt.addArm(a, net, 1<<d)
		rt.addArm(b, net, 1<<opposite(d))
	}
	nr.cells = append(nr.cells, path...)
}

func (rt *router) dirBetween(a, b int) int {
	switch b - a {
	case 1:
		return int(geom.Right)
	case -1:
		return int(geom.Left)
	case rt.w:
		return int(geom.Down)
	}
	return int(geom.Up)
}
