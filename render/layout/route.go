package layout

import (
	"math"
	"math/bits"
	"sort"

	"pare/render/geom"
	"pare/render/symbol"
)

// Routing costs, in tenths of a grid step: a bend costs three steps, a
// crossing eight, so a wire goes a fair way round rather than cross another
// (crossings hurt a reader most: Purchase 1997).
const (
	stepCost  = 10
	bendCost  = 30
	crossCost = 300
	// while removing crossings a wire may go a long way round instead
	wideCrossCost = 1200
	// a step beside another net's wire, on the neighbouring grid line and
	// running the same way, or along a stage frame's dashed edge half a step
	// away: at print size the two lines blur into one, so a wire keeps a
	// grid step of clear space when a short detour allows
	nearCost = 30
	// a step through a stage frame's edge: a wire of the stage stays inside
	// its frame rather than run round outside it
	edgeCost = 60
)

// arm bits: which neighbours a wire cell connects to
const (
	armW = 1 << geom.Left
	armN = 1 << geom.Up
	armE = 1 << geom.Right
	armS = 1 << geom.Down
)

var dirStep = [4][2]int{{-1, 0}, {0, -1}, {1, 0}, {0, 1}}

func opposite(d int) int { return (d + 2) % 4 }

type wirePin struct {
	ref   string
	pin   geom.Pin
	faded bool
	cell  int
}

type netRoute struct {
	name  string
	pins  []wirePin
	cells []int // cells the net's wires use
	ok    bool
}

// router is a grid of cells one grid step apart over the sheet.
type router struct {
	ly             *state
	x0, y0, w, h   int
	blocked        []bool
	resv           []int32 // net reserved at pin tips and the cell just outside
	pinCell        []bool
	own1, own2     []int32
	arm1, arm2     []uint8
	fadedE, fadedS []bool
	// hugH and hugV mark the cells half a step from a frame edge that runs
	// horizontally or vertically past them
	hugH, hugV []bool
	// cutE and cutS mark the steps east and south of a cell that pass
	// through a frame edge
	cutE, cutS []bool
	nets       []*netRoute // index = id-1
	flags      []geom.Local
	// search scratch, stamped so that a search never clears the grid
	stamp  []uint32
	gcost  []int32
	parent []int32
	gen    uint32
	heap   []heapItem
	wide   bool // search wide windows first (while removing crossings)
	pops   int  // states taken off the heap so far: the work budget
}

type heapItem struct{ f, s int32 }

func newRouter(ly *state) *router {
	b := geom.Rect{}
	for _, cl := range ly.cells {
		b = b.Union(cl.footprint())
	}
	for _, f := range ly.frames {
		b = b.Union(f.Box)
	}
	rt := &router{ly: ly}
	rt.x0, rt.y0 = int(math.Floor(b.X0))-4, int(math.Floor(b.Y0))-4
	rt.w = int(math.Ceil(b.X1)) + 5 - rt.x0
	rt.h = int(math.Ceil(b.Y1)) + 5 - rt.y0
	n := rt.w * rt.h
	rt.blocked = make([]bool, n)
	rt.resv = make([]int32, n)
	rt.pinCell = make([]bool, n)
	rt.own1, rt.own2 = make([]int32, n), make([]int32, n)
	rt.arm1, rt.arm2 = make([]uint8, n), make([]uint8, n)
	rt.fadedE, rt.fadedS = make([]bool, n), make([]bool, n)
	rt.stamp = make([]uint32, 4*n)
	rt.gcost = make([]int32, 4*n)
	rt.parent = make([]int32, 4*n)

	// nets to wire, by name
	byName := map[string]*netRoute{}
	var names []string
	for _, cl := range ly.cells {
		for _, p := range cl.shape.Pins {
			if ly.c.RoleOf(p.Net).IsACGround() || p.Net == "" || p.Net == notConnected {
				continue
			}
			nr := byName[p.Net]
			if nr == nil {
				nr = &netRoute{name: p.Net}
				byName[p.Net] = nr
				names = append(names, p.Net)
			}
			nr.pins = append(nr.pins, wirePin{ref: cl.ref, pin: p, faded: cl.faded, cell: rt.index(p.At)})
		}
	}
	sort.Strings(names)
	for _, n := range names {
		rt.nets = append(rt.nets, byName[n])
	}
	// obstacles: symbol bodies (bar their pin tips), locals, labels, titles
	for _, cl := range ly.cells {
		rt.block(cl.shape.Box)
		for _, l := range cl.locals {
			rt.block(l.Box)
			for _, s := range l.Stub {
				rt.block(s.Box())
			}
		}
		if len(cl.label.Lines) > 0 {
			rt.block(cl.label.Box)
		}
	}
	rt.hugH, rt.hugV = make([]bool, n), make([]bool, n)
	rt.cutE, rt.cutS = make([]bool, n), make([]bool, n)
	for _, f := range ly.frames {
		rt.block(f.Title.Box)
		rt.markHugs(f.Box)
	}
	for id, nr := range rt.nets {
		for _, wp := range nr.pins {
			rt.blocked[wp.cell] = false
			rt.resv[wp.cell] = int32(id + 1)
			rt.pinCell[wp.cell] = true
		}
	}
	for id, nr := range rt.nets {
		for _, wp := range nr.pins {
			if len(nr.pins) < 2 {
				continue
			}
			e := rt.neighbour(wp.cell, int(wp.pin.Dir))
			if e >= 0 && !rt.blocked[e] && rt.resv[e] == 0 {
				rt.resv[e] = int32(id + 1)
			}
		}
	}
	return rt
}

