package graph

import "sort"

// The islands of a coil's capacitor network: the nodes capacitor-joined to
// each other with the coil's two ends taken out. Only an island touching
// both ends carries charge from one to the other. The chassis is one node
// with a capacitor in every stage, so the island holding it (or the
// chassis as an end, when an end is held at AC ground) spans the set; the
// islands are therefore explored from both ends in turn, a step each, and
// the end whose islands are all explored first decides which touch both.
// A coil costs what its own tank's neighbourhood holds, not the set.

// adjIter steps through the capacitors at a node in the order of parts,
// leaving out those the held net shorts; the ground node has the held
// net's too.
type adjIter struct {
	n    capNet
	a, b []int
	i, j int
}

func (n capNet) iter(r string) adjIter {
	it := adjIter{n: n, a: n.v.adj[n.fi][r]}
	if n.heldRoot != "" && r == n.groundRoot {
		it.b = n.v.adj[n.fi][n.heldRoot]
	}
	return it
}

func (it *adjIter) size() int { return len(it.a) + len(it.b) }

func (it *adjIter) next() (int, bool) {
	for {
		var e int
		switch {
		case it.i < len(it.a) && (it.j >= len(it.b) || it.a[it.i] < it.b[it.j]):
			e = it.a[it.i]
			it.i++
		case it.j < len(it.b):
			e = it.b[it.j]
			it.j++
		default:
			return 0, false
		}
		if x, y := it.n.ends(e); x != y {
			return e, true
		}
	}
}

// islandWalk explores, one capacitor a step, the islands next to node from
// (with node to taken out too), keeping those that touch to.
type islandWalk struct {
	n        capNet
	from, to string
	starts   adjIter
	seen     map[string]bool
	island   []string
	qi       int
	cur      adjIter
	open     bool // an island is being explored
	touches  bool
	found    [][]string
}

func newIslandWalk(n capNet, from, to string) *islandWalk {
	return &islandWalk{n: n, from: from, to: to, starts: n.iter(from), seen: map[string]bool{from: true, to: true}}
}

// step takes one capacitor; false when every island is explored.
func (w *islandWalk) step() bool {
	if !w.open {
		e, ok := w.starts.next()
		if !ok {
			return false
		}
		if m := w.n.other(e, w.from); !w.seen[m] {
			w.seen[m] = true
			w.island, w.qi, w.cur, w.open, w.touches = []string{m}, 0, w.n.iter(m), true, false
		}
		return true
	}
	e, ok := w.cur.next()
	if !ok {
		if w.qi++; w.qi < len(w.island) {
			w.cur = w.n.iter(w.island[w.qi])
			return true
		}
		if w.touches {
			w.found = append(w.found, w.island)
		}
		w.open = false
		return true
	}
	m := w.n.other(e, w.island[w.qi])
	if m == w.to {
		w.touches = true
	}
	if !w.seen[m] {
		w.seen[m] = true
		w.island = append(w.island, m)
	}
	return true
}

// bridgingNodes numbers the free nodes whose capacitors carry charge from
// a to b: the islands that touch both. An island touching only a sits at
// a's potential and one touching only b draws nothing from a, so neither
// changes the charge; leaving them out keeps the solve to the few nodes of
// the tank itself. Nodes are numbered as a walk from a finds them, island
// by island in the order of a's capacitors and breadth first inside each
// (deterministic: parts are sorted), so the solve is the same whichever
// end's islands were explored. It also lists the capacitors at the
// numbered nodes, ascending, each at each of its free ends.
func (n capNet) bridgingNodes(ra, rb string) (map[string]int, []int) {
	wa, wb := newIslandWalk(n, ra, rb), newIslandWalk(n, rb, ra)
	var islands [][]string
	for {
		if !wa.step() {
			islands = wa.found
			break
		}
		if !wb.step() {
			islands = wb.found
			break
		}
	}
	type ordered struct {
		first int // a's first capacitor onto the island
		start string
		nodes map[string]bool
	}
	var list []ordered
	var touching []int
	for _, isl := range islands {
		o := ordered{first: -1, nodes: map[string]bool{}}
		for _, nd := range isl {
			o.nodes[nd] = true
			it := n.iter(nd)
			for e, ok := it.next(); ok; e, ok = it.next() {
				touching = append(touching, e)
				if n.other(e, nd) == ra && (o.first < 0 || e < o.first) {
					o.first, o.start = e, nd
				}
			}
		}
		list = append(list, o)
	}
	sort.Slice(list, func(i, j int) bool { return list[i].first < list[j].first })
	index := map[string]int{}
	for _, o := range list {
		order := []string{o.start}
		index[o.start] = len(index)
		for i := 0; i < len(order); i++ {
			it := n.iter(order[i])
			for e, ok := it.next(); ok; e, ok = it.next() {
				if m := n.other(e, order[i]); o.nodes[m] {
					if _, done := index[m]; !done {
						index[m] = len(index)
						order = append(order, m)
					}
				}
			}
		}
	}
	sort.Ints(touching)
	return index, touching
}
