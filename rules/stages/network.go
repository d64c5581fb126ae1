package stages

import (
	"math"
	"slices"

	"pare/graph"
	"pare/graph/ac"
)

// Small networks cut from the circuit (the resistors from a net to ground,
// the capacitors of a tank) are solved by nodal analysis with graph/ac's
// solver: one linear solver for the whole program.

// stamp adds an admittance y between nodes i and j of a nodal matrix.
// unk maps a node to its unknown, -1 for a node at a known voltage volt(n),
// whose term goes to the right-hand side rhs.
func stamp(ents []ac.Entry, rhs []float64, unk []int, volt func(int) float64, i, j int, y float64) []ac.Entry {
	for _, pq := range [2][2]int{{i, j}, {j, i}} {
		p, q := unk[pq[0]], unk[pq[1]]
		if p < 0 {
			continue
		}
		ents = append(ents, ac.Entry{Row: p, Col: p, V: y})
		if q >= 0 {
			ents = append(ents, ac.Entry{Row: p, Col: q, V: -y})
		} else {
			rhs[p] += y * volt(pq[1])
		}
	}
	return ents
}

// resistanceToGround is the DC resistance from a net to AC ground through
// every resistor and potentiometer of the circuit (a pot as two sections
// split at its wiper), found by nodal analysis with 1 A into the net. 0 when
// no resistive path reaches ground.
func resistanceToGround(w *world, net int) float64 {
	order, branches, grounded := resistiveReach(w, net)
	if !grounded {
		return 0
	}
	// Node 0 is ground, at 0 V; the nets reached follow, the net itself
	// first, each its own unknown.
	node := map[int]int{groundNet: 0}
	unk := []int{-1}
	for k, n := range order {
		node[n] = k + 1
		unk = append(unk, k)
	}
	rhs := make([]float64, len(order))
	rhs[0] = 1 // 1 A into the net
	atGround := func(int) float64 { return 0 }
	var ents []ac.Entry
	for _, br := range branches {
		if br.a != br.b {
			ents = stamp(ents, rhs, unk, atGround, node[br.a], node[br.b], br.g)
		}
	}
	v, err := ac.SolveReal(len(order), ents, rhs)
	if err != nil {
		return 0
	}
	return v[0]
}

// resistiveReach walks the resistive branches from a net: the nets it
// reaches (ground left out, the net first), each branch once, and whether
// ground is reached.
func resistiveReach(w *world, net int) (order []int, branches []branch, grounded bool) {
	adj := w.resistive()
	seenNet := map[int]bool{net: true}
	seenBranch := map[branch]bool{}
	order = []int{net}
	for k := 0; k < len(order); k++ {
		for _, br := range adj[order[k]] {
			if !seenBranch[br] {
				seenBranch[br] = true
				branches = append(branches, br)
			}
			other := br.b
			if other == order[k] {
				other = br.a
			}
			if other == groundNet {
				grounded = true
				continue
			}
			if !seenNet[other] {
				seenNet[other] = true
				order = append(order, other)
			}
		}
	}
	return order, branches, grounded
}

// branch is one resistive path between two nets (a resistor, or one side of
// a pot's wiper).
type branch struct {
	a, b int
	g    float64
	part int
	half int
}

// resistive indexes the circuit's resistive branches by net, built once.
func (w *world) resistive() map[int][]branch {
	w.lazy.Lock()
	defer w.lazy.Unlock()
	if w.resAdj != nil {
		return w.resAdj
	}
	w.resAdj = map[int][]branch{}
	add := func(br branch) {
		w.resAdj[br.a] = append(w.resAdj[br.a], br)
		if br.b != br.a {
			w.resAdj[br.b] = append(w.resAdj[br.b], br)
		}
	}
	for ci, p := range w.parts {
		switch p.Kind {
		case graph.Resistor:
			if len(w.pins[ci]) == 2 && p.Value.Max > 0 {
				add(branch{w.pins[ci][0], w.pins[ci][1], 1 / p.Value.Max, ci, 0})
			}
		case graph.Pot:
			one, wiper, two := w.pinNet(ci, "1"), w.pinNet(ci, "w"), w.pinNet(ci, "2")
			r := p.Value.Max
			if one < 0 || two < 0 || r <= 0 {
				continue
			}
			set := math.Min(math.Max(p.Set, 1e-6), 1-1e-6)
			if wiper < 0 {
				add(branch{one, two, 1 / r, ci, 0})
				continue
			}
			add(branch{one, wiper, 1 / (set * r), ci, 1})
			add(branch{wiper, two, 1 / ((1 - set) * r), ci, 2})
		}
	}
	return w.resAdj
}

