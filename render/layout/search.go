package layout

import (
	"math/bits"

	"pare/render/geom"
)

// The search is A* (Lee 1961 with a heuristic) over states (grid point,
// direction of arrival), the direction being what a bend's cost needs.

// stateInfo is the search's record of one state: the cost from the pin,
// and, stamped with the search that wrote it (so that a search never has to
// clear the grid), the direction the wire arrived in at the previous point.
// The previous point itself is one step back against the state's own
// direction, so the wire can be followed back without storing it.
type stateInfo struct {
	stamp uint32 // search number << 2 | direction of arrival at the previous point
	g     int32
}

// scratch is the search's memory, kept between searches.
type scratch struct {
	st  []stateInfo
	gen uint32
	q   stateQueue
	key []byte // searchKey's buffer
	// the nets the current search must not cross (siblingMask): marks
	// by net id, and the ids marked
	sib    []bool
	sibSet []int32
}

// next starts a new search over n states.
func (sc *scratch) next(n int) {
	if len(sc.st) < n {
		sc.st = make([]stateInfo, n)
		sc.gen = 0
	}
	sc.gen++
	if sc.gen == 1<<30 {
		for i := range sc.st {
			sc.st[i].stamp = 0
		}
		sc.gen = 1
	}
	sc.q.reset()
}

// window is the part of the grid a search may use.
type window struct{ x0, y0, x1, y1 int }

// window is the box round the net's tree and the pin, grown by margin.
func (rt *router) window(tree geom.Rect, p wirePin, margin int) window {
	win := tree.Union(rt.cellRect(p.cell))
	return window{
		x0: max(0, int(win.X0)-rt.x0-margin), x1: min(rt.w-1, int(win.X1)-rt.x0+margin),
		y0: max(0, int(win.Y0)-rt.y0-margin), y1: min(rt.h-1, int(win.Y1)-rt.y0+margin),
	}
}

// aim is the search's estimate of the cost left: the grid distance to the
// tree's bounding box, which no wire can beat.
type aim struct{ x0, y0, x1, y1 int }

func (a aim) estimate(x, y int) int32 {
	d := 0
	if x < a.x0 {
		d += a.x0 - x
	} else if x > a.x1 {
		d += x - a.x1
	}
	if y < a.y0 {
		d += a.y0 - y
	} else if y > a.y1 {
		d += y - a.y1
	}
	return int32(stepCost * d)
}

// seek is one search's fixed terms: the net, the pin it starts from, the
// tree it aims at and the window it may use, with the steps between
// neighbours on the grid and among the window's states.
type seek struct {
	net     int32
	pinCell int
	to      aim
	win     window
	shift   uint   // rows of the window's points are numbered 1<<shift apart
	cellAt  [4]int // grid index step in each direction
	stateAt [4]int // state number step (of the point) in each direction
	// the search's memory and the grid, held here so that the inner loop
	// reads them from one place
	st    []stateInfo
	gen   uint32
	grid  []gridCell
	w, h  int
	q     *stateQueue
	cross int32    // a crossing's price: crossCost, or wideCrossCost
	home  uint64   // the frames holding the net's pins (netRoute.home)
	lines [3]int32 // a run's end's price by what lies in line beyond it
	reach int      // how far beyond a run's end lines looks
	dot   int32    // a crossing's price beside a junction: dotCost, or more while shy
	shy   bool     // a crossing within leadClear of a pin tip of either net costs shyCost
	// the points beside two-terminal parts (router.alongAt, alongSets)
	along     bool
	alongAt   []int32
	alongSets [][]alongMark
	sib       []bool // by net id: another lead of a valve the net leads from (siblings.go); nil for none
}

// search is A* from a pending pin to the net's tree, inside a window of the
// grid. It returns the cells from the pin to the joining cell, or nil.
//
// States are numbered inside the window, row by row as on the grid, so the
// search's memory is as small as its window (and stays in the cache) while
// state numbers keep the grid's order, which the queue's ties follow. A row
// is numbered from a power of two (the window's width rounded up), which
// keeps that order and turns a state's number back into its point with a
// shift and a mask instead of a division.
func (rt *router) search(net int32, p wirePin, tree geom.Rect, win window) []int {
	k := seek{net: net, home: rt.nets[net-1].home, pinCell: p.cell, win: win, shift: uint(bits.Len(uint(win.x1 - win.x0))),
		to: aim{int(tree.X0) - rt.x0, int(tree.Y0) - rt.y0, int(tree.X1) - rt.x0, int(tree.Y1) - rt.y0}}
	for d, st := range dirStep {
		k.cellAt[d] = st[0] + st[1]*rt.w
		k.stateAt[d] = 4 * (st[0] + st[1]<<k.shift)
	}
	k.sib = rt.siblingMask(net)
	key := rt.searchKey(&k, p)
	if e, ok := memoGet(key); ok {
		rt.pops += e.pops
		return rt.fromWindow(e.path, win)
	}
	pops := rt.pops
	path := rt.astar(&k, p)
	memoPut(key, memoEntry{path: rt.toWindow(path, win), pops: rt.pops - pops})
	return path
}