// markHugs marks the grid lines on either side of a frame's edges.
func (rt *router) markHugs(b geom.Rect) {
	mark := func(x, y int, h bool) {
		x, y = x-rt.x0, y-rt.y0
		if x < 0 || y < 0 || x >= rt.w || y >= rt.h {
			return
		}
		if h {
			rt.hugH[y*rt.w+x] = true
		} else {
			rt.hugV[y*rt.w+x] = true
		}
	}
	cut := func(x, y int, east bool) {
		x, y = x-rt.x0, y-rt.y0
		if x < 0 || y < 0 || x >= rt.w || y >= rt.h {
			return
		}
		if east {
			rt.cutE[y*rt.w+x] = true
		} else {
			rt.cutS[y*rt.w+x] = true
		}
	}
	for _, ey := range []float64{b.Y0, b.Y1} {
		for x := int(math.Ceil(b.X0)); x <= int(math.Floor(b.X1)); x++ {
			mark(x, int(math.Floor(ey)), true)
			mark(x, int(math.Ceil(ey)), true)
			cut(x, int(math.Floor(ey)), false)
		}
	}
	for _, ex := range []float64{b.X0, b.X1} {
		for y := int(math.Ceil(b.Y0)); y <= int(math.Floor(b.Y1)); y++ {
			mark(int(math.Floor(ex)), y, false)
			mark(int(math.Ceil(ex)), y, false)
			cut(int(math.Floor(ex)), y, true)
		}
	}
}

// crowded says whether a step into cell n moving in direction d runs
// beside another net's wire going the same way, or along a frame edge.
func (rt *router) crowded(n, d int, net int32) bool {
	horizontal := d == int(geom.Left) || d == int(geom.Right)
	if (horizontal && rt.hugH[n]) || (!horizontal && rt.hugV[n]) {
		return true
	}
	along := uint8(armN | armS)
	if horizontal {
		along = armE | armW
	}
	for _, side := range []int{(d + 1) % 4, (d + 3) % 4} {
		m := rt.neighbour(n, side)
		if m < 0 {
			continue
		}
		for _, o := range []struct {
			own int32
			arm uint8
		}{{rt.own1[m], rt.arm1[m]}, {rt.own2[m], rt.arm2[m]}} {
			if o.own != 0 && o.own != net && o.arm&along != 0 {
				return true
			}
		}
	}
	return false
}

// cutsFrame says whether the step from cell c to its neighbour n in
// direction d passes through a frame edge.
func (rt *router) cutsFrame(c, n, d int) bool {
	switch d {
	case int(geom.Right):
		return rt.cutE[c]
	case int(geom.Left):
		return rt.cutE[n]
	case int(geom.Down):
		return rt.cutS[c]
	}
	return rt.cutS[n]
}

