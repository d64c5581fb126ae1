package ac

import (
	"fmt"
	"math"
	"sort"

	"pare/graph"
	"pare/graph/device"
)

// The small-signal circuit: every part turned into primitive elements on
// numbered nodes. Both the solver and the SPICE writer work from this one
// list, so what pare solves and what it hands to a simulator cannot drift
// apart.

type primKind int

const (
	primR    primKind = iota // resistor, v ohms
	primC                    // capacitor, v farads
	primRL                   // r in series with l: an uncoupled winding
	primRLC                  // r, l, c in series: a crystal's motional arm
	primVCCS                 // current v·(V(c)−V(d)) from a through the element to b
)

// prim is one primitive element between nodes a and b (0 is ground).
type prim struct {
	kind    primKind
	ref     string // the part it models
	sub     string // which piece of the part: "ra", "gm", winding name, ...
	a, b    int
	c, d    int // control nodes of a VCCS
	v       float64
	r, l, C float64
}

// winding is one coil of a coupled group, carrying a branch current.
type winding struct {
	name string // winding name within its part
	a, b int
	r, l float64
}

// mutual is the coupling of two windings of a group: M = k·√(La·Lb).
type mutual struct {
	i, j int
	k, m float64
}

// group is a set of magnetically coupled windings of one part.
type group struct {
	ref   string
	winds []winding
	muts  []mutual
}

// netlist is the elaborated small-signal circuit.
type netlist struct {
	nodes   []string       // node names; nodes[0] is ground
	netNode map[string]int // net name -> node
	prims   []prim
	groups  []group
	// portHeld lists the port nets held at 0 V because nothing else gives
	// their group of nets a path to ground (portHeldNets), sorted.
	portHeld []string
	// heldVia lists the generic parts (an inlet, a plug) through which a
	// held group is reached, in part order.
	heldVia []string
}

// ncNet marks a terminal that is not connected (docs/netlist.md).
const ncNet = "nc"

const groundName = "\x00ground" // sorts first; never a legal net name

// elaborate turns a circuit into primitive elements. Nets with an AC-ground
// role are ground; closed switch contacts, zero-ohm resistors, pot ends at a
// wiper set to 0 or 1 and zero inductances join nets. The nets of a port
// that is the only way in to a group of nets with no path to ground are
// held at 0 V as well (see portHeldNets).
func elaborate(c *graph.Circuit, o Options) (*netlist, error) {
	return elaborateShared(c, o, &dcShare{})
}

// dcShare carries one circuit's DC view from one elaboration to the next:
// the detectors' DC loads do not depend on the gang setting, and each is a
// solve of the circuit's whole DC network, so a comparison or a loop search
// that elaborates a circuit at several settings finds them once.
type dcShare struct{ net *dcNet }

// elaborateShared is elaborate with the DC view of c shared through dc.
func elaborateShared(c *graph.Circuit, o Options, dc *dcShare) (*netlist, error) {
	nl, err := build(c, o, nil, dc)
	if err != nil {
		return nil, err
	}
	held := portHeldNets(c, nl)
	if len(held) == 0 {
		return nl, nil
	}
	if nl, err = build(c, o, held, dc); err != nil {
		return nil, err
	}
	nl.portHeld = held
	nl.heldVia = genericWaysIn(c, held)
	return nl, nil
}

// genericWaysIn lists the generic parts with a terminal on a held net, so
// the note can say which part was taken as the way in.
func genericWaysIn(c *graph.Circuit, held []string) []string {
	var refs []string
	for _, p := range c.Parts {
		if p.Kind != graph.Generic {
			continue
		}
		for _, pin := range p.Pins {
			if contains(held, pin.Net) {
				refs = append(refs, p.Ref)
				break
			}
		}
	}
	return refs
}

