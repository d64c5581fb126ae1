package dc

import (
	"fmt"
	"math"

	"pare/graph"
	dev "pare/graph/device"
)

// A terminal is a free node (index ≥ 0) or a fixed one (−1 − index into
// fixedV). Chassis, declared rails and heater nets are fixed: the DC analysis
// eliminates them instead of adding branch equations, which keeps the matrix
// a nodal conductance matrix with a diagonal everywhere.
type term = int

// branch is a linear conductance between two terminals: a resistor, a pot
// section, a winding's DC resistance, a capacitor's leakage, a meter, or an
// injected fault.
type branch struct {
	ref, what string // part and which element of it ("", "1w", winding name)
	a, b      term
	g         float64
}

// device kinds.
const (
	devValve = iota
	devValveDiode
	devDiode
	devBJT
	devFET
)

// device is a nonlinear element; t holds its terminals in the law's order:
// valve a, g1, g2, k (g2 = −0 when absent); valve diode and diode a, k;
// BJT b, c, e; FET g, d, s.
type device struct {
	ref   string
	pins  []string // the pin name of each terminal, for currents per pin
	kind  int
	t     []term
	valve valveLaw
	bjt   bjtLaw
	fet   fetLaw
	is    float64 // diode saturation current; valve diode perveance
	n     float64 // diode ideality factor
	// zener is a zener's breakdown, added to its junction's current when
	// breaks (it declares a breakdown voltage).
	zener  dev.Zener
	breaks bool
	// Faults: emission scales the valve's perveance; openBE and openBC
	// remove a junction.
	emission       float64
	openBE, openBC bool
}

// model is a circuit elaborated for the DC analysis.
type model struct {
	circuit  *graph.Circuit
	nodeNet  []string // free node → net name (the canonical net of a joined group)
	fixedNet []string
	fixedV   []float64
	netTerm  map[string]term // every net of the circuit (joined nets share a terminal)
	floating []bool          // free node with no DC path to a fixed net
	chassis  term            // the 0 V reference meters return to
	branches []branch
	devices  []device
	caps     []branch // capacitors: open, with their leakage (g may be 0); pairs kept for faults
	origins  []Origin
	warnings []string
	unheld   []string // supply nets that declare no volts and are not estimated
	gmin     float64
	// Rails estimated from a captured rectifier (rectifier.go): the
	// rectifier, the index of its reservoir net in fixedV, and the last
	// estimate of each.
	rects     []rectifier
	rectFixed []int
	estimates []Estimate
}

// build elaborates c. Zero-ohm parts and closed switch contacts join nets;
// heater pins are left out (the heater is its own circuit); ports and
// generic parts carry no DC current.
func build(c *graph.Circuit) (*model, error) {
	m := &model{circuit: c, netTerm: map[string]term{}, gmin: def("gmin", "g")}
	uf := &graph.NamedSets{} // the one union-find: the smallest name stands for a group
	joinShorts(c, uf)
	rects, err := findRectifiers(c)
	if err != nil {
		return nil, err
	}
	m.rects = rects
	m.warnings = append(m.warnings, mainsHints(c, rects)...)
	if err := m.assignNodes(c, uf); err != nil {
		return nil, err
	}
	var o origins
	for _, p := range c.Parts {
		if err := m.addPart(p, &o); err != nil {
			return nil, err
		}
	}
	m.origins = o.list
	m.markFloating()
	return m, nil
}

// joinShorts joins the nets of zero-ohm parts and of closed switch contacts.
func joinShorts(c *graph.Circuit, uf *graph.NamedSets) {
	union := func(a, b string) {
		if a != "" && b != "" {
			uf.Union(a, b)
		}
	}
	for _, p := range c.Parts {
		switch p.Kind {
		case graph.Switch:
			pos := int(p.Set)
			if pos >= 1 && pos <= len(p.Closes) {
				for _, pr := range p.Closes[pos-1] {
					union(p.NetOf(pr[0]), p.NetOf(pr[1]))
				}
			}
		case graph.Resistor:
			if p.Value.Max == 0 {
				union(p.NetOf("1"), p.NetOf("2"))
			}
		case graph.Pot:
			if p.Value.Max == 0 || p.Set <= 0 {
				union(p.NetOf("1"), p.NetOf("w"))
			}
			if p.Value.Max == 0 || p.Set >= 1 {
				union(p.NetOf("w"), p.NetOf("2"))
			}
		}
	}
}