func (rt *router) index(p geom.Pt) int {
	x, y := int(math.Round(p.X))-rt.x0, int(math.Round(p.Y))-rt.y0
	return y*rt.w + x
}

func (rt *router) point(i int) geom.Pt {
	return geom.Pt{X: float64(i%rt.w + rt.x0), Y: float64(i/rt.w + rt.y0)}
}

func (rt *router) neighbour(i, d int) int {
	x, y := i%rt.w+dirStep[d][0], i/rt.w+dirStep[d][1]
	if x < 0 || y < 0 || x >= rt.w || y >= rt.h {
		return -1
	}
	return y*rt.w + x
}

// block marks every grid point inside or on the integer hull of r, so that
// no wire between free points can enter r.
func (rt *router) block(r geom.Rect) {
	x0, x1 := int(math.Floor(r.X0+geom.Eps))-rt.x0, int(math.Ceil(r.X1-geom.Eps))-rt.x0
	y0, y1 := int(math.Floor(r.Y0+geom.Eps))-rt.y0, int(math.Ceil(r.Y1-geom.Eps))-rt.y0
	for y := max(y0, 0); y <= min(y1, rt.h-1); y++ {
		for x := max(x0, 0); x <= min(x1, rt.w-1); x++ {
			rt.blocked[y*rt.w+x] = true
		}
	}
}

func (rt *router) arms(i int, net int32) uint8 {
	switch net {
	case rt.own1[i]:
		return rt.arm1[i]
	case rt.own2[i]:
		return rt.arm2[i]
	}
	return 0
}

func (rt *router) owns(i int, net int32) bool { return rt.own1[i] == net || rt.own2[i] == net }

func (rt *router) foreign(i int, net int32) bool {
	return (rt.own1[i] != 0 && rt.own1[i] != net) || (rt.own2[i] != 0 && rt.own2[i] != net)
}

func (rt *router) addArm(i int, net int32, bit uint8) {
	switch {
	case rt.own1[i] == net:
		rt.arm1[i] |= bit
	case rt.own2[i] == net:
		rt.arm2[i] |= bit
	case rt.own1[i] == 0:
		rt.own1[i], rt.arm1[i] = net, bit
	default:
		rt.own2[i], rt.arm2[i] = net, bit
	}
}

// joinable says whether a wire arriving into cell i moving in direction d
// may join the net's tree there: the arm must be free, no other net may be
// there, and the cell must end with at most three arms (a T, never a
// four-way junction).
func (rt *router) joinable(i int, net int32, d int) bool {
	if rt.own2[i] != 0 || rt.own1[i] != net {
		return false
	}
	a := rt.arm1[i]
	bit := uint8(1) << opposite(d)
	return a&bit == 0 && bits.OnesCount8(a) < 3
}