// portHeldNets finds the port nets of groups of nets that nothing connects
// to ground or to a declared input through a part that conducts at AC: a
// mains primary brought in on two ports or a two-pin inlet (a generic part
// counts as a way in, entersFromOutside), a winding wired to a socket, the
// far winding of a transformer at the edge of a focus cut. Such a group is
// reached only from outside, through its ports, so for the small-signal
// model a port is a source that is not driven (or the reference of what
// lies beyond), and an undriven ideal source is 0 V: its nets are held at
// ground, just as a transfer holds the circuit's other declared inputs at
// 0 V (superposition). A mains primary is then shorted by the supply, which
// is what a stiff supply does. A port on a declared output is where the
// signal is measured, not fed, and is never held. Without this the group
// floats and no solution exists; a stated termination (Options.Terminate) on
// a port net gives the group its own path to ground and overrides it.
// Returned sorted.
func portHeldNets(c *graph.Circuit, nl *netlist) []string {
	var sets graph.DisjointSets
	find := sets.Find
	join := func(a, b int) {
		if a >= 0 && b >= 0 { // an element to ground on one side only
			sets.Union(a, b)
		}
	}
	for _, p := range nl.prims {
		if p.kind != primVCCS {
			join(p.a, p.b)
		}
	}
	for _, g := range nl.groups {
		for _, w := range g.winds {
			join(w.a, w.b)
		}
	}
	// The declared inputs are driven or held at 0 V in every solve.
	for _, in := range c.Inputs {
		if n, ok := nl.netNode[in]; ok {
			join(0, n)
		}
	}
	outputs := map[string]bool{}
	for _, out := range c.Outputs {
		outputs[out] = true
	}
	seen := map[string]bool{}
	var held []string
	for _, p := range c.Parts {
		if !entersFromOutside(p) {
			continue
		}
		for _, pin := range p.Pins {
			n, ok := nl.netNode[pin.Net]
			if !ok || !usable(pin.Net) || find(n) == find(0) || seen[pin.Net] || outputs[pin.Net] {
				continue
			}
			seen[pin.Net] = true
			held = append(held, pin.Net)
		}
	}
	sort.Strings(held)
	return held
}

// entersFromOutside tells whether a part is a way in from outside what the
// model describes: a port, or a generic part (a mains inlet, a plug, a
// socket), which the model leaves open. A mains primary wired to a two-pin
// inlet is then held just as one brought in on two ports: the capture's
// choice of symbol must not decide whether the circuit solves.
func entersFromOutside(p *graph.Part) bool {
	return p.Kind == graph.Port || p.Kind == graph.Generic
}

// build is elaborate with the nets in held joined to ground.
func build(c *graph.Circuit, o Options, held []string, dc *dcShare) (*netlist, error) {
	frac := 0.5
	if o.VarSet {
		frac = o.VarFrac
	}
	if !(frac >= 0 && frac <= 1) {
		return nil, fmt.Errorf("gang setting %g: give a fraction of the travel from 0 to 1", frac)
	}
	nl := numberNodes(c, joinNets(c, o, held))
	st := &stamper{nl: nl, c: c, frac: frac, dc: dc}
	for _, p := range c.Parts {
		st.part(c, p)
	}
	st.terminations(c, o)
	if err := st.errs.Err(); err != nil {
		st.errs.Sort()
		return nil, st.errs
	}
	return nl, nil
}

// joinNets finds the nets the model treats as one node: AC-ground nets and
// held nets with ground, closed switch contacts, zero-ohm resistors, pot
// ends at a wiper set to 0 or 1, zero inductances, and nets terminated in
// 0 Ω with ground.
func joinNets(c *graph.Circuit, o Options, held []string) *graph.NamedSets {
	uf := &graph.NamedSets{}
	for _, n := range c.Nets {
		if n.Role.IsACGround() {
			uf.Union(groundName, n.Name)
		}
	}
	for _, n := range held {
		uf.Union(groundName, n)
	}
	for _, p := range c.Parts {
		switch p.Kind {
		case graph.Switch:
			pos := int(p.Set)
			if pos >= 1 && pos <= len(p.Closes) {
				for _, pr := range p.Closes[pos-1] {
					a, b := p.NetOf(pr[0]), p.NetOf(pr[1])
					if usable(a) && usable(b) {
						uf.Union(a, b)
					}
				}
			}
		case graph.Resistor:
			if p.Value.Max == 0 {
				joinPins(uf, p, "1", "2")
			}
		case graph.Inductor:
			if len(p.Windings) == 0 && p.Value.Max == 0 {
				joinPins(uf, p, "1", "2")
			}
		case graph.Pot:
			if p.Value.Max == 0 || p.Set <= 0 {
				joinPins(uf, p, "1", "w")
			}
			if p.Value.Max == 0 || p.Set >= 1 {
				joinPins(uf, p, "w", "2")
			}
		}
	}
	for net, val := range o.Terminate {
		if val == 0 {
			uf.Union(groundName, net)
		}
	}
	return uf
}

