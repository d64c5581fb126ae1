package layout

import (
	"container/heap"
	"math/rand"
	"sort"
	"testing"

	"pare/graph"
	"pare/render/check"
	"pare/render/geom"
	"pare/render/symbol"
)

// box is a hand-placed symbol for the router tests: a body and its pins,
// each pin on a net (a box without pins is an obstacle).
type box struct {
	ref  string
	r    geom.Rect
	pins []geom.Pin
}

// pinAt is a pin at (x, y) on net, its lead pointing d.
func pinAt(net string, x, y float64, d geom.Dir) geom.Pin {
	return geom.Pin{Name: net, Net: net, At: geom.Pt{X: x, Y: y}, Dir: d}
}

// handSheet places boxes exactly where given, as the router finds them after
// placement: no locals, no labels, no frames.
func handSheet(boxes ...box) *state {
	ly := &state{c: &graph.Circuit{}, crossing: map[string]bool{}}
	for _, b := range boxes {
		p := &graph.Part{Ref: b.ref, Kind: graph.Generic}
		for _, pn := range b.pins {
			p.Pins = append(p.Pins, graph.Pin{Name: pn.Name, Net: pn.Net})
		}
		ly.cells = append(ly.cells, &cell{part: p, ref: b.ref, shape: symbol.Shape{Box: b.r, Pins: b.pins}})
	}
	return ly
}

// routed wires a hand-made sheet (the whole router, or only the first
// wiring of every net when full is false) and returns its geometry.
func routeSheet(ly *state, full bool) (*geom.Sheet, *router) {
	rt := newRouter(ly, &scratch{})
	rt.routeNets()
	if full {
		rt.finish(true)
	}
	g := &geom.Sheet{}
	for _, cl := range ly.cells {
		g.Symbols = append(g.Symbols, geom.Symbol{Ref: cl.ref, Box: cl.shape.Box, Pins: cl.shape.Pins})
	}
	rt.emit(g)
	return g, rt
}

// wireStats are a net's wire length in grid steps and its bends.
func wireStats(g *geom.Sheet, net string) (length float64, bends int) {
	for _, w := range g.Wires {
		if w.Net != net {
			continue
		}
		for _, s := range w.Segs {
			length += s.Box().W() + s.Box().H()
		}
		return length, check.Measure(&geom.Sheet{Wires: []geom.Wire{w}}).Bends
	}
	return -1, -1
}