// routeAll wires every net: most pins first, then the widest; nets that fail
// get one round of rip-up and reroute, then net-name flags.
func (rt *router) routeAll() {
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
	// rip up the nets in a failed net's way, wire it first, then them again
	for _, id := range failed {
		if rt.nets[id].ok {
			continue
		}
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
	rt.uncross()
	for id, nr := range rt.nets {
		if !nr.ok && len(nr.pins) >= 2 {
			rt.ripUp(id)
			rt.flagNet(id)
		}
	}
}

// budget bounds the search work spent removing crossings, in heap pops:
// generous for a stage or two, linear in the sheet's size.
func (rt *router) budget() int { return 200000 + 50*len(rt.ly.cells) }

// saved is a net's wiring, kept while trying another.
type saved struct {
	cells []int
	arms  []uint8
	fe    []bool
	fs    []bool
}

func (rt *router) save(id int) saved {
	net := int32(id + 1)
	var s saved
	for _, c := range rt.nets[id].cells {
		s.cells = append(s.cells, c)
		s.arms = append(s.arms, rt.arms(c, net))
		s.fe = append(s.fe, rt.fadedE[c])
		s.fs = append(s.fs, rt.fadedS[c])
	}
	return s
}

func (rt *router) restore(id int, s saved) {
	net := int32(id + 1)
	for i, c := range s.cells {
		if !rt.owns(c, net) || rt.arms(c, net) != s.arms[i] {
			rt.addArm(c, net, s.arms[i])
		}
		if s.arms[i]&armE != 0 {
			rt.fadedE[c] = s.fe[i]
		}
		if s.arms[i]&armS != 0 {
			rt.fadedS[c] = s.fs[i]
		}
	}
	rt.nets[id].cells = append([]int(nil), s.cells...)
	rt.nets[id].ok = true
}

// crossingsOf counts the cells where the given nets cross another net.
func (rt *router) crossingsOf(ids ...int) int {
	seen := map[int]bool{}
	for _, id := range ids {
		for _, c := range rt.nets[id].cells {
			if rt.own2[c] != 0 {
				seen[c] = true
			}
		}
	}
	return len(seen)
}

// uncross is rip-up and reroute for crossings: for each pair of crossing
// nets, try rerouting one of them over a wider window, then both in the
// other order, and keep whichever has fewer crossings.
func (rt *router) uncross() {
	for round := 0; round < 4; round++ {
		type pair struct{ a, b int }
		var pairs []pair
		seen := map[pair]bool{}
		for c := range rt.own2 {
			if rt.own2[c] != 0 {
				p := pair{int(min(rt.own1[c], rt.own2[c])) - 1, int(max(rt.own1[c], rt.own2[c])) - 1}
				if !seen[p] {
					seen[p] = true
					pairs = append(pairs, p)
				}
			}
		}
		if len(pairs) == 0 || len(pairs) > 400 {
			return
		}
		improved := false
		for _, p := range pairs {
			if rt.pops > rt.budget() {
				return // deterministic work bound: the same input stops at the same place
			}
			before := rt.crossingsOf(p.a, p.b)
			if before == 0 {
				continue
			}
			sa, sb := rt.save(p.a), rt.save(p.b)
			tries := [][]int{{p.b}, {p.a}, {p.b, p.a}, {p.a, p.b}}
			if round%2 == 1 {
				tries = [][]int{{p.a}, {p.b}, {p.a, p.b}, {p.b, p.a}}
			}
			done := false
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
				if ok && rt.crossingsOf(p.a, p.b) < before {
					done, improved = true, true
					break
				}
				rt.ripUp(p.a)
				rt.ripUp(p.b)
				rt.restore(p.a, sa)
				rt.restore(p.b, sb)
			}
			_ = done
		}
		if !improved {
			return
		}
	}
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
		switch net {
		case rt.own1[c]:
			rt.own1[c], rt.arm1[c] = rt.own2[c], rt.arm2[c]
			rt.own2[c], rt.arm2[c] = 0, 0
		case rt.own2[c]:
			rt.own2[c], rt.arm2[c] = 0, 0
		default:
			continue
		}
		if rt.arms(c, rt.own1[c])&armE == 0 {
			rt.fadedE[c] = false
		}
		if rt.arms(c, rt.own1[c])&armS == 0 {
			rt.fadedS[c] = false
		}
	}
	nr.cells, nr.ok = nil, false
}