// numberNodes numbers the nodes: the representatives of uf sorted by name,
// ground first.
func numberNodes(c *graph.Circuit, uf *graph.NamedSets) *netlist {
	nl := &netlist{netNode: map[string]int{}}
	reps := map[string]bool{}
	for _, n := range c.Nets {
		if n.Name == ncNet {
			continue
		}
		reps[uf.Find(n.Name)] = true
	}
	names := make([]string, 0, len(reps))
	for r := range reps {
		if r != uf.Find(groundName) {
			names = append(names, r)
		}
	}
	sort.Strings(names)
	nl.nodes = append([]string{"0"}, names...)
	repNode := map[string]int{uf.Find(groundName): 0}
	for i, r := range names {
		repNode[r] = i + 1
	}
	for _, n := range c.Nets {
		if n.Name == ncNet {
			continue
		}
		nl.netNode[n.Name] = repNode[uf.Find(n.Name)]
	}
	return nl
}

func usable(net string) bool { return net != "" && net != ncNet }

func joinPins(uf *graph.NamedSets, p *graph.Part, a, b string) {
	na, nb := p.NetOf(a), p.NetOf(b)
	if usable(na) && usable(nb) {
		uf.Union(na, nb)
	}
}

// windings elaborates an inductor or transformer. Windings that no coupling
// ties to another become series R–L elements; coupled ones form a group with
// branch currents. Winding loss: Q is taken as the coil's Q at the frequency
// it works at (its q_at, else the resonance of the tank it tunes,
// graph.Circuit.ReferQ; failing both, the centre of its band), giving a
// constant series resistance R = ω0·L/Q (device.WindingLoss; the
// sections of a tapped winding share the loss of the whole coil). A constant R is what a
// simulator deck can carry, so pare and the exported deck solve the same
// circuit; over a tuning band the real Q of a coil is roughly flat, so a
// constant R errs by the band's frequency ratio at worst, on the side of less
// loss at the low edge. centre gives the centre of the coil's band
// (graph.Circuit.BandCentre), asked only for a coil with windings.
func (nl *netlist) windings(p *graph.Part, centre func() float64, node func(string) int, errs *graph.ErrorList) {
	if len(p.Windings) == 0 {
		if p.Value.Max > 0 {
			a, b := node(p.NetOf("1")), node(p.NetOf("2"))
			if a >= 0 && b >= 0 && a != b {
				r, _ := p.Param("rdc") // a choke's declared copper, in series (device.WindingRdc)
				nl.prims = append(nl.prims, prim{kind: primRL, ref: p.Ref, a: a, b: b, r: max(r, 0), l: p.Value.Max})
			}
		}
		return
	}
	loss := device.WindingLoss(p, 2*math.Pi*centre())
	var ws []winding
	index := map[string]int{}
	for wi, w := range p.Windings {
		if w.L <= 0 {
			errs.Add(p.Pos, "%s %s: winding %s has no inductance", p.Kind, p.Ref, w.Name)
			continue
		}
		a, b := node(p.NetOf(w.From)), node(p.NetOf(w.To))
		if a < 0 || b < 0 {
			continue // an open winding carries no current and so couples nothing
		}
		index[w.Name] = len(ws)
		ws = append(ws, winding{name: w.Name, a: a, b: b, r: loss[wi], l: w.L})
	}
	coupled := make([]bool, len(ws))
	var muts []mutual
	for _, k := range p.Coupling {
		i, iok := index[k.A]
		j, jok := index[k.B]
		if !iok || !jok || k.K == 0 || i == j {
			continue
		}
		if k.K < 0 || k.K > 1 {
			errs.Add(p.Pos, "%s %s: coupling %s-%s is %g, outside 0..1", p.Kind, p.Ref, k.A, k.B, k.K)
			continue
		}
		muts = append(muts, mutual{i: i, j: j, k: k.K, m: k.K * math.Sqrt(ws[i].l*ws[j].l)})
		coupled[i], coupled[j] = true, true
	}
	g := group{ref: p.Ref}
	remap := make([]int, len(ws))
	for i, w := range ws {
		if coupled[i] {
			remap[i] = len(g.winds)
			g.winds = append(g.winds, w)
			continue
		}
		if w.a != w.b {
			nl.prims = append(nl.prims, prim{kind: primRL, ref: p.Ref, sub: w.name, a: w.a, b: w.b, r: w.r, l: w.l})
		}
	}
	for _, m := range muts {
		m.i, m.j = remap[m.i], remap[m.j]
		g.muts = append(g.muts, m)
	}
	if len(g.winds) > 0 {
		nl.groups = append(nl.groups, g)
	}
}