// fixedVolts says whether a net is held by declaration and at what voltage:
// chassis at 0 V, a rail or bias supply at its declared volts, a heater net
// at 0 V DC (the heater supply is AC, or a separate chain).
func fixedVolts(n *graph.Net) (float64, bool) {
	switch n.Role {
	case graph.Ground, graph.Heater:
		return 0, true
	case graph.Supply, graph.Bias:
		if n.HasVolts() {
			return n.Volts, true
		}
	}
	return 0, false
}

func (m *model) assignNodes(c *graph.Circuit, uf *graph.NamedSets) error {
	groupTerm := map[string]term{}
	groupV := map[string]float64{}
	// Fixed groups first, in net order; two different voltages joined is bad input.
	estimated := map[string]int{} // reservoir net → its rectifier
	for k, r := range m.rects {
		estimated[r.held()] = k
	}
	m.rectFixed = make([]int, len(m.rects))
	for _, n := range c.Nets {
		v, ok := fixedVolts(n)
		k, est := estimated[n.Name]
		if est {
			v, ok = m.heldEstimate(n, k)
		}
		if !ok {
			continue
		}
		root := uf.Find(n.Name)
		if t, seen := groupTerm[root]; seen {
			if est {
				m.rectFixed[k] = -1 - t
			}
			if groupV[root] != v {
				return fmt.Errorf("%s: net %s (%g V) is joined to %s (%g V) through zero-ohm parts or switch contacts",
					n.Pos, n.Name, v, m.fixedNet[-1-t], groupV[root])
			}
			continue
		}
		groupTerm[root] = -1 - len(m.fixedNet)
		groupV[root] = v
		if est {
			m.rectFixed[k] = len(m.fixedNet)
		}
		m.fixedNet = append(m.fixedNet, n.Name)
		m.fixedV = append(m.fixedV, v)
	}
	m.chassis = 0
	for _, n := range c.Nets {
		if n.Role == graph.Ground {
			m.chassis = groupTerm[uf.Find(n.Name)]
			break
		}
	}
	if m.chassis == 0 { // no chassis net: a 0 V reference of our own
		m.chassis = -1 - len(m.fixedNet)
		m.fixedNet = append(m.fixedNet, "")
		m.fixedV = append(m.fixedV, 0)
	}
	for _, n := range c.Nets {
		root := uf.Find(n.Name)
		t, seen := groupTerm[root]
		if !seen {
			t = len(m.nodeNet)
			groupTerm[root] = t
			m.nodeNet = append(m.nodeNet, n.Name)
		}
		m.netTerm[n.Name] = t
		if _, est := estimated[n.Name]; !est && n.Role == graph.Supply && n.Volts == 0 {
			m.unheld = append(m.unheld, n.Name) // a note only when no rail feeds it (Solve)
		}
	}
	return nil
}

// heldEstimate starts an estimated rail at its rectifier's unloaded peak
// (solveRails moves it), with a warning when the net also declares volts.
func (m *model) heldEstimate(n *graph.Net, k int) (float64, bool) {
	if n.HasVolts() {
		m.warnings = append(m.warnings, fmt.Sprintf("rail %s declares %g V; it is held at the estimate from %s's rectifier instead", n.Name, n.Volts, m.rects[k].source()))
	}
	return m.rects[k].peak, true
}

func (m *model) term(p *graph.Part, pin string) (term, bool) {
	net := p.NetOf(pin)
	if net == "" {
		return 0, false
	}
	t, ok := m.netTerm[net]
	return t, ok
}

func (m *model) addBranch(p *graph.Part, what, pa, pb string, r float64) {
	a, okA := m.term(p, pa)
	b, okB := m.term(p, pb)
	if !okA || !okB || !(r > 0) || math.IsInf(r, 0) {
		return
	}
	m.branches = append(m.branches, branch{ref: p.Ref, what: what, a: a, b: b, g: 1 / r})
}