// TestRoutes wires small hand-made sheets and checks what the wiring must
// be, measured by the sheet checker (package check).
func TestRoutes(t *testing.T) {
	// two parts whose pins face each other on one grid line, 8 steps apart
	facing := []box{
		{"A1", geom.R(0, -1, 2, 1), []geom.Pin{pinAt("a", 2, 0, geom.Right)}},
		{"B1", geom.R(10, -1, 12, 1), []geom.Pin{pinAt("a", 10, 0, geom.Left)}},
	}
	// net a along row 0 between two parts; net b from (12,-10) down to
	// (12,10), straight across a's wire
	across := func(aLeft, aRight float64) []box {
		return []box{
			{"A1", geom.R(aLeft-2, -1, aLeft, 1), []geom.Pin{pinAt("a", aLeft, 0, geom.Right)}},
			{"A2", geom.R(aRight, -1, aRight+2, 1), []geom.Pin{pinAt("a", aRight, 0, geom.Left)}},
			{"B1", geom.R(11, -12, 13, -10), []geom.Pin{pinAt("b", 12, -10, geom.Down)}},
			{"B2", geom.R(11, 10, 13, 12), []geom.Pin{pinAt("b", 12, 10, geom.Up)}},
		}
	}
	for _, tc := range []struct {
		name      string
		boxes     []box
		net       string
		length    float64 // -1: not checked
		bends     int
		crossings int
	}{
		// the shortest wire between facing pins is the straight line:
		// Manhattan distance, no bend (geometry)
		{"facing", facing, "a", 8, 0, 0},
		// pins at right angles: an L, one bend, Manhattan length 8 + 5
		// (geometry)
		{"corner", []box{facing[0],
			{"B1", geom.R(9, 5, 11, 7), []geom.Pin{pinAt("a", 10, 5, geom.Up)}}}, "a", 13, 1, 0},
		// a body on the straight line: out and back in along the same line
		// needs four bends; the box covers rows -2..2, so the detour runs
		// on row 3 or -3: 12 + 2·3 steps (geometry)
		{"round a body", []box{
			{"A1", geom.R(0, -1, 2, 1), []geom.Pin{pinAt("a", 2, 0, geom.Right)}},
			{"X1", geom.R(6, -2, 9, 2), nil},
			{"B1", geom.R(14, -1, 16, 1), []geom.Pin{pinAt("a", 14, 0, geom.Left)}},
		}, "a", 18, 4, 0},
		// a long wire across b's way: going round it costs far more than
		// crossCost (30 steps), so b crosses, straight (derived from the
		// cost table in grid.go)
		{"cross a long wire", across(-8, 32), "b", 20, 0, 1},
		// a short wire between two parts: b goes round the parts, 10 steps
		// and 4 bends (22 < crossCost), rather than cross (derived from the
		// cost table); the first wiring crossed (b, the longer net, went
		// first), rip-up and reroute removed the crossing; it passes the
		// parts' far ends a step wider than their boxes (a one-pin part
		// keeps the point beyond its tip free, grid.go blockTip): 32
		{"round a short wire", across(10, 14), "b", 32, 4, 0},
	} {
		t.Run(tc.name, func(t *testing.T) {
			g, _ := routeSheet(handSheet(tc.boxes...), true)
			r := check.Measure(g)
			for _, p := range r.Problems() {
				t.Error(p)
			}
			length, bends := wireStats(g, tc.net)
			if tc.length >= 0 && length != tc.length {
				t.Errorf("net %s: wire %g steps long, want %g", tc.net, length, tc.length)
			}
			if bends != tc.bends {
				t.Errorf("net %s: %d bends, want %d", tc.net, bends, tc.bends)
			}
			if r.Crossings != tc.crossings {
				t.Errorf("%d crossings, want %d", r.Crossings, tc.crossings)
			}
		})
	}
}

// TestCrossOrGoRound: with net a wired first, net b crosses a's wire where
// going round the wire's two parts would cost more than a crossing, and
// goes round where it costs less (derived from the cost table in grid.go:
// a crossing costs crossCost, 30 steps; round the short wire is 10 steps
// and 4 bends of bendCost, 22).
func TestCrossOrGoRound(t *testing.T) {
	for _, tc := range []struct {
		name          string
		aLeft, aRight float64
		crossings     int
		bends         int
	}{
		{"long wire", -8, 32, 1, 0},
		{"short wire", 10, 14, 0, 4},
	} {
		ly := handSheet(
			box{"A1", geom.R(tc.aLeft-2, -1, tc.aLeft, 1), []geom.Pin{pinAt("a", tc.aLeft, 0, geom.Right)}},
			box{"A2", geom.R(tc.aRight, -1, tc.aRight+2, 1), []geom.Pin{pinAt("a", tc.aRight, 0, geom.Left)}},
			box{"B1", geom.R(11, -12, 13, -10), []geom.Pin{pinAt("b", 12, -10, geom.Down)}},
			box{"B2", geom.R(11, 10, 13, 12), []geom.Pin{pinAt("b", 12, 10, geom.Up)}},
		)
		rt := newRouter(ly, &scratch{})
		if !rt.routeNet(0) || !rt.routeNet(1) { // nets in name order: a, b
			t.Fatalf("%s: a net could not be wired", tc.name)
		}
		g := &geom.Sheet{}
		rt.emit(g)
		r := check.Measure(g)
		_, bends := wireStats(g, "b")
		if r.Crossings != tc.crossings || bends != tc.bends {
			t.Errorf("%s: b has %d bends and %d crossings, want %d and %d", tc.name, bends, r.Crossings, tc.bends, tc.crossings)
		}
	}
}