// astar is the search itself (search's comment).
func (rt *router) astar(k *seek, p wirePin) []int {
	sc, net, win := rt.sc, k.net, k.win
	sc.next(4 * (win.y1 - win.y0 + 1) << k.shift)
	k.onGrid(rt)
	k.st, k.gen, k.q = sc.st, sc.gen, &sc.q
	sh := k.shift & 63
	mask := 1<<sh - 1
	px, py := p.cell%rt.w, p.cell/rt.w
	start := int32(((py-win.y0)<<sh+px-win.x0)*4 + int(p.pin.Dir))
	st, grid, q := k.st, k.grid, k.q
	st[start] = stateInfo{stamp: k.gen << 2, g: 0}
	q.push(k.to.estimate(px, py), start)
	pops := 0
	defer func() { rt.pops += pops }()
	for q.n > 0 {
		f, s := q.pop()
		pops++
		lc, d := int(uint32(s)>>2), int(s&3)
		g := st[s].g
		x, y := lc&mask+win.x0, lc>>sh+win.y0
		if f != g+k.to.estimate(x, y) {
			continue // stale entry: the state was reached more cheaply since
		}
		c := y*k.w + x
		if o := grid[c].own; c != p.cell && (o[0] == net || o[1] == net) {
			return rt.path(k, int(s), int(start))
		}
		k.expand(c, int(s)&^3, x, y, d, g)
	}
	return nil
}

// onGrid points the search at the router's grid and crossing price.
func (k *seek) onGrid(rt *router) {
	k.grid, k.w, k.h = rt.g, rt.w, rt.h
	k.cross, k.lines, k.reach, k.dot, k.shy = crossCost, lineCosts, inLineReach, dotCost, rt.shy
	k.along, k.alongAt, k.alongSets = rt.along && rt.alongAt != nil, rt.alongAt, rt.alongSets
	if rt.shy {
		k.dot = dotCost + shyCost
	}
	if rt.strict {
		k.lines, k.reach = unlineCosts, unlineReach
	}
	if rt.wide {
		// removing a crossing comes first: a wire may end in line
		// close to another rather than cross it
		k.cross, k.lines = wideCrossCost, [3]int32{0, inLineCost, inLineCost}
	}
}

// expand pushes the states one step on from point c (at x, y; its states
// numbered from s0 in the window), reached at cost g moving in direction d.
func (k *seek) expand(c, s0, x, y, d int, g int32) {
	st, gen, net := k.st, k.gen, k.net
	var dirs uint8 // the directions a wire may leave c in
	switch o := k.grid[c].own; {
	case c == k.pinCell:
		dirs = 1 << d // a wire leaves its pin straight out
	case (o[0] != 0 && o[0] != net) || (o[1] != 0 && o[1] != net):
		dirs = 1 << d // a crossing goes straight over
	default:
		dirs = 0xf &^ (1 << (d ^ 2)) // never back
	}
	if x == k.win.x0 {
		dirs &^= 1 << geom.Left
	}
	if x == k.win.x1 {
		dirs &^= 1 << geom.Right
	}
	if y == k.win.y0 {
		dirs &^= 1 << geom.Up
	}
	if y == k.win.y1 {
		dirs &^= 1 << geom.Down
	}
	ended := int8(-1) // what lies in line ahead of the run ending at c (looked up once)
	for ; dirs != 0; dirs &= dirs - 1 {
		nd := bits.TrailingZeros8(dirs) & 3
		ns := s0 + k.stateAt[nd] + nd
		nsi := &st[ns]
		least := g + stepCost // the step costs at least this much
		if nd != d {
			least += bendCost
		}
		seen := nsi.stamp>>2 == gen
		if seen && nsi.g <= least {
			continue // reached as cheaply already, whatever this step costs
		}
		if nd != d && c != k.pinCell {
			// the run ending here in line with another net's wire
			// across a short gap, and the run starting here with its
			// back to one
			if ended < 0 {
				ended = k.ahead(x, y, d, k.reach)
			}
			least += k.lines[ended]
			if k.ahead(x, y, nd^2, closeReach) == inLineClose {
				least += k.lines[inLineClose]
			}
		}
		nx, ny := x+dirStep[nd][0], y+dirStep[nd][1]
		extra, ok := k.stepExtra(c, c+k.cellAt[nd], nx, ny, nd)
		if !ok {
			continue
		}
		cost := least + extra
		if seen && nsi.g <= cost {
			continue
		}
		*nsi = stateInfo{stamp: gen<<2 | uint32(d), g: cost}
		k.q.push(cost+k.to.estimate(nx, ny), int32(ns))
	}
}

