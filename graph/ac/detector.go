package ac

import (
	"math"

	"pare/graph"
)

// The DC load of a detector diode: the resistance its rectified current
// returns through, from the diode's anode round to its cathode. The
// default diode model (device.DiodeRd) makes a conducting signal diode
// with such a load a peak detector whose input resistance is half of it.

// dcNet is the circuit as DC sees it: windings and closed contacts are
// shorts, capacitors and the diodes themselves are open, amplifying parts
// draw no current from this network, and the nets at AC ground by role
// (ground, supply, heater, bias) are the one return, as they are one node
// for the solver: a rail is a stiff source, and a decoupled bias line (an
// AGC line) holds still at the detector's audio and carries its share of
// the load. A reduction keeps these nets (rail-ground only states their
// role), so a detector's load is the same before and after it.
type dcNet struct {
	uf      *graph.NamedSets
	node    map[string]int // representative net -> unknown; -1 the return
	n       int
	entries []Entry
	loads   map[[2]string]float64 // load's answers so far
}

// leak is a conductance from every node to the return, far below any
// resistor's: it keeps a net that no resistor reaches solvable, and puts a
// diode without a DC path at an "infinite" load.
const (
	leak       = 1e-13 // S
	noLoadOhms = 1e11  // a load this high is no DC path at all
)

func newDCNet(c *graph.Circuit) *dcNet {
	uf := &graph.NamedSets{}
	for _, n := range c.Nets {
		if n.Role.IsACGround() {
			uf.Union(groundName, n.Name)
		}
	}
	var rs []struct {
		a, b string
		r    float64
	}
	addR := func(p *graph.Part, pa, pb string, r float64) {
		a, b := p.NetOf(pa), p.NetOf(pb)
		if !usable(a) || !usable(b) {
			return
		}
		if r == 0 {
			uf.Union(a, b)
			return
		}
		rs = append(rs, struct {
			a, b string
			r    float64
		}{a, b, r})
	}
	for _, p := range c.Parts {
		switch p.Kind {
		case graph.Resistor:
			addR(p, "1", "2", p.Value.Max)
		case graph.Pot:
			addR(p, "1", "w", p.Set*p.Value.Max)
			addR(p, "w", "2", (1-p.Set)*p.Value.Max)
		case graph.Inductor, graph.Transformer:
			if len(p.Windings) == 0 {
				joinPins(uf, p, "1", "2")
			}
			for _, w := range p.Windings {
				joinPins(uf, p, w.From, w.To)
			}
		case graph.Switch:
			if pos := int(p.Set); pos >= 1 && pos <= len(p.Closes) {
				for _, pr := range p.Closes[pos-1] {
					joinPins(uf, p, pr[0], pr[1])
				}
			}
		}
	}
	d := &dcNet{uf: uf, node: map[string]int{}, loads: map[[2]string]float64{}}
	ground := uf.Find(groundName)
	id := func(net string) int {
		r := uf.Find(net)
		if r == ground {
			return -1
		}
		if i, ok := d.node[r]; ok {
			return i
		}
		d.node[r] = d.n
		d.n++
		return d.n - 1
	}
	for _, n := range c.Nets {
		if usable(n.Name) {
			id(n.Name)
		}
	}
	for _, r := range rs {
		d.stamp(id(r.a), id(r.b), 1/r.r)
	}
	for i := 0; i < d.n; i++ {
		d.entries = append(d.entries, Entry{i, i, leak})
	}
	d.node[ground] = -1
	return d
}

func (d *dcNet) stamp(a, b int, g float64) {
	if a >= 0 {
		d.entries = append(d.entries, Entry{a, a, g})
	}
	if b >= 0 {
		d.entries = append(d.entries, Entry{b, b, g})
	}
	if a >= 0 && b >= 0 {
		d.entries = append(d.entries, Entry{a, b, -g}, Entry{b, a, -g})
	}
}

// load is the DC resistance between two nets; +Inf when no DC path joins
// them, 0 when DC sees them as one node.
func (d *dcNet) load(a, b string) float64 {
	if !usable(a) || !usable(b) {
		return math.Inf(1)
	}
	na, oka := d.node[d.uf.Find(a)]
	nb, okb := d.node[d.uf.Find(b)]
	if !oka || !okb {
		return math.Inf(1)
	}
	if na == nb {
		return 0
	}
	k := [2]string{a, b}
	if r, ok := d.loads[k]; ok {
		return r
	}
	r := d.solveLoad(na, nb)
	d.loads[k] = r
	return r
}

// solveLoad is the DC resistance between unknowns na and nb (-1 the return).
func (d *dcNet) solveLoad(na, nb int) float64 {
	rhs := make([]float64, d.n)
	if na >= 0 {
		rhs[na] = 1
	}
	if nb >= 0 {
		rhs[nb] = -1
	}
	v, err := SolveReal(d.n, d.entries, rhs)
	if err != nil {
		return math.Inf(1)
	}
	at := func(i int) float64 {
		if i < 0 {
			return 0
		}
		return v[i]
	}
	r := at(na) - at(nb)
	if r > noLoadOhms {
		return math.Inf(1)
	}
	return r
}
