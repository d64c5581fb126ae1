package graph

import (
	"math"

	"gonum.org/v1/gonum/mat"
)

// A coil's q is its unloaded Q at one frequency; the loss resistance that
// stands for it (R = ω·L/q, graph/device.WindingLoss) depends on which. A
// coil's Q is stated where it works: at the resonance of the tank it tunes.
// Referring every coil to the centre of its region's band would misstate
// a coil that tunes elsewhere: a long-wave coil in a set whose band is the
// medium waves, or an IF trap at the aerial, whose loss sets its depth.

// maxTuningC is the largest capacitance a coil is taken to tune with
// (common practice, no source): the tuning capacitance of a receiver's
// tanks, down to long waves, stays below a few nanofarads; a coil that
// resonates only with more (an RF choke against its decoupler) tunes
// nothing, and its q stays referred to its band's centre.
const maxTuningC = 10e-9

// minTuningC is the least capacitance taken as tuning a coil: a picofarad,
// below any trimmer's minimum (common practice, no source); less is the
// rounding of a network whose capacitors do not reach across the coil.
const minTuningC = 1e-12

// ReferQ sets each winding's QAt, the frequency its q is referred to: the
// part's q_at when the netlist gives one; else, for a part whose tuned
// winding resonates with its tuning capacitance (the gang from fully open to
// fully meshed, a fixed capacitor at its value) wholly outside the band the
// part works in (an IF trap below a medium-wave band, a long-wave coil in a
// set whose band is the medium waves), the geometric centre of its own
// range, which the part's other windings share (they sit on the same former);
// else 0: a coil that tunes inside its band, or tunes nothing, has its q
// referred to that band's centre (Circuit.BandCentre). The loader calls it
// once, so a reduced circuit, cloned from the loaded one, keeps the same
// loss resistance for every coil.
func (c *Circuit) ReferQ() {
	for _, p := range c.Parts {
		if len(p.Windings) == 0 {
			continue
		}
		f := p.Params["q_at"]
		if f <= 0 {
			f = c.ownRange(p)
		}
		for i := range p.Windings {
			p.Windings[i].QAt = f
		}
	}
}

// ownRange is the geometric centre of the range the part's first tuned coil
// resonates over when that range lies wholly outside the part's band (the
// one BandCentre takes), else 0.
func (c *Circuit) ownRange(p *Part) float64 {
	lo, hi := c.tankRange(p)
	if lo <= 0 {
		return 0
	}
	b := c.BandOf(p)
	if b.Min <= 0 || b.Max <= 0 {
		b = c.FullBand()
	}
	if b.Min > 0 && hi >= b.Min && lo <= b.Max {
		return 0
	}
	return math.Sqrt(lo * hi)
}

// tankRange is the range the part's first tuned coil (a whole tapped
// coil, or one winding) resonates over, zeros when no winding is tuned.
func (c *Circuit) tankRange(p *Part) (lo, hi float64) {
	for _, coil := range coilsOf(p) {
		a, b := p.NetOf(coil.from), p.NetOf(coil.to)
		// A coil in series with a capacitor from a signal net to chassis
		// (a series trap) tunes with it through whatever drives that net,
		// which closes the loop: failing a capacitive path across the coil,
		// each end in turn is taken as AC ground.
		for _, held := range []string{"", a, b} {
			nodes := c.capNodes(a, b, held)
			cOpen, cMeshed := capBetween(c, nodes, a, b, 0), capBetween(c, nodes, a, b, 1)
			if cOpen >= minTuningC && cMeshed >= minTuningC && cMeshed <= maxTuningC && coil.l > 0 {
				f := func(cv float64) float64 { return 1 / (2 * math.Pi * math.Sqrt(coil.l*cv)) }
				return f(cMeshed), f(cOpen)
			}
		}
	}
	return 0, 0
}

type coilEnds struct {
	from, to string
	l        float64
}

// coilsOf lists a part's coils end to end: a tapped inductor is one coil
// (pins 1 and 2, its whole inductance), and so are the two sections of a
// tapped winding (L = La + Lb + 2k·√(La·Lb), device.WindingLoss's whole
// coil); each other winding of a transformer that has a q is its own (a
// winding given no q, a reaction or coupling winding, is no tank whose
// loss matters).
func coilsOf(p *Part) []coilEnds {
	if p.Kind == Inductor {
		return []coilEnds{{"1", "2", p.Inductance()}}
	}
	var out []coilEnds
	inPair := map[int]bool{}
	for i, a := range p.Windings {
		for j, b := range p.Windings {
			if i != j && a.To == b.From && a.Q > 0 && b.Q > 0 {
				k := p.K(a.Name, b.Name)
				out = append(out, coilEnds{a.From, b.To, a.L + b.L + 2*k*math.Sqrt(a.L*b.L)})
				inPair[i], inPair[j] = true, true
			}
		}
	}
	for i, w := range p.Windings {
		if w.Q > 0 && !inPair[i] {
			out = append(out, coilEnds{w.From, w.To, w.L})
		}
	}
	return out
}