// stepExtra is what the step from c into its neighbour n (at nx, ny) in
// direction nd costs beyond a plain step and bend, or false where the wire
// may not go. It is the search's innermost work, so the grid's tests
// (crowded, cutsFrame) are written out here on the record already loaded.
func (k *seek) stepExtra(c, n, nx, ny, nd int) (int32, bool) {
	grid, net := k.grid, k.net
	g := &grid[n]
	extra := int32(0)
	if g.own[0] == net || g.own[1] == net {
		// joining the tree: the arm must be free, no other net may be
		// there, and the cell must end with at most three arms (a T, never
		// a four-way junction)
		if g.own[1] != 0 || g.arm[0]&(1<<(nd^2)) != 0 || bits.OnesCount8(g.arm[0]) >= 3 {
			return 0, false
		}
		if bits.OnesCount8(g.arm[0]) == 2 && k.crossingBeside(n, nx, ny) {
			extra += k.dot // a new junction beside a crossing
		}
		if g.arm[0]&(1<<nd) == 0 && k.ahead(nx, ny, nd, closeReach) == inLineClose {
			extra += k.lines[inLineClose] // the wire's last run points on at another net's end
		}
	} else {
		if g.flags&(fBlocked|fPin) != 0 || (g.resv != 0 && g.resv != net) {
			return 0, false
		}
		if g.own[0] != 0 {
			// over another net's straight wire, at right angles, only
			if g.own[1] != 0 || g.arm[0] != alongArms[(nd+1)&3] {
				return 0, false
			}
			extra += k.cross
			if k.sib != nil && k.sib[g.own[0]] {
				extra += siblingCost
			}
			if k.junctionBeside(n, nx, ny) {
				extra += k.dot
			} else if k.shy && k.tipNear(nx, ny) {
				extra += shyCost
			}
		}
		if g.flags&fNearPin != 0 && k.foreignTipBeside(nx, ny) {
			extra += tipCost
		}
	}
	// crowded: along a frame edge, or beside another net's wire running the
	// same way (fHugV and fCutS follow fHugH and fCutE)
	axis := nd & 1
	near := g.flags&(fHugH<<axis) != 0
	if !near {
		side, lo, hi := k.w, ny > 0, ny < k.h-1
		if axis == 1 {
			side, lo, hi = 1, nx > 0, nx < k.w-1
		}
		along := alongArms[nd]
		near = (lo && grid[n-side].runsAlong(along, net)) || (hi && grid[n+side].runsAlong(along, net))
	}
	if near {
		extra += nearCost
	}
	// cutsFrame: a frame edge is marked on the cell west or north of it
	at := g
	if nd == int(geom.Right) || nd == int(geom.Down) {
		at = &grid[c]
	}
	if at.flags&(fCutE<<axis) != 0 {
		extra += edgeCost
	}
	if k.foreign(g) {
		extra += foreignCost
	}
	extra += k.alongStep(n, nd)
	return extra, true
}

// foreign says whether the cell lies inside a stage frame holding none of
// the net's pins.
func (k *seek) foreign(g *gridCell) bool {
	fr := g.flags >> frameShift
	return fr != 0 && k.home&(1<<(fr-1)) == 0
}

// What lies in line beyond the end of a run, as ahead finds it.
var lineCosts = [3]int32{0, inLineCost, closeCost}

const (
	inLineClear = iota
	inLineFar   // another net's wire running the same way, inLineReach steps on
	inLineClose // another net's wire, terminal or stub, closeReach steps on or less
)

