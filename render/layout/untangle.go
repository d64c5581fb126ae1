package layout

import (
	"fmt"
	"strconv"
	"strings"

	"pare/graph"
	"pare/render/geom"
)

// Layout places and routes the circuit.
func Layout(c *graph.Circuit, o Options) (*Result, error) {
	if c == nil {
		return nil, fmt.Errorf("layout: no circuit")
	}
	u := &untangler{c: c, o: o, seen: map[string]*wiring{}}
	best := u.layout(nil, false)
	if best.crossings > 0 && o.Untangle && len(best.ly.cells) <= maxRetryCells {
		best = u.untangle(best)
	}
	return assemble(best.ly, best.w), nil
}

// untangle looks for a layout with fewer crossings than the plain one.
func (u *untangler) untangle(plain *routed) *routed {
	// Crossings left after rerouting come from the placement. The layout
	// with every part lined up along its nets (rather than the signal path
	// on one line) is the first thing to try: when it has no crossing it
	// is taken as it is.
	lined := u.layout(nil, true)
	if lined.crossings == 0 {
		return lined
	}
	best := plain
	for _, free := range []bool{false, true} {
		if cur := u.search(free); cur.crossings < best.crossings {
			best = cur
		}
		if best.crossings == 0 {
			return best
		}
	}
	// Last, the better of the two plain placements with its nets wired in
	// the other order, shortest first: on a sheet crowded with long nets
	// that often leaves far fewer crossings (a short net has few ways to
	// go, a long one can go round).
	u.shortFirst = true
	if r := u.layout(nil, lined.crossings < plain.crossings); r.crossings < best.crossings {
		best = r
	}
	return best
}

// Bounds of the orientation search: small sheets only, a few dozen tries.
const (
	maxRetryCells = 300
	maxRetries    = 80
	// maxPairTries bounds the two-change search: a few dozen layouts of a
	// small reduced sheet.
	maxPairTries = 40
	// untangleBudget bounds the work of the search for single and paired
	// changes, in states the router takes off its queue from the first
	// layout on: a couple of layouts of a sheet crowded with long nets,
	// dozens of a sheet of a few stages.
	untangleBudget = 450000
)

// Keys of the search's turns map besides a ref (an index into the part's
// orientations).
const (
	sinkKey  = "sink:"  // the part moved to the bottom of its column
	shiftKey = "shift:" // the part moved one layer left (-1) or right (+1)
)

// routed is a placement, its wiring and the wiring's number of crossings.
type routed struct {
	ly        *state
	w         *wiring
	crossings int
}

// untangler is the search for a placement with fewer crossings: a bounded
// greedy local search over the orientations of the parts on crossing nets,
// moving a part down its column or one layer over, and pairs of such
// changes. Many changes give the same placement (a resistor turned half
// round has the same pins in the same places), and the same placement
// always routes the same way, so each placement is routed once.
type untangler struct {
	c     *graph.Circuit
	o     Options
	seen  map[string]*wiring // by placement key
	tried int                // single changes tried, both passes together
	// shortFirst routes the nets shortest first
	shortFirst bool
	sc         scratch
	pops       int
}

// layout places the circuit with the given changes and routes it, unless
// the same placement was routed before.
func (u *untangler) layout(turns map[string]int, free bool) *routed {
	ly := place(u.c, u.o, turns, free)
	ly.shortFirst = u.shortFirst
	key := ly.key()
	w, ok := u.seen[key]
	if !ok {
		w = route(ly, true, &u.sc)
		u.pops += w.pops
		u.seen[key] = w
	}
	ly.crossing = w.crossing
	return &routed{ly: ly, w: w, crossings: w.crossings}
}

// search runs the greedy local search from the plain layout (signal path on
// one line, or every part lined up along its nets when free) and returns
// the best layout it found.
func (u *untangler) search(free bool) *routed {
	turns := map[string]int{}
	cur := u.layout(nil, free)
	try := func(trial map[string]int) {
		if u.pops > untangleBudget {
			return // deterministic work bound: the same input stops at the same place
		}
		if r := u.layout(trial, free); r.crossings < cur.crossings {
			cur, turns = r, trial
		}
	}
	for pass := 0; pass < 2 && cur.crossings > 0; pass++ {
		for _, cl := range cur.ly.cells {
			if !cur.ly.crossing[cl.ref] || cur.crossings == 0 {
				continue
			}
			n := len(cl.turns)
			for t := 0; t <= n+2 && u.tried < maxRetries && cur.crossings > 0; t++ {
				if t == cl.turn && t < n {
					continue
				}
				u.tried++
				trial := copyTurns(turns)
				switch {
				case t == n:
					trial[sinkKey+cl.ref] = 1
				case t > n:
					trial[shiftKey+cl.ref] = 2*(t-n) - 3 // one layer left, then right
				default:
					trial[cl.ref] = t
				}
				try(trial)
			}
		}
	}
	if free {
		return cur // pairs once is enough: on the signal-line layout
	}
	// a crossing no single change removes may yield to two: a part on a
	// crossing net turned (a transformer mirrored) together with a part it
	// is wired to moved to the bottom of its column
	pairs := 0
	for _, a := range cur.ly.cells {
		if cur.crossings == 0 || pairs >= maxPairTries {
			break
		}
		if !cur.ly.crossing[a.ref] || len(a.turns) < 2 {
			continue
		}
		for t := range a.turns {
			if t == a.turn {
				continue
			}
			for _, b := range cur.ly.cells {
				if b == a || b.edge != 0 || pairs >= maxPairTries || cur.crossings == 0 || !shareNet(cur.ly, a, b) {
					continue
				}
				pairs++
				trial := copyTurns(turns)
				trial[a.ref] = t
				trial[sinkKey+b.ref] = 1
				try(trial)
			}
		}
	}
	return cur
}

