package layout

import (
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

// search is A* from a pending pin to the net's tree, inside a window of the
// grid. It returns the cells from the pin to the joining cell, or nil.
func (rt *router) search(net int32, p wirePin, tree geom.Rect, win window) []int {
	sc := rt.sc
	sc.next(4 * len(rt.g))
	to := aim{int(tree.X0) - rt.x0, int(tree.Y0) - rt.y0, int(tree.X1) - rt.x0, int(tree.Y1) - rt.y0}
	pdir := int(p.pin.Dir)
	start := int32(p.cell*4 + pdir)
	sc.st[start] = stateInfo{stamp: sc.gen << 2, g: 0}
	sc.q.push(to.estimate(p.cell%rt.w, p.cell/rt.w), start)
	for sc.q.len() > 0 {
		f, s := sc.q.pop()
		rt.pops++
		c, d := int(s)/4, int(s)%4
		g := sc.st[s].g
		x, y := c%rt.w, c/rt.w
		if f != g+to.estimate(x, y) {
			continue // stale entry: the state was reached more cheaply since
		}
		if c != p.cell && rt.owns(c, net) {
			return rt.path(int(s), int(start))
		}
		rt.expand(net, p.cell, c, x, y, d, g, to, win)
	}
	return nil
}

// expand pushes the states one step on from point c (at x, y), reached at
// cost g moving in direction d.
func (rt *router) expand(net int32, pinCell, c, x, y, d int, g int32, to aim, win window) {
	sc := rt.sc
	atPin := c == pinCell
	straightOnly := !atPin && rt.foreign(c, net)
	for nd := 0; nd < 4; nd++ {
		switch {
		case atPin:
			if nd != d {
				continue // a wire leaves its pin straight out
			}
		case nd == opposite(d):
			continue
		case straightOnly && nd != d:
			continue // a crossing goes straight over
		}
		nx, ny := x+dirStep[nd][0], y+dirStep[nd][1]
		if nx < win.x0 || nx > win.x1 || ny < win.y0 || ny > win.y1 {
			continue
		}
		n := ny*rt.w + nx
		ns := int32(n*4 + nd)
		nsi := &sc.st[ns]
		least := g + stepCost // the step costs at least this much
		if nd != d {
			least += bendCost
		}
		if nsi.stamp>>2 == sc.gen && nsi.g <= least {
			continue // reached as cheaply already, whatever this step costs
		}
		cost, ok := rt.stepCost(net, c, n, nx, ny, d, nd)
		if !ok {
			continue
		}
		cost += g
		if nsi.stamp>>2 == sc.gen && nsi.g <= cost {
			continue
		}
		*nsi = stateInfo{stamp: sc.gen<<2 | uint32(d), g: cost}
		sc.q.push(cost+to.estimate(nx, ny), ns)
	}
}

// stepCost is the cost of the step from c into its neighbour n (at nx, ny)
// in direction nd after arriving in direction d, or false where the wire
// may not go.
func (rt *router) stepCost(net int32, c, n, nx, ny, d, nd int) (int32, bool) {
	cost := int32(stepCost)
	if nd != d {
		cost += bendCost
	}
	g := &rt.g[n]
	if g.own[0] == net || g.own[1] == net {
		if !rt.joinable(n, net, nd) {
			return 0, false
		}
	} else {
		if g.flags&(fBlocked|fPin) != 0 || (g.resv != 0 && g.resv != net) {
			return 0, false
		}
		if g.own[0] != 0 {
			// over another net's straight wire, at right angles, only
			if g.own[1] != 0 || g.arm[0] != alongArms[(nd+1)%4] {
				return 0, false
			}
			if rt.wide {
				cost += wideCrossCost
			} else {
				cost += crossCost
			}
		}
	}
	if rt.crowded(n, nx, ny, nd, net) {
		cost += nearCost
	}
	if rt.cutsFrame(c, n, nd) {
		cost += edgeCost
	}
	return cost, true
}

// path lists the cells from the pin (state start) to state s.
func (rt *router) path(s, start int) []int {
	var out []int
	for s != start {
		c, d := s/4, s%4
		out = append(out, c)
		prev := c - dirStep[d][0] - dirStep[d][1]*rt.w
		s = prev*4 + int(rt.sc.st[s].stamp&3)
	}
	out = append(out, start/4)
	for i, j := 0, len(out)-1; i < j; i, j = i+1, j-1 {
		out[i], out[j] = out[j], out[i]
	}
	return out
}