// TestRipUpRemovesACrossing: on the sheet of "round a short wire" the first
// wiring has one crossing (the long net b goes first and straight, the
// short net a must cross it); rip-up and reroute takes it away, and both
// nets stay wired.
func TestRipUpRemovesACrossing(t *testing.T) {
	boxes := []box{
		{"A1", geom.R(8, -1, 10, 1), []geom.Pin{pinAt("a", 10, 0, geom.Right)}},
		{"A2", geom.R(14, -1, 16, 1), []geom.Pin{pinAt("a", 14, 0, geom.Left)}},
		{"B1", geom.R(11, -12, 13, -10), []geom.Pin{pinAt("b", 12, -10, geom.Down)}},
		{"B2", geom.R(11, 10, 13, 12), []geom.Pin{pinAt("b", 12, 10, geom.Up)}},
	}
	first, _ := routeSheet(handSheet(boxes...), false)
	if n := check.Measure(first).Crossings; n != 1 {
		t.Fatalf("first wiring: %d crossings, want 1", n)
	}
	final, _ := routeSheet(handSheet(boxes...), true)
	r := check.Measure(final)
	if r.Crossings != 0 || len(r.Connectivity) > 0 || r.Flagged > 0 {
		t.Errorf("after rip-up: %s", r.Summary())
	}
}

// TestUnroutableNetIsFlagged: a pin whose way out is closed by another body
// cannot be wired; its net is drawn as a net-name flag at each pin (common
// practice for joining distant points) and reported as failed.
func TestUnroutableNetIsFlagged(t *testing.T) {
	ly := handSheet(
		box{"A1", geom.R(0, -1, 2, 1), []geom.Pin{pinAt("a", 2, 0, geom.Right)}},
		box{"X1", geom.R(3, -3, 6, 3), nil},
		box{"B1", geom.R(20, -1, 22, 1), []geom.Pin{pinAt("a", 20, 0, geom.Left)}},
	)
	g, _ := routeSheet(ly, true)
	if len(g.Failed) != 1 || g.Failed[0] != "a" {
		t.Errorf("failed nets %v, want [a]", g.Failed)
	}
	if len(g.Wires) != 0 {
		t.Errorf("%d wires drawn for a net that cannot be wired", len(g.Wires))
	}
	flags := 0
	for _, l := range g.Locals {
		if l.Kind == geom.LocalFlag && l.Net == "a" {
			flags++
		}
	}
	if flags != 2 {
		t.Errorf("%d flags, want one at each of the 2 pins", flags)
	}
}

// TestJunctionsAreTees: a net of three pins meets in one T with one dot, and
// never in a four-way junction (common practice: a dot at every T, no
// four-way junctions).
func TestJunctionsAreTees(t *testing.T) {
	g, _ := routeSheet(handSheet(
		box{"A1", geom.R(0, -1, 2, 1), []geom.Pin{pinAt("a", 2, 0, geom.Right)}},
		box{"B1", geom.R(20, -1, 22, 1), []geom.Pin{pinAt("a", 20, 0, geom.Left)}},
		box{"C1", geom.R(10, 8, 12, 10), []geom.Pin{pinAt("a", 11, 8, geom.Up)}},
	), true)
	r := check.Measure(g)
	for _, p := range r.Problems() {
		t.Error(p)
	}
	if len(g.Dots) != 1 {
		t.Errorf("%d dots, want 1 (three pins joined at one T)", len(g.Dots))
	}
}

// TestSearchFindsTheCheapestWire compares the A* search with Dijkstra's
// algorithm (Dijkstra 1959) over the same states and step costs, written out
// plainly here, on random grids with random bodies and other nets' wires:
// the search must find a wire exactly as cheap.
func TestSearchFindsTheCheapestWire(t *testing.T) {
	rng := rand.New(rand.NewSource(1))
	for trial := 0; trial < 60; trial++ {
		var boxes []box
		boxes = append(boxes,
			box{"A1", geom.R(0, 0, 2, 2), []geom.Pin{pinAt("a", 2, 1, geom.Right)}},
			box{"B1", geom.R(24, 14, 26, 16), []geom.Pin{pinAt("a", 24, 15, geom.Left)}})
		for k := 0; k < 6; k++ {
			x, y := float64(4+rng.Intn(16)), float64(-2+rng.Intn(18))
			boxes = append(boxes, box{"X" + string(rune('1'+k)), geom.R(x, y, x+float64(1+rng.Intn(3)), y+float64(1+rng.Intn(3))), nil})
		}
		ly := handSheet(boxes...)
		rt := newRouter(ly, &scratch{})
		// another net's wires: straight runs and corners to cross or avoid
		other := int32(len(rt.nets) + 1)
		for k := 0; k < 5; k++ {
			rt.layWire(other, rng)
		}
		nr := rt.nets[0]
		from, to := nr.pins[1], nr.pins[0]
		rt.addArm(to.cell, 1, 1<<opposite(int(to.pin.Dir)))
		nr.cells = []int{to.cell}
		tree := rt.cellRect(to.cell)
		win := rt.window(tree, from, 1<<20)
		want := rt.dijkstra(1, from, win)
		path := rt.search(1, from, tree, win)
		if want < 0 {
			if path != nil {
				t.Errorf("trial %d: search found a wire where there is none", trial)
			}
			continue
		}
		if got := rt.pathCost(1, from, path); got != want {
			t.Errorf("trial %d: search found a wire of cost %d, the cheapest costs %d", trial, got, want)
		}
	}
}