func copyTurns(m map[string]int) map[string]int {
	out := make(map[string]int, len(m)+1)
	for k, v := range m {
		out[k] = v
	}
	return out
}

// shareNet says whether two cells have a wired net in common.
func shareNet(ly *state, a, b *cell) bool {
	for _, n := range ly.signalNets(a) {
		for _, m := range ly.signalNets(b) {
			if n == m {
				return true
			}
		}
	}
	return false
}

// place puts the circuit's symbols, locals, labels and frames in place,
// with some orientations fixed (index into each symbol's Turns).
func place(c *graph.Circuit, o Options, turns map[string]int, free bool) *state {
	cells := makeCells(c, o)
	ly := &state{c: c, o: o, cells: cells, turns: turns, crossing: map[string]bool{}, free: free}
	if len(cells) == 0 {
		return ly
	}
	ly.rank()
	ly.orient()
	for _, cl := range ly.cells {
		buildLocals(c, cl)
		placeLabel(c, cl, labelPrefs(cl))
	}
	ly.place()
	return ly
}

// key is everything the router sees of a placement: two placements with
// the same key route the same way.
func (ly *state) key() string {
	b := []byte{'n'}
	if ly.shortFirst {
		b[0] = 's'
	}
	num := func(v float64) { b = strconv.AppendFloat(append(b, ' '), v, 'g', -1, 64) }
	rect := func(r geom.Rect) { num(r.X0); num(r.Y0); num(r.X1); num(r.Y1) }
	for _, cl := range ly.cells {
		b = append(append(b, '|'), cl.ref...)
		b = strconv.AppendInt(b, int64(cl.edge), 10)
		rect(cl.shape.Box)
		for _, p := range cl.shape.Pins {
			b = append(append(append(b, ' '), p.Name...), p.Net...)
			num(p.At.X)
			num(p.At.Y)
			b = strconv.AppendInt(b, int64(p.Dir), 10)
		}
		for _, l := range cl.locals {
			rect(l.Box)
			for _, s := range l.Stub {
				rect(s.Box())
			}
		}
		rect(cl.label.Box)
		if s, ok := ly.stageOf[cl.ref]; ok {
			b = strconv.AppendInt(append(b, 's'), int64(s), 10)
		}
	}
	for _, f := range ly.frames {
		rect(f.Box)
		rect(f.Title.Box)
		b = append(b, strings.Join(f.Title.Lines, "\n")...)
	}
	return string(b)
}

// wiring is what routing adds to a placed sheet.
type wiring struct {
	wires  []geom.Wire
	dots   []geom.Pt
	failed []string
	flags  []geom.Local // net-name flags of nets that could not be wired
	frames []geom.Frame // grown to hold their stages' wires
	// crossings counts the points where two nets cross; crossing marks the
	// refs on nets that cross
	crossings int
	crossing  map[string]bool
	pops      int
}

// route wires a placed sheet: every net, then (when full) rip-up and
// reroute of crossings and net-name flags for nets that could not be wired.
func route(ly *state, full bool, sc *scratch) *wiring {
	w := &wiring{crossing: map[string]bool{}}
	if len(ly.cells) == 0 {
		return w
	}
	rt := newRouter(ly, sc)
	rt.routeNets()
	if full {
		rt.finish()
	}
	var g geom.Sheet
	rt.emit(&g)
	w.frames = ly.growFrames(&g)
	w.wires, w.dots, w.failed, w.flags = g.Wires, g.Dots, g.Failed, g.Locals
	w.pops = rt.pops
	for i := range rt.g {
		if o := rt.g[i].own; o[1] != 0 {
			w.crossings++
			for _, id := range o {
				for _, p := range rt.nets[id-1].pins {
					w.crossing[p.ref] = true
				}
			}
		}
	}
	return w
}

// assemble is the finished sheet: the placed symbols, locals and labels,
// and the wiring.
func assemble(ly *state, w *wiring) *Result {
	res := &Result{}
	if len(ly.cells) == 0 {
		return res
	}
	g := &res.Geom
	for _, cl := range ly.cells {
		res.Placed = append(res.Placed, Placed{Ref: cl.ref, Part: realPart(cl), Shape: cl.shape, Faded: cl.faded})
		g.Symbols = append(g.Symbols, geom.Symbol{Ref: cl.ref, Box: cl.shape.Box, Pins: cl.shape.Pins, Faded: cl.faded})
		g.Locals = append(g.Locals, cl.locals...)
		if len(cl.label.Lines) > 0 {
			g.Labels = append(g.Labels, cl.label)
		}
	}
	for _, f := range ly.frames {
		g.Labels = append(g.Labels, f.Title)
	}
	g.Wires, g.Dots, g.Failed = w.wires, w.dots, w.failed
	g.Locals = append(g.Locals, w.flags...)
	g.Frames = append([]geom.Frame(nil), w.frames...)
	if ly.o.Links {
		g.Links = ly.links(g)
	}
	g.Bounds = bounds(g)
	return res
}

// bounds is the box round everything drawn.
func bounds(g *geom.Sheet) geom.Rect {
	b := geom.Rect{}
	for _, s := range g.Symbols {
		b = b.Union(s.Box)
	}
	for _, l := range g.Locals {
		b = b.Union(l.Box)
	}
	for _, l := range g.Labels {
		b = b.Union(l.Box)
	}
	for _, w := range g.Wires {
		for _, s := range w.Segs {
			b = b.Union(s.Box())
		}
	}
	for _, f := range g.Frames {
		b = b.Union(f.Box)
	}
	return b
}