// ahead says what lies in line beyond point (x, y) in direction d, up to
// reach steps on, with no symbol between: within closeReach steps another
// net's wire running along d's axis, pin tip or local symbol's stub is
// close; further, such a wire is far. (A wire across the line within
// closeReach was priced too, as a T the run seems to make into it: the
// detours that drew crossed the wires of a planar mixer stage.)
func (k *seek) ahead(x, y, d, reach int) int8 {
	along, net := alongArms[d], k.net
	dx, dy := dirStep[d][0], dirStep[d][1]
	for i := 1; i <= reach; i++ {
		x, y = x+dx, y+dy
		if x < 0 || y < 0 || x >= k.w || y >= k.h {
			return inLineClear
		}
		g := &k.grid[y*k.w+x]
		if g.own[0] == net || g.own[1] == net {
			return inLineClear
		}
		if i <= closeReach && (g.flags&fStub != 0 || g.runsAlong(along, net) || (g.flags&fPin != 0 && g.resv != net)) {
			return inLineClose
		}
		if g.flags&fBlocked != 0 {
			return inLineClear
		}
		if g.runsAlong(along, net) {
			return inLineFar
		}
	}
	return inLineClear
}

// path lists the cells from the pin (state start) to state s, both
// numbered in the search's window.
func (rt *router) path(k *seek, s, start int) []int {
	cell := func(s int) int {
		lc := s >> 2
		return (lc>>k.shift+k.win.y0)*rt.w + lc&(1<<k.shift-1) + k.win.x0
	}
	var out []int
	for s != start {
		d := s & 3
		out = append(out, cell(s))
		prev := s>>2 - dirStep[d][0] - dirStep[d][1]<<k.shift
		s = prev*4 + int(rt.sc.st[s].stamp&3)
	}
	out = append(out, cell(start))
	for i, j := 0, len(out)-1; i < j; i, j = i+1, j-1 {
		out[i], out[j] = out[j], out[i]
	}
	return out
}

// around calls f on the grid indices of the up to eight points round n (at
// nx, ny) until it returns true.
func (k *seek) around(n, nx, ny int, f func(g *gridCell) bool) bool {
	for dy := -1; dy <= 1; dy++ {
		if ny+dy < 0 || ny+dy >= k.h {
			continue
		}
		for dx := -1; dx <= 1; dx++ {
			if (dx != 0 || dy != 0) && nx+dx >= 0 && nx+dx < k.w && f(&k.grid[n+dy*k.w+dx]) {
				return true
			}
		}
	}
	return false
}

// junctionBeside says whether a crossing at n would stand beside a
// junction: another net's point with three arms, or any point of the
// wire's own net (the tree it joins, where a new junction may come).
func (k *seek) junctionBeside(n, nx, ny int) bool {
	net := k.net
	return k.around(n, nx, ny, func(g *gridCell) bool {
		return g.own[0] == net || g.own[1] == net ||
			(g.own[0] != 0 && bits.OnesCount8(g.arm[0]) >= 3) || (g.own[1] != 0 && bits.OnesCount8(g.arm[1]) >= 3)
	})
}

// crossingBeside says whether a point beside n holds a crossing.
func (k *seek) crossingBeside(n, nx, ny int) bool {
	return k.around(n, nx, ny, func(g *gridCell) bool { return g.own[1] != 0 })
}

// foreignTipBeside says whether a pin tip of another net is a step from
// point nx, ny.
func (k *seek) foreignTipBeside(nx, ny int) bool {
	for _, st := range dirStep {
		x, y := nx+st[0], ny+st[1]
		if x < 0 || y < 0 || x >= k.w || y >= k.h {
			continue
		}
		if g := &k.grid[y*k.w+x]; g.flags&fPin != 0 && g.resv != k.net {
			return true
		}
	}
	return false
}

// tipNear says whether a pin tip lies within leadClear steps of point nx,
// ny: a crossing there reads as a joint at the lead if the pin is on either
// crossing net (render/check's crossings near a pin). Any net's tip counts,
// as the memo's key tells only the search's own net from the others.
func (k *seek) tipNear(nx, ny int) bool {
	for _, st := range leadReach {
		x, y := nx+st[0], ny+st[1]
		if x >= 0 && y >= 0 && x < k.w && y < k.h && k.grid[y*k.w+x].flags&fPin != 0 {
			return true
		}
	}
	return false
}