// layWire lays a random wire of net id: a straight run with a bend at its
// end, on free cells only.
func (rt *router) layWire(id int32, rng *rand.Rand) {
	x, y := 3+rng.Intn(rt.w-6), 3+rng.Intn(rt.h-6)
	d := rng.Intn(4)
	n := 3 + rng.Intn(6)
	c := y*rt.w + x
	if g := rt.g[c]; g.flags&(fBlocked|fPin) != 0 || g.resv != 0 || g.own[0] != 0 {
		return
	}
	for k := 0; k < n; k++ {
		m := rt.neighbour(c, d)
		if m < 0 || rt.g[m].flags&(fBlocked|fPin) != 0 || rt.g[m].resv != 0 || rt.g[m].own[0] != 0 || rt.g[c].own[0] != 0 && !rt.owns(c, id) {
			return
		}
		rt.addArm(c, id, 1<<d)
		rt.addArm(m, id, 1<<opposite(d))
		c = m
		if k == n-2 {
			d = (d + 1) % 4
		}
	}
}

// dijkstra is the cost of the cheapest wire from pin p to the net's tree
// inside the window, or -1: the same moves and step costs as the search,
// without its estimate, queue or bookkeeping.
func (rt *router) dijkstra(net int32, p wirePin, win window) int32 {
	dist := map[int]int32{}
	done := map[int]bool{}
	start := p.cell*4 + int(p.pin.Dir)
	dist[start] = 0
	open := &costHeap{{start, 0}}
	for open.Len() > 0 {
		it := heap.Pop(open).(costItem)
		if done[it.s] {
			continue
		}
		done[it.s] = true
		c, d := it.s/4, it.s%4
		if c != p.cell && rt.owns(c, net) {
			return it.g
		}
		for nd := 0; nd < 4; nd++ {
			if (c == p.cell && nd != d) || (c != p.cell && (nd == opposite(d) || (rt.foreign(c, net) && nd != d))) {
				continue
			}
			n := rt.neighbour(c, nd)
			if n < 0 || n%rt.w < win.x0 || n%rt.w > win.x1 || n/rt.w < win.y0 || n/rt.w > win.y1 {
				continue
			}
			cost, ok := rt.stepCost(net, c, n, n%rt.w, n/rt.w, d, nd)
			ns := n*4 + nd
			if old, seen := dist[ns]; ok && (!seen || it.g+cost < old) {
				dist[ns] = it.g + cost
				heap.Push(open, costItem{ns, it.g + cost})
			}
		}
	}
	return -1
}

type costItem struct {
	s int
	g int32
}

type costHeap []costItem

func (h costHeap) Len() int           { return len(h) }
func (h costHeap) Less(i, j int) bool { return h[i].g < h[j].g }
func (h costHeap) Swap(i, j int)      { h[i], h[j] = h[j], h[i] }
func (h *costHeap) Push(x any)        { *h = append(*h, x.(costItem)) }
func (h *costHeap) Pop() any {
	old := *h
	it := old[len(old)-1]
	*h = old[:len(old)-1]
	return it
}

// pathCost adds up the step costs along a path found by the search.
func (rt *router) pathCost(net int32, p wirePin, path []int) int32 {
	total := int32(0)
	d := int(p.pin.Dir)
	for k := 0; k+1 < len(path); k++ {
		nd := rt.dirBetween(path[k], path[k+1])
		n := path[k+1]
		cost, ok := rt.stepCost(net, path[k], n, n%rt.w, n/rt.w, d, nd)
		if !ok {
			return -1
		}
		total += cost
		d = nd
	}
	return total
}