// sumCap adds capacitors in parallel at a setting of the variable ones.
func sumCap(ps []*graph.Part, frac float64) float64 {
	t := 0.0
	for _, p := range ps {
		t += p.Capacitance(frac)
	}
	return t
}

// seriesR adds resistors in series.
func seriesR(ps []*graph.Part) float64 {
	t := 0.0
	for _, p := range ps {
		t += p.Value.Max
	}
	return t
}

// parallelR combines resistors in parallel.
func parallelR(ps []*graph.Part) float64 {
	g := 0.0
	for _, p := range ps {
		if p.Value.Max > 0 {
			g += 1 / p.Value.Max
		}
	}
	if g == 0 {
		return 0
	}
	return 1 / g
}

// capEdge is one capacitor between two nodes of a tank's network.
type capEdge struct {
	i, j int
	c    float64
}

// capBetween is the capacitance the given capacitors present between nets a
// and b (folded ids), however they are wired (series padders, parallel
// trimmers): the capacitors' nodal matrix is solved with a at 1 V, b at 0 V
// and the charge on a read off. Variable sections are set at frac. NaN
// when the network cannot be solved.
func capBetween(w *world, caps []*graph.Part, a, b int, frac float64) float64 {
	return capNetOf(w, caps, a, b).at(frac)
}

// capNet is a capacitor network between two nets as capBetween wires it:
// the ends of its edges, numbered once, and the parts whose values they
// take at each setting. A formula's dial walk reads one network at some
// two thousand settings.
type capNet struct {
	same  bool // a and b are one net: no capacitance
	edges []capEdge
	parts []*graph.Part
	n     int
}

// capNetOf numbers the network of caps between a and b: node 0 is net a,
// node 1 net b, the others follow as met.
func capNetOf(w *world, caps []*graph.Part, a, b int) *capNet {
	if a == b {
		return &capNet{same: true}
	}
	idx := map[int]int{a: 0, b: 1}
	cn := &capNet{}
	for _, p := range caps {
		ci, ok := w.index[p]
		if !ok || len(p.Pins) != 2 {
			continue
		}
		var ends [2]int
		for k, net := range w.pins[ci] {
			if _, seen := idx[net]; !seen {
				idx[net] = len(idx)
			}
			ends[k] = idx[net]
		}
		cn.edges = append(cn.edges, capEdge{i: ends[0], j: ends[1]})
		cn.parts = append(cn.parts, p)
	}
	cn.n = len(idx)
	return cn
}

// at is the network's capacitance between its two nets with the variable
// sections at frac.
func (cn *capNet) at(frac float64) float64 {
	if cn.same {
		return 0
	}
	edges := slices.Clone(cn.edges)
	for k, p := range cn.parts {
		edges[k].c = p.Capacitance(frac)
	}
	v, ok := tankVoltages(edges, cn.n)
	if !ok {
		return math.NaN()
	}
	q := 0.0
	for _, e := range edges {
		if e.i == 0 {
			q += e.c * (1 - v[e.j])
		} else if e.j == 0 {
			q += e.c * (1 - v[e.i])
		}
	}
	return q
}

// tankVoltages solves the capacitor network for every node's voltage with
// node 0 at 1 V and node 1 at 0 V. Nodes no capacitor ties to either (an
// island of its own) are left at 0 V: they hold no charge of node 0's.
func tankVoltages(edges []capEdge, n int) ([]float64, bool) {
	v := make([]float64, n)
	v[0] = 1
	// The unknowns: nodes reached from 0 or 1 through a capacitor.
	unk := make([]int, n)
	for i := range unk {
		unk[i] = -1
	}
	reached := []int{0, 1}
	seen := make([]bool, n)
	seen[0], seen[1] = true, true
	m := 0
	for k := 0; k < len(reached); k++ {
		for _, e := range edges {
			for _, pq := range [2][2]int{{e.i, e.j}, {e.j, e.i}} {
				if pq[0] == reached[k] && e.c != 0 && !seen[pq[1]] {
					seen[pq[1]] = true
					reached = append(reached, pq[1])
					unk[pq[1]] = m
					m++
				}
			}
		}
	}
	rhs := make([]float64, m)
	volt := func(node int) float64 { return v[node] }
	var ents []ac.Entry
	for _, e := range edges {
		if e.i != e.j && e.c != 0 {
			ents = stamp(ents, rhs, unk, volt, e.i, e.j, e.c)
		}
	}
	x, err := ac.SolveReal(m, ents, rhs)
	if err != nil {
		return nil, false
	}
	for node, u := range unk {
		if u >= 0 {
			v[node] = x[u]
		}
	}
	return v, true
}