// capNodes joins the nets that are one node for a coil between nets a and
// b: AC-ground nets with each other, and the contacts a switch closes in
// the position that reaches the coil (a coil behind a wavechange wafer
// tunes with what that position switches in: its own padder and trimmers),
// every other switch with as many positions in that position too, the rest
// as set; held, when not "", joins AC ground too.
func (c *Circuit) capNodes(a, b, held string) *NamedSets {
	pos := 0
	for _, p := range c.Parts {
		for i, closes := range p.Closes {
			for _, pr := range closes {
				if n1, n2 := p.NetOf(pr[0]), p.NetOf(pr[1]); pos == 0 && (n1 == a || n1 == b || n2 == a || n2 == b) {
					pos = i + 1
				}
			}
		}
	}
	uf := &NamedSets{}
	for _, n := range c.Nets {
		uf.intern(n.Name)
		if c.RoleOf(n.Name).IsACGround() {
			uf.Union(" ground", n.Name)
		}
	}
	if held != "" {
		uf.Union(" ground", held)
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
	return uf
}

// capBetween is the capacitance between nets a and b through the
// capacitors alone (the gang at frac of its travel): the network's nodal
// solve with a held at 1 V and b at 0, the charge drawn from a. Resistors
// and coils are left out: at a tank's frequency its capacitance is what
// the capacitors give, bypasses acting as the shorts they are.
func capBetween(c *Circuit, uf *NamedSets, a, b string, frac float64) float64 {
	if a == "" || b == "" || uf.Find(a) == uf.Find(b) {
		return 0
	}
	var edges []capEdge
	adj := map[string][]int{}
	for _, p := range c.Parts {
		if p.Kind != Capacitor || len(p.Pins) != 2 || p.Pins[0].Net == "" || p.Pins[1].Net == "" {
			continue
		}
		x, y := uf.Find(p.Pins[0].Net), uf.Find(p.Pins[1].Net)
		if cv := p.Capacitance(frac); x != y && cv > 0 {
			adj[x], adj[y] = append(adj[x], len(edges)), append(adj[y], len(edges))
			edges = append(edges, capEdge{x, y, cv})
		}
	}
	ra, rb := uf.Find(a), uf.Find(b)
	index := bridgingNodes(edges, adj, ra, rb)
	v := nodeVolts(edges, index, ra, rb)
	q := 0.0
	for _, e := range adj[ra] {
		m := edges[e].x
		if m == ra {
			m = edges[e].y
		}
		// A neighbour off the bridging islands is b (0 V) or sits in an
		// island that reaches only a, at a's 1 V.
		vm := 1.0
		if i, ok := index[m]; ok {
			vm = v[i]
		} else if m == rb {
			vm = 0
		}
		q += edges[e].c * (1 - vm)
	}
	return q
}

// bridgingNodes numbers the free nodes whose capacitors carry charge from
// a to b: the islands of capacitor-joined nodes (a and b left out) that
// touch both. An island touching only a sits at a's potential and one
// touching only b draws nothing from a, so neither changes the charge;
// leaving them out keeps the solve to the few nodes of the tank itself
// where a whole set's chassis would join every stage's bypasses into one
// system. Nodes are numbered in the order found (deterministic: parts are
// sorted).
func bridgingNodes(edges []capEdge, adj map[string][]int, ra, rb string) map[string]int {
	other := func(e int, n string) string {
		if edges[e].x == n {
			return edges[e].y
		}
		return edges[e].x
	}
	index := map[string]int{}
	seen := map[string]bool{ra: true, rb: true}
	for _, e0 := range adj[ra] {
		start := other(e0, ra)
		if seen[start] {
			continue
		}
		seen[start] = true
		island, touchesB := []string{start}, false
		for i := 0; i < len(island); i++ {
			for _, e := range adj[island[i]] {
				m := other(e, island[i])
				if m == rb {
					touchesB = true
				}
				if !seen[m] {
					seen[m] = true
					island = append(island, m)
				}
			}
		}
		if touchesB {
			for _, n := range island {
				index[n] = len(index)
			}
		}
	}
	return index
}

// capEdge is a capacitor between two nodes.
type capEdge struct {
	x, y string
	c    float64
}

// nodeVolts solves the capacitor network for the free nodes' voltages
// with node a at 1 V and node b at 0 (every free node is reached from one
// of them, so the system is regular).
func nodeVolts(edges []capEdge, index map[string]int, a, b string) []float64 {
	n := len(index)
	if n == 0 {
		return nil
	}
	g := mat.NewDense(n, n, nil)
	rhs := mat.NewVecDense(n, nil)
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
	for _, e := range edges {
		stamp(e.x, e.y, e.c)
		stamp(e.y, e.x, e.c)
	}
	var v mat.VecDense
	if err := v.SolveVec(g, rhs); err != nil {
		return make([]float64, n)
	}
	return v.RawVector().Data
}
