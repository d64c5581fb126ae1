package graph

import (
	"sort"

	"gonum.org/v1/gonum/mat"
)

// The capacitor networks a coil's tuning capacitance is solved on. Every
// coil of a set is solved on the same few networks (one per switch
// position a coil is reached through, at two settings of the gang), so
// they are built once per load, and a coil's solve touches only the
// islands of capacitors that bridge its ends: on a whole set, rebuilding
// the network per coil made the load quadratic in the number of coils
// (13 s CPU for 10,000 parts).

// tuner builds and keeps the capacitor networks of one circuit.
type tuner struct {
	c     *Circuit
	first map[string]switchUse // net: the first switch contact reaching it
	views map[int]*capView     // by switch position (0: each switch as set)
	// rx indexes the regions for the band of each coil: a whole set has
	// regions per channel, and a walk over them per coil was quadratic.
	rx *RegionIndex
}

// switchUse is a switch contact pair reaching a net: its place in the
// order of parts, positions and pairs, and its position (from 1).
type switchUse struct{ order, pos int }

func newTuner(c *Circuit) *tuner {
	t := &tuner{c: c, first: map[string]switchUse{}, views: map[int]*capView{}, rx: c.RegionIndex()}
	order := 0
	for _, p := range c.Parts {
		for i, closes := range p.Closes {
			for _, pr := range closes {
				for _, n := range []string{p.NetOf(pr[0]), p.NetOf(pr[1])} {
					if _, ok := t.first[n]; !ok {
						t.first[n] = switchUse{order, i + 1}
					}
				}
				order++
			}
		}
	}
	return t
}

// position is the switch position a coil between nets a and b tunes in:
// the position of the first contact pair (in the order of parts, their
// positions, their pairs) that reaches either end, 0 when none does.
func (t *tuner) position(a, b string) int {
	ua, okA := t.first[a]
	ub, okB := t.first[b]
	switch {
	case okA && (!okB || ua.order <= ub.order):
		return ua.pos
	case okB:
		return ub.pos
	}
	return 0
}

// capView is the capacitor network of a circuit with AC-ground nets one
// node and the switches' contacts at one position closed: nodes are the
// sets' representatives, edges the capacitors between two of them, at the
// gang fully open (0) and fully meshed (1).
type capView struct {
	uf     *NamedSets
	ground string
	edges  [2][]capEdge
	adj    [2]map[string][]int
}

// capEdge is a capacitor between two nodes.
type capEdge struct {
	x, y string
	c    float64
}

// view is the network for a coil reached through switch position pos (0:
// none): the contacts a switch closes in that position, every other switch
// with as many positions in that position too, the rest as set (a coil
// behind a wavechange wafer tunes with what that position switches in: its
// own padder and trimmers).
func (t *tuner) view(pos int) *capView {
	if v, ok := t.views[pos]; ok {
		return v
	}
	c := t.c
	uf := &NamedSets{}
	for _, n := range c.Nets {
		uf.intern(n.Name)
		if c.RoleOf(n.Name).IsACGround() {
			uf.Union(" ground", n.Name)
		}
	}
	for _, p := range c.Parts {
		at := int(p.Set)
		if pos > 0 && pos <= len(p.Closes) {
			at = pos
		}
		if p.Kind != Switch || at < 1 || at > len(p.Closes) {
			continue
		}
		for _, pr := range p.Closes[at-1] {
			if n1, n2 := p.NetOf(pr[0]), p.NetOf(pr[1]); n1 != "" && n2 != "" {
				uf.Union(n1, n2)
			}
		}
	}
	v := &capView{uf: uf, ground: uf.Find(" ground")}
	for fi, frac := range []float64{0, 1} {
		v.adj[fi] = map[string][]int{}
		for _, p := range c.Parts {
			if p.Kind != Capacitor || len(p.Pins) != 2 || p.Pins[0].Net == "" || p.Pins[1].Net == "" {
				continue
			}
			x, y := uf.Find(p.Pins[0].Net), uf.Find(p.Pins[1].Net)
			if cv := p.Capacitance(frac); x != y && cv > 0 {
				e := len(v.edges[fi])
				v.adj[fi][x], v.adj[fi][y] = append(v.adj[fi][x], e), append(v.adj[fi][y], e)
				v.edges[fi] = append(v.edges[fi], capEdge{x, y, cv})
			}
		}
	}
	t.views[pos] = v
	return v
}