// routeNet grows the net's tree from its first live pin, joining the nearest
// pending pin each time, live pins before faded ones.
func (rt *router) routeNet(id int) bool {
	nr := rt.nets[id]
	net := int32(id + 1)
	if len(nr.pins) < 2 {
		nr.ok = true
		return true
	}
	pins := append([]wirePin(nil), nr.pins...)
	sort.SliceStable(pins, func(a, b int) bool {
		if pins[a].faded != pins[b].faded {
			return !pins[a].faded
		}
		pa, pb := pins[a].pin.At, pins[b].pin.At
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
		best, bestD := 0, math.MaxInt
		for i, p := range pending {
			if pending[i].faded && !pending[best].faded && bestD < math.MaxInt {
				continue
			}
			d := rt.distRect(p.cell, tree)
			if d < bestD || (!p.faded && pending[best].faded) {
				best, bestD = i, d
			}
		}
		p := pending[best]
		pending = append(pending[:best:best], pending[best+1:]...)
		var path []int
		margins := []int{6, 20, 1 << 20}
		if rt.wide {
			margins = []int{12}
			if len(rt.ly.cells) <= 300 {
				margins = []int{12, 40} // small sheets can afford to look far
			}
		}
		for _, m := range margins {
			path = rt.search(net, p, tree, m)
			if path != nil {
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
		switch d {
		case int(geom.Right):
			rt.fadedE[a] = p.faded
		case int(geom.Left):
			rt.fadedE[b] = p.faded
		case int(geom.Down):
			rt.fadedS[a] = p.faded
		default:
			rt.fadedS[b] = p.faded
		}
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

// search is A* from a pending pin to the net's tree, inside the tree's and
// the pin's box grown by margin. It returns the cells from the pin to the
// joining cell, or nil.
func (rt *router) search(net int32, p wirePin, tree geom.Rect, margin int) []int {
	rt.gen++
	if rt.gen == 0 {
		for i := range rt.stamp {
			rt.stamp[i] = 0
		}
		rt.gen = 1
	}
	win := tree.Union(rt.cellRect(p.cell))
	wx0 := max(0, int(win.X0)-rt.x0-margin)
	wx1 := min(rt.w-1, int(win.X1)-rt.x0+margin)
	wy0 := max(0, int(win.Y0)-rt.y0-margin)
	wy1 := min(rt.h-1, int(win.Y1)-rt.y0+margin)
	tx0, ty0 := int(tree.X0)-rt.x0, int(tree.Y0)-rt.y0
	tx1, ty1 := int(tree.X1)-rt.x0, int(tree.Y1)-rt.y0
	h := func(i int) int32 {
		x, y := i%rt.w, i/rt.w
		d := 0
		if x < tx0 {
			d += tx0 - x
		} else if x > tx1 {
			d += x - tx1
		}
		if y < ty0 {
			d += ty0 - y
		} else if y > ty1 {
			d += y - ty1
		}
		return int32(stepCost * d)
	}
	pdir := int(p.pin.Dir)
	start := int32(p.cell*4 + pdir)
	rt.heap = rt.heap[:0]
	rt.stamp[start], rt.gcost[start], rt.parent[start] = rt.gen, 0, -1
	rt.push(heapItem{h(p.cell), start})
	for len(rt.heap) > 0 {
		it := rt.pop()
		rt.pops++
		s := int(it.s)
		c, d := s/4, s%4
		g := rt.gcost[s]
		if it.f != g+h(c) {
			continue // stale entry
		}
		if c != p.cell && rt.owns(c, net) {
			return rt.path(s)
		}
		for nd := 0; nd < 4; nd++ {
			if nd == opposite(d) && c != p.cell {
				continue
			}
			if c == p.cell && nd != pdir {
				continue
			}
			if c != p.cell && rt.foreign(c, net) && nd != d {
				continue
			}
			n := rt.neighbour(c, nd)
			if n < 0 {
				continue
			}
			x, y := n%rt.w, n/rt.w
			if x < wx0 || x > wx1 || y < wy0 || y > wy1 {
				continue
			}
			cost := g + stepCost
			if nd != d {
				cost += bendCost
			}
			if rt.crowded(n, nd, net) {
				cost += nearCost
			}
			if rt.cutsFrame(c, n, nd) {
				cost += edgeCost
			}
			if rt.owns(n, net) {
				if !rt.joinable(n, net, nd) {
					continue
				}
			} else {
				if rt.blocked[n] || (rt.resv[n] != 0 && rt.resv[n] != net) || rt.pinCell[n] {
					continue
				}
				if rt.own1[n] != 0 {
					if rt.own2[n] != 0 {
						continue
					}
					want := uint8(armN | armS)
					if nd == int(geom.Up) || nd == int(geom.Down) {
						want = armE | armW
					}
					if rt.arm1[n] != want {
						continue
					}
					if rt.wide {
						cost += wideCrossCost
					} else {
						cost += crossCost
					}
				}
			}
			ns := int32(n*4 + nd)
			if rt.stamp[ns] == rt.gen && rt.gcost[ns] <= cost {
				continue
			}
			rt.stamp[ns], rt.gcost[ns], rt.parent[ns] = rt.gen, cost, int32(s)
			rt.push(heapItem{cost + h(n), ns})
		}
	}
	return nil
}

func (rt *router) path(s int) []int {
	var out []int
	for s >= 0 {
		out = append(out, s/4)
		s = int(rt.parent[s])
	}
	for i, j := 0, len(out)-1; i < j; i, j = i+1, j-1 {
		out[i], out[j] = out[j], out[i]
	}
	return out
}

func (rt *router) push(it heapItem) {
	rt.heap = append(rt.heap, it)
	i := len(rt.heap) - 1
	for i > 0 {
		p := (i - 1) / 2
		if !less(rt.heap[i], rt.heap[p]) {
			break
		}
		rt.heap[i], rt.heap[p] = rt.heap[p], rt.heap[i]
		i = p
	}
}

func less(a, b heapItem) bool { return a.f < b.f || (a.f == b.f && a.s < b.s) }

func (rt *router) pop() heapItem {
	top := rt.heap[0]
	last := len(rt.heap) - 1
	rt.heap[0] = rt.heap[last]
	rt.heap = rt.heap[:last]
	i := 0
	for {
		l, r := 2*i+1, 2*i+2
		m := i
		if l < len(rt.heap) && less(rt.heap[l], rt.heap[m]) {
			m = l
		}
		if r < len(rt.heap) && less(rt.heap[r], rt.heap[m]) {
			m = r
		}
		if m == i {
			return top
		}
		rt.heap[i], rt.heap[m] = rt.heap[m], rt.heap[i]
		i = m
	}
}

// flagNet draws a net that could not be wired as a net-name flag at each of
// its pins, the trade's way of joining distant points.
func (rt *router) flagNet(id int) {
	nr := rt.nets[id]
	text := railText(rt.ly.c.Net(nr.name), nr.name)
	for _, wp := range nr.pins {
		var chosen *geom.Local
		for s := 1.0; s <= 8 && chosen == nil; s++ {
			for side := 0; side < 3 && chosen == nil; side++ {
				cand := rt.flagAt(wp, text, s, side)
				if rt.free(cand, id) {
					chosen = &cand
				}
			}
		}
		if chosen == nil {
			cand := rt.flagAt(wp, text, 1, 0)
			chosen = &cand
		}
		rt.block(chosen.Box)
		for _, s := range chosen.Stub {
			rt.block(s.Box())
		}
		rt.blocked[wp.cell] = false
		rt.flags = append(rt.flags, *chosen)
	}
}

func (rt *router) flagAt(wp wirePin, text string, s float64, side int) geom.Local {
	st := wp.pin.Dir.Step()
	end := geom.Pt{X: wp.pin.At.X + s*st.X, Y: wp.pin.At.Y + s*st.Y}
	w := symbol.TextWidth(text)*symbol.SmallScale + 0.6
	h := symbol.LineH * symbol.SmallScale
	l := geom.Local{Kind: geom.LocalFlag, Net: wp.pin.Net, Owner: wp.ref, Pin: wp.pin.Name,
		Stub: []geom.Seg{{A: wp.pin.At, B: end}}, At: end, Text: text, Side: wp.pin.Dir, Faded: wp.faded}
	// side 0: the flag continues the stub; 1 and 2: it sits beside the
	// stub's end, on one side or the other
	dir := wp.pin.Dir
	if side > 0 {
		dir = geom.Dir((int(dir) + 2*side - 1) % 4)
		if dir < 0 {
			dir += 4
		}
	}
	switch dir {
	case geom.Left:
		l.Box = geom.R(end.X-w, end.Y-h/2, end.X, end.Y+h/2)
	case geom.Right:
		l.Box = geom.R(end.X, end.Y-h/2, end.X+w, end.Y+h/2)
	case geom.Up:
		l.Box = geom.R(end.X-w/2, end.Y-h, end.X+w/2, end.Y)
	default:
		l.Box = geom.R(end.X-w/2, end.Y, end.X+w/2, end.Y+h)
		l.Down = true
	}
	l.TextBox = l.Box
	return l
}

// free says whether a flag's cells are all unused.
func (rt *router) free(l geom.Local, id int) bool {
	ok := true
	check := func(r geom.Rect, skip int) {
		x0, x1 := int(math.Floor(r.X0+geom.Eps))-rt.x0, int(math.Ceil(r.X1-geom.Eps))-rt.x0
		y0, y1 := int(math.Floor(r.Y0+geom.Eps))-rt.y0, int(math.Ceil(r.Y1-geom.Eps))-rt.y0
		for y := y0; y <= y1; y++ {
			for x := x0; x <= x1; x++ {
				if x < 0 || y < 0 || x >= rt.w || y >= rt.h {
					ok = false
					return
				}
				i := y*rt.w + x
				if i == skip {
					continue
				}
				if rt.blocked[i] || rt.own1[i] != 0 || (rt.resv[i] != 0 && rt.resv[i] != int32(id+1)) || rt.pinCell[i] {
					ok = false
				}
			}
		}
	}
	pinCell := rt.index(l.Stub[0].A)
	check(l.Stub[0].Box(), pinCell)
	check(l.Box, pinCell)
	return ok
}

// emit writes the routed wires, dots and flags into the sheet geometry:
// unit steps merged into straight runs that break at bends, junctions, pins
// and where a run changes between live and faded.
func (rt *router) emit(g *geom.Sheet) {
	for id, nr := range rt.nets {
		if !nr.ok || len(nr.cells) == 0 {
			continue
		}
		net := int32(id + 1)
		cells := append([]int(nil), nr.cells...)
		sort.Ints(cells)
		cells = uniq(cells)
		w := geom.Wire{Net: nr.name}
		straight := func(c int, along uint8) bool { return rt.arms(c, net) == along }
		// a real step joins two cells that both carry it (a pin's lead into
		// its body is an arm without a step)
		edgeE := func(c int) bool {
			return c >= 0 && c%rt.w < rt.w-1 && rt.arms(c, net)&armE != 0 && rt.arms(c+1, net)&armW != 0
		}
		edgeS := func(c int) bool {
			return c >= 0 && c+rt.w < len(rt.own1) && rt.arms(c, net)&armS != 0 && rt.arms(c+rt.w, net)&armN != 0
		}
		// horizontal runs, row by row (cells are sorted by row, then column)
		for _, c := range cells {
			if !edgeE(c) {
				continue
			}
			if c%rt.w > 0 && edgeE(c-1) && straight(c, armE|armW) && rt.fadedE[c-1] == rt.fadedE[c] {
				continue // inside a run started further left
			}
			end := c + 1
			for edgeE(end) && straight(end, armE|armW) && rt.fadedE[end] == rt.fadedE[c] {
				end++
			}
			w.Segs = append(w.Segs, geom.Seg{A: rt.point(c), B: rt.point(end)})
			w.Faded = append(w.Faded, rt.fadedE[c])
		}
		// vertical runs, column by column
		sort.Slice(cells, func(a, b int) bool {
			xa, xb := cells[a]%rt.w, cells[b]%rt.w
			if xa != xb {
				return xa < xb
			}
			return cells[a] < cells[b]
		})
		for _, c := range cells {
			if !edgeS(c) {
				continue
			}
			if edgeS(c-rt.w) && straight(c, armN|armS) && rt.fadedS[c-rt.w] == rt.fadedS[c] {
				continue
			}
			end := c + rt.w
			for edgeS(end) && straight(end, armN|armS) && rt.fadedS[end] == rt.fadedS[c] {
				end += rt.w
			}
			w.Segs = append(w.Segs, geom.Seg{A: rt.point(c), B: rt.point(end)})
			w.Faded = append(w.Faded, rt.fadedS[c])
		}
		sort.Ints(cells)
		for _, c := range cells {
			if bits.OnesCount8(rt.arms(c, net)) >= 3 {
				g.Dots = append(g.Dots, rt.point(c))
			}
		}
		g.Wires = append(g.Wires, w)
	}
	for _, nr := range rt.nets {
		if !nr.ok && len(nr.pins) >= 2 {
			g.Failed = append(g.Failed, nr.name)
		}
	}
	g.Locals = append(g.Locals, rt.flags...)
}

func uniq(s []int) []int {
	out := s[:0]
	for i, v := range s {
		if i == 0 || v != s[i-1] {
			out = append(out, v)
		}
	}
	return out
}