// TestQueueOrder: states come off the queue by estimated cost, then by
// state number, whatever order they went in (the order the search's
// choice among equally cheap wires rests on).
func TestQueueOrder(t *testing.T) {
	rng := rand.New(rand.NewSource(2))
	var q stateQueue
	// the shapes of bucket the sort takes different ways: a few states
	// each, many close together (a bitmap, with and without repeats), and
	// many spread thinly
	for round, tc := range []struct {
		items, costs, states int
		distinct             bool
	}{
		{500, 40, 10000, false}, {500, 40, 10000, false}, {500, 40, 10000, false},
		{3000, 3, 4000, true}, {3000, 3, 4000, false}, {2000, 2, 1 << 24, false},
	} {
		q.reset()
		type item struct{ f, s int32 }
		var in []item
		perm := rng.Perm(tc.states)
		for k := 0; k < tc.items; k++ {
			it := item{int32(rng.Intn(tc.costs)), int32(rng.Intn(tc.states))}
			if tc.distinct {
				it.s = int32(perm[k])
			}
			in = append(in, it)
			q.push(it.f, it.s)
		}
		sort.Slice(in, func(i, j int) bool {
			if in[i].f != in[j].f {
				return in[i].f < in[j].f
			}
			return in[i].s < in[j].s
		})
		for k, want := range in {
			f, s := q.pop()
			if f != want.f || s != want.s {
				t.Fatalf("round %d pop %d: (%d, %d), want (%d, %d)", round, k, f, s, want.f, want.s)
			}
		}
		if q.len() != 0 {
			t.Errorf("%d left in the queue", q.len())
		}
	}
}

// stepCost is the whole cost of a step as the search adds it up: a plain
// step, a bend where the direction changes (more where the run it ends
// stops, or the run it starts begins, in line with another net's wire),
// and the step's extras.
func (rt *router) stepCost(net int32, c, n, nx, ny, d, nd int) (int32, bool) {
	k := &seek{net: net, sib: rt.siblingMask(net)}
	k.onGrid(rt)
	extra, ok := k.stepExtra(c, n, nx, ny, nd)
	cost := stepCost + extra
	if nd != d {
		cost += bendCost
		cost += k.lines[k.ahead(c%rt.w, c/rt.w, d, inLineReach)]
		if k.ahead(c%rt.w, c/rt.w, nd^2, closeReach) == inLineClose {
			cost += k.lines[inLineClose]
		}
	}
	return cost, ok
}

// TestWiredPinBetweenRailTags: a wired pin between two neighbours on the
// same side that end at rail tags (a valve's signal grid between two screen
// grids on the HT, pins one grid step apart) keeps its line out between the
// tags: a tag's bar and text stand ±0.6 about their own pin's line and must
// not close the next line, or the net cannot be wired and is flagged.
func TestWiredPinBetweenRailTags(t *testing.T) {
	ht := &graph.Net{Name: "ht", Role: graph.Supply}
	ly := handSheet(
		box{"V1", geom.R(0, -2, 2, 2), []geom.Pin{pinAt("ht", 2, -1, geom.Right), pinAt("g", 2, 0, geom.Right), pinAt("ht", 2, 1, geom.Right)}},
		box{"B1", geom.R(20, -1, 22, 1), []geom.Pin{pinAt("g", 20, 0, geom.Left)}},
	)
	v1 := ly.cells[0]
	for _, p := range []geom.Pin{v1.shape.Pins[0], v1.shape.Pins[2]} {
		l := localCandidates(p, ht, graph.Supply, 1)[0]
		l.Owner = "V1"
		v1.locals = append(v1.locals, l)
	}
	v1.shape.Pins = v1.shape.Pins[1:2] // the tagged pins are not wired
	g, _ := routeSheet(ly, true)
	if len(g.Failed) != 0 || len(g.Wires) != 1 {
		t.Errorf("failed nets %v, %d wires: the grid's net must be wired between the tags", g.Failed, len(g.Wires))
	}
}
