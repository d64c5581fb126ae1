package layout

import (
	"fmt"
	"sort"
	"sync"

	"pare/graph"
)

// Layout places and routes the circuit.
func Layout(c *graph.Circuit, o Options) (*Result, error) {
	if c == nil {
		return nil, fmt.Errorf("layout: no circuit")
	}
	sc := scratchPool.Get().(*scratch)
	defer scratchPool.Put(sc)
	u := &untangler{c: c, o: o, seen: map[string]*wiring{}, sc: sc}
	best := u.run()
	return assemble(best.ly, best.w), nil
}

// run is the plain layout and, where the options ask and it has crossings,
// the untangle search.
func (u *untangler) run() *routed {
	best := u.layout(nil, false)
	u.plan(best)
	if best.crossings > 0 && u.o.Untangle && len(best.ly.cells) <= maxRetryCells {
		best = u.untangle(best)
	}
	if u.trial() {
		// the search compared its trials wired without the unline pass
		// (which would sway which placement wins); the winner gets it
		w := route(best.ly, u.sc, true)
		u.pops += w.pops
		best.ly.crossing = w.crossing
		best = &routed{ly: best.ly, w: w, crossings: w.crossings}
	}
	return best
}

// trial says whether layouts are trials of the untangle search, wired
// without the unline pass until one is chosen.
func (u *untangler) trial() bool { return u.o.Untangle }

// scratchPool keeps the router's search memory from one sheet to the next
// (render lays out several views of one circuit): a search starts by
// stamping a new generation, so nothing left in it can be read again.
var scratchPool = sync.Pool{New: func() any { return new(scratch) }}

// plan sets the search's work budget from the plain layout: untangleBudget,
// or for a sheet with few crossings untangleLayouts layouts the plain
// one's size.
func (u *untangler) plan(plain *routed) {
	u.budget = untangleBudget
	if plain.crossings <= fewCrossings {
		u.budget = max(untangleBudget, untangleLayouts*plain.w.pops)
	}
}

// untangle looks for a layout with fewer crossings than the plain one.
func (u *untangler) untangle(plain *routed) *routed {
	// Crossings left after rerouting come from the placement. The layout
	// with every part lined up along its nets (rather than the signal path
	// on one line) is the first thing to try: when it has no crossing it
	// is taken as it is.
	if u.pops > u.budget {
		// a crowded sheet whose plain layout alone took more than the
		// search may spend (a long row of a whole set): routed once
		return plain
	}
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
	if u.pops > 2*u.budget {
		return best // the search and the lined-up layout took twice the budget
	}
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
	// untangleLayouts is the least number of layouts the size of the
	// plain one the search may route when the plain layout has at most
	// fewCrossings crossings, the few that one or two changes remove: on a
	// sheet of many stages each layout costs more, and the fixed bound
	// alone left the search a handful of tries, all spent on the first
	// part's turns (a whole set's mixer kept two crossings the turn of its
	// grid capacitor, the eleventh try, removes). A sheet with dozens of
	// crossings needs another placement, not a change or two, and keeps
	// the fixed bound.
	untangleLayouts = 10
	fewCrossings    = 4
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
	sc         *scratch // the router's search memory, for every layout
	pops       int      // the router's work so far
	budget     int      // the bound on pops: untangleBudget, or untangleLayouts plain layouts
}

// layout places the circuit with the given changes and routes it, unless
// the same placement was routed before.
func (u *untangler) layout(turns map[string]int, free bool) *routed {
	var ly *state
	if p := u.o.Placed; p != nil && turns == nil && !free && !u.shortFirst {
		ly, u.o.Placed = p.ly, nil // the plain placement, made already
	} else {
		ly = place(u.c, u.o, turns, free)
	}
	ly.shortFirst = u.shortFirst
	key := ly.key()
	w, ok := u.seen[key]
	if !ok {
		w = route(ly, u.sc, !u.trial())
		u.pops += w.pops
		u.seen[key] = w
	}
	ly.crossing = w.crossing
	return &routed{ly: ly, w: w, crossings: w.crossings}
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

// climb is one greedy local search: the best layout so far and the changes
// that made it.
type climb struct {
	u     *untangler
	free  bool
	cur   *routed
	turns map[string]int
}

// search runs the greedy local search from the plain layout (signal path on
// one line, or every part lined up along its nets when free) and returns
// the best layout it found.
func (u *untangler) search(free bool) *routed {
	k := &climb{u: u, free: free, cur: u.layout(nil, free), turns: map[string]int{}}
	k.singles()
	if !free {
		k.pairs() // once is enough: on the signal-line layout
	}
	return k.cur
}

// try lays out the changes and keeps them if they leave fewer crossings.
func (k *climb) try(trial map[string]int) {
	if k.u.pops > k.u.budget {
		return // deterministic work bound: the same input stops at the same place
	}
	if r := k.u.layout(trial, k.free); r.crossings < k.cur.crossings {
		k.cur, k.turns = r, trial
	}
}

// singles tries, for each part on a crossing net, its other orientations,
// then moving it to the bottom of its column, then one layer left and
// right; twice over.
func (k *climb) singles() {
	for pass := 0; pass < 2 && k.cur.crossings > 0; pass++ {
		for _, cl := range k.cur.ly.cells {
			if !k.cur.ly.crossing[cl.ref] || k.cur.crossings == 0 || k.cur.ly.inTank(cl) {
				continue // a tank capacitor turns and moves with its winding
			}
			n := len(cl.turns)
			for t := 0; t <= n+2 && k.u.tried < maxRetries && k.cur.crossings > 0; t++ {
				if t == cl.turn && t < n {
					continue
				}
				k.u.tried++
				trial := copyTurns(k.turns)
				switch {
				case t == n:
					trial[sinkKey+cl.ref] = 1
				case t > n:
					trial[shiftKey+cl.ref] = 2*(t-n) - 3 // one layer left, then right
				default:
					trial[cl.ref] = t
				}
				k.try(trial)
			}
		}
	}
}

// pairs tries two changes at once, for a crossing no single change
// removes: a part on a crossing net turned (a transformer mirrored)
// together with a part it is wired to moved to the bottom of its column.
func (k *climb) pairs() {
	pairs := 0
	// parts of more than two pins first: mirroring a transformer or
	// turning a valve moves which side each of its nets leaves, where
	// turning a two-terminal part mostly moves its label, and the tries
	// are few (a self-oscillating mixer's crossing went on a capacitor's
	// eight turns before its transformer was mirrored)
	order := append([]*cell(nil), k.cur.ly.cells...)
	sort.SliceStable(order, func(i, j int) bool { return len(order[i].shape.Pins) > 2 && len(order[j].shape.Pins) <= 2 })
	for _, a := range order {
		if k.cur.crossings == 0 || pairs >= maxPairTries {
			break
		}
		if !k.cur.ly.crossing[a.ref] || len(a.turns) < 2 || k.cur.ly.inTank(a) {
			continue
		}
		for t := range a.turns {
			if t == a.turn {
				continue
			}
			for _, b := range k.cur.ly.cells {
				if b == a || b.edge != 0 || pairs >= maxPairTries || k.cur.crossings == 0 || !shareNet(k.cur.ly, a, b) || k.cur.ly.inTank(b) {
					continue
				}
				pairs++
				trial := copyTurns(k.turns)
				trial[a.ref] = t
				trial[sinkKey+b.ref] = 1
				k.try(trial)
			}
		}
	}
}