// capNet is a view at one gang setting with one more net (held, when not
// "") joined to AC ground: the node held's set stands for is read as the
// ground node, and capacitors it shorts are left out.
type capNet struct {
	v          *capView
	fi         int
	heldRoot   string
	groundRoot string
}

func (n capNet) root(name string) string {
	r := n.v.uf.Find(name)
	if n.heldRoot != "" && r == n.heldRoot {
		return n.groundRoot
	}
	return r
}

func (n capNet) ends(e int) (x, y string) {
	ed := n.v.edges[n.fi][e]
	return n.root(ed.x), n.root(ed.y)
}

// other is the end of capacitor e that is not node at.
func (n capNet) other(e int, at string) string {
	x, y := n.ends(e)
	if x != at {
		return x
	}
	return y
}

// between is the capacitance between nets a and b through the capacitors
// alone (the gang fully open, fi 0, or fully meshed, fi 1), held (when not
// "") joined to AC ground: the network's nodal solve with a held at 1 V and
// b at 0, the charge drawn from a. Resistors and coils are left out: at a
// tank's frequency its capacitance is what the capacitors give, bypasses
// acting as the shorts they are.
func (v *capView) between(a, b, held string, fi int) float64 {
	n := capNet{v: v, fi: fi}
	if held != "" {
		if hr := v.uf.Find(held); hr != v.ground {
			n.heldRoot, n.groundRoot = hr, v.ground
		}
	}
	if a == "" || b == "" || n.root(a) == n.root(b) {
		return 0
	}
	ra, rb := n.root(a), n.root(b)
	index, touching := n.bridgingNodes(ra, rb)
	volts := n.nodeVolts(index, touching, ra, rb)
	// The charge drawn from a, summed over a's capacitors in the order of
	// parts: a neighbour on a bridging island at its voltage, b at 0 V; any
	// other neighbour sits in an island that reaches only a, at a's 1 V,
	// and adds nothing, so only these capacitors are visited.
	var at []int
	for _, e := range touching {
		if x, y := n.ends(e); x == ra || y == ra {
			at = append(at, e)
		}
	}
	at = append(at, n.joining(ra, rb)...)
	sort.Ints(at)
	q := 0.0
	for i, e := range at {
		if i > 0 && e == at[i-1] {
			continue
		}
		vm := 0.0
		if j, ok := index[n.other(e, ra)]; ok {
			vm = volts[j]
		}
		q += v.edges[fi][e].c * (1 - vm)
	}
	return q
}

// joining lists the capacitors straight from node a to node b, read from
// the end with fewer (the chassis has a capacitor in every stage).
func (n capNet) joining(a, b string) []int {
	it, to := n.iter(a), b
	if jt := n.iter(b); jt.size() < it.size() {
		it, to = jt, a
	}
	var out []int
	for e, ok := it.next(); ok; e, ok = it.next() {
		if x, y := n.ends(e); x == to || y == to {
			out = append(out, e)
		}
	}
	return out
}

// nodeVolts solves the capacitor network for the free nodes' voltages
// with node a at 1 V and node b at 0 (every free node is reached from one
// of them, so the system is regular), stamping the capacitors at free
// nodes in the order of parts.
func (n capNet) nodeVolts(index map[string]int, touching []int, a, b string) []float64 {
	size := len(index)
	if size == 0 {
		return nil
	}
	g := mat.NewDense(size, size, nil)
	rhs := mat.NewVecDense(size, nil)
	fixed := map[string]float64{a: 1, b: 0}
	stamp := func(x, y string, cv float64) {
		i, ok := index[x]
		if !ok {
			return
		}
		g.Set(i, i, g.At(i, i)+cv)
		if j, ok := index[y]; ok {
			g.Set(i, j, g.At(i, j)-cv)
		} else {
			rhs.SetVec(i, rhs.AtVec(i)+cv*fixed[y])
		}
	}
	for i, e := range touching {
		if i > 0 && e == touching[i-1] {
			continue // a capacitor between two free nodes is listed at both
		}
		x, y := n.ends(e)
		cv := n.v.edges[n.fi][e].c
		stamp(x, y, cv)
		stamp(y, x, cv)
	}
	var v mat.VecDense
	if err := v.SolveVec(g, rhs); err != nil {
		return make([]float64, size)
	}
	return v.RawVector().Data
}