func (m *model) addPart(p *graph.Part, o *origins) error {
	switch p.Kind {
	case graph.Resistor:
		m.addBranch(p, "", "1", "2", p.Value.Max)
	case graph.Loudspeaker:
		// the voice coil is a DC path: the same resistance the AC model
		// gives it (docs/netlist.md), so a speaker returned straight to a
		// feedback network or an output's midpoint carries its current
		m.addBranch(p, "", "1", "2", p.Value.Max)
	case graph.Pot:
		m.addBranch(p, "1w", "1", "w", p.Set*p.Value.Max)
		m.addBranch(p, "w2", "w", "2", (1-p.Set)*p.Value.Max)
	case graph.Inductor, graph.Transformer:
		m.addWindings(p, o)
	case graph.Capacitor:
		a, okA := m.term(p, p.Pins[0].Name)
		b, okB := m.term(p, p.Pins[len(p.Pins)-1].Name)
		if okA && okB && len(p.Pins) == 2 {
			g := 0.0
			if leak, ok := p.Param("leak"); ok && leak > 0 {
				g = 1 / leak
			}
			m.caps = append(m.caps, branch{ref: p.Ref, a: a, b: b, g: g})
		}
	case graph.Valve, graph.BJT, graph.FET, graph.Diode:
		return m.addDevice(p, o)
	case graph.Generic:
		return m.addLED(p, o)
	}
	return nil
}

// addWindings gives every winding its DC resistance: its own rdc when the
// winding gives one, else the part's rdc (the same for each winding, each
// half of a centre-tapped one: tap to end), else the small default.
func (m *model) addWindings(p *graph.Part, o *origins) {
	own := 0
	for _, w := range p.Windings {
		if w.Rdc > 0 {
			own++
			o.list = append(o.list, Origin{p.Ref, "rdc " + w.Name, w.Rdc, "Ω", "given for winding " + w.Name})
		}
	}
	rdc := 0.0
	if own < len(p.Windings) || len(p.Windings) == 0 {
		rdc = o.given(p, "rdc", "winding", "Ω")
	}
	if len(p.Windings) == 0 {
		m.addBranch(p, "", "1", "2", rdc)
		return
	}
	for _, w := range p.Windings {
		r := rdc
		if w.Rdc > 0 {
			r = w.Rdc
		}
		m.addBranch(p, w.Name, w.From, w.To, r)
	}
}

// markFloating finds free nodes with no conducting path to a fixed net
// through branches, diodes or transistor junctions: their voltage is set by
// something off this sheet (an AGC line, a port) and the chart says so.
func (m *model) markFloating() {
	n := len(m.nodeNet)
	adj := make([][]int, n)
	link := func(a, b term) {
		if a >= 0 && b >= 0 {
			adj[a] = append(adj[a], b)
			adj[b] = append(adj[b], a)
		}
	}
	reached := make([]bool, n)
	var queue []int
	seed := func(a, b term) {
		for _, t := range [][2]term{{a, b}, {b, a}} {
			if t[0] >= 0 && t[1] < 0 && !reached[t[0]] {
				reached[t[0]] = true
				queue = append(queue, t[0])
			}
		}
	}
	for _, b := range m.branches {
		link(b.a, b.b)
		seed(b.a, b.b)
	}
	for _, c := range m.caps {
		if c.g > 0 {
			link(c.a, c.b)
			seed(c.a, c.b)
		}
	}
	for _, d := range m.devices {
		for i := 1; i < len(d.t); i++ {
			link(d.t[0], d.t[i])
			seed(d.t[0], d.t[i])
		}
	}
	for h := 0; h < len(queue); h++ {
		for _, w := range adj[queue[h]] {
			if !reached[w] {
				reached[w] = true
				queue = append(queue, w)
			}
		}
	}
	m.floating = make([]bool, n)
	for i := range m.floating {
		m.floating[i] = !reached[i]
	}
}
