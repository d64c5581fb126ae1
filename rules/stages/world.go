// The circuit as the matcher sees it: nets as small integers with AC ground
// folded into one, and each part's terminals and coils.

package stages

import (
	"sync"

	"pare/graph"
	"pare/graph/dc"
)

// world is the circuit as the matcher sees it: nets as small integers, every
// AC-ground net folded into net 0 (in full-circuit mode only chassis/ground
// nets are folded, so rails stay apart), terminals by part.
type world struct {
	c      *graph.Circuit
	full   bool
	names  []string     // net id → name ("⏚" for the folded ground)
	role   []graph.Role // net id → role
	netID  map[string]int
	parts  []*graph.Part
	pins   [][]int // part index → net id per pin (aligned with Part.Pins)
	conns  [][]int // net id → part indices, sorted, unique
	byKind map[graph.Kind][]int
	coils  [][]coil // part index → coils of a transformer
	orig   *world   // the original circuit, folded the same way, when known
	// op is the DC operating point of the original circuit (on the
	// original's world), nil when it was not solved or not given.
	op    *dc.Point
	isEnd []bool // net id → a declared input or output of the circuit or a region
	// onGround lists the parts with every terminal at AC ground (a reduced
	// circuit has none; a full one has its decoupling).
	onGround []int
	resAdj   map[int][]branch    // net → resistive branches, built on first use
	roles    [][]graph.TermRole  // part index → role per pin
	index    map[*graph.Part]int // part → its index
	dist     order               // part ref → distance from the inputs, built on first use
	fwd      order               // dist walked the way the signal flows (forwardOrder), built on first use
	// walks are the formula's tracking walks done on this world
	// (formulaWalk), by the tanks they walk.
	walks map[formulaWalkKey]walkMemo
	// rx is c's region index, taken once: the pieces cut from c share c's
	// regions and answer with it (pieceCircuit), where each of their
	// elaborations took the snapshot of every region of the set again,
	// which made a whole set's figures grow with its square.
	rx *graph.RegionIndex
	// netAt is each net's place in c.Nets: a piece lists its nets in the
	// circuit's order without reading every net of the set (cutFreed).
	netAt map[string]int
	// across lists, by the two nets (the lower id first), the
	// two-terminal capacitors across them in part order (capsAcross).
	across map[[2]int][]int
	// lazy guards what is built or remembered on first use (resAdj,
	// dist, walks): the kept stages' figures are solved side by side
	// (solveFigures), each reading the one world.
	lazy sync.Mutex
}

// signalDist is each part's breadth-first distance from the circuit's
// inputs (signalOrder), built once per world.
func (w *world) signalDist() order {
	w.lazy.Lock()
	defer w.lazy.Unlock()
	if w.dist == nil {
		w.dist = signalOrder(w.c)
	}
	return w.dist
}

// forwardDist is each part's distance from the circuit's inputs walked
// the way the signal flows (forwardOrder), built once per world.
func (w *world) forwardDist() order {
	if w.fwd == nil {
		w.fwd = forwardOrder(w.c)
	}
	return w.fwd
}

// isInput tells whether a net is a declared input of the circuit.
func (w *world) isInput(net int) bool {
	for _, n := range w.c.Inputs {
		if id, ok := w.netID[n]; ok && id == net {
			return true
		}
	}
	return false
}

// coil is one winding of a transformer as the pattern sees it: two ends,
// or end, tap, end for a centre-tapped winding.
type coil struct {
	pins []string // pin names
	l    float64  // total inductance end to end
	q    float64
	name string // winding name (first half for a tapped one)
}

const groundNet = 0

func newWorld(c *graph.Circuit, full bool, acGround map[string]bool) *world {
	return newWorldJoined(c, full, acGround, nil)
}

// newWorldJoined is newWorld with the nets of each set in join made one
// (join maps a net to its set's representative; nil joins nothing).
func newWorldJoined(c *graph.Circuit, full bool, acGround map[string]bool, join map[string]string) *world {
	w := &world{c: c, full: full, netID: map[string]int{}, byKind: map[graph.Kind][]int{}, rx: c.RegionIndex(),
		netAt: make(map[string]int, len(c.Nets))}
	w.names = append(w.names, "⏚")
	w.role = append(w.role, graph.Ground)
	folded := map[string]bool{}
	for i, n := range c.Nets {
		if _, ok := w.netAt[n.Name]; !ok {
			w.netAt[n.Name] = i
		}
		f := n.Role == graph.Ground
		if !full {
			f = n.Role.IsACGround() || acGround[n.Name]
		}
		if f {
			folded[n.Name] = true
			if r, ok := join[n.Name]; ok {
				folded[r] = true
			}
		}
	}
	repID := map[string]int{}
	for _, n := range c.Nets {
		r, joined := join[n.Name]
		if folded[n.Name] || joined && folded[r] {
			w.netID[n.Name] = groundNet
			continue
		}
		if id, ok := repID[r]; joined && ok {
			w.netID[n.Name] = id
			continue
		}
		w.netID[n.Name] = len(w.names)
		if joined {
			repID[r] = w.netID[n.Name]
		}
		w.names = append(w.names, n.Name)
		w.role = append(w.role, n.Role)
	}
	w.parts = c.Parts
	w.pins = make([][]int, len(c.Parts))
	w.roles = make([][]graph.TermRole, len(c.Parts))
	w.index = make(map[*graph.Part]int, len(c.Parts))
	for i, p := range c.Parts {
		w.index[p] = i
		w.roles[i] = make([]graph.TermRole, len(p.Pins))
		for j, pin := range p.Pins {
			w.roles[i][j] = graph.RoleOfPin(p.Kind, pin.Name)
		}
	}
	for i, p := range c.Parts {
		w.byKind[p.Kind] = append(w.byKind[p.Kind], i)
		ids := make([]int, len(p.Pins))
		for j, pin := range p.Pins {
			id, ok := w.netID[pin.Net]
			if !ok || pin.Net == "nc" {
				// An unconnected terminal, or a net the part list alone
				// names: a net of its own that nothing else shares.
				id = len(w.names)
				w.names = append(w.names, pin.Net)
				w.role = append(w.role, graph.Signal)
			}
			ids[j] = id
		}
		w.pins[i] = ids
	}
	for i, ids := range w.pins {
		all := len(ids) > 0
		for _, id := range ids {
			if id != groundNet {
				all = false
			}
		}
		if all {
			w.onGround = append(w.onGround, i)
		}
	}
	w.conns = make([][]int, len(w.names))
	for i, ids := range w.pins {
		for _, id := range ids {
			if l := w.conns[id]; len(l) == 0 || l[len(l)-1] != i {
				w.conns[id] = append(w.conns[id], i)
			}
		}
	}
	w.across = capsAcross(w)
	w.isEnd = make([]bool, len(w.names))
	ends := append(append([]string(nil), c.Inputs...), c.Outputs...)
	for _, r := range c.Regions {
		ends = append(ends, r.Input, r.Output)
	}
	for _, n := range ends {
		if id, ok := w.netID[n]; ok && id != groundNet {
			w.isEnd[id] = true
		}
	}
	w.coils = make([][]coil, len(c.Parts))
	for i, p := range c.Parts {
		if p.Kind == graph.Transformer {
			w.coils[i] = coilsOf(p)
		}
	}
	return w
}

// coilsOf joins the halves of a centre-tapped winding (two windings meeting
// at a pin, fully coupled) into one coil with a tap.
func coilsOf(p *graph.Part) []coil {
	var out []coil
	used := map[int]bool{}
	for i, a := range p.Windings {
		if used[i] {
			continue
		}
		joined := false
		for j, b := range p.Windings {
			if j == i || used[j] || a.To != b.From || p.K(a.Name, b.Name) < 0.999 {
				continue
			}
			l := a.L + b.L + 2*p.K(a.Name, b.Name)*sqrt(a.L*b.L)
			out = append(out, coil{pins: []string{a.From, a.To, b.To}, l: l, q: a.Q, name: a.Name})
			used[i], used[j], joined = true, true, true
			break
		}
		if !joined {
			used[i] = true
			out = append(out, coil{pins: []string{a.From, a.To}, l: a.L, q: a.Q, name: a.Name})
		}
	}
	return out
}

// pinNet gives the net id of part i's terminal name, -1 if it has none.
func (w *world) pinNet(i int, name string) int {
	for j, pin := range w.parts[i].Pins {
		if pin.Name == name {
			return w.pins[i][j]
		}
	}
	return -1
}

// switchJoins maps each net a switch at its set position joins to another
// to the representative of the nets so joined: a closed contact is a wire,
// so a tuned circuit reached through a wavechange wafer is one tank (as the
// AC solver sees it, graph/ac's elaboration). Nets no closed contact
// touches are absent.
func switchJoins(c *graph.Circuit) map[string]string {
	var sets graph.NamedSets
	var touched []string
	for _, p := range c.Parts {
		pos := int(p.Set)
		if p.Kind != graph.Switch || pos < 1 || pos > len(p.Closes) {
			continue
		}
		for _, pr := range p.Closes[pos-1] {
			a, b := p.NetOf(pr[0]), p.NetOf(pr[1])
			if a == "" || b == "" || a == "nc" || b == "nc" {
				continue
			}
			sets.Union(a, b)
			touched = append(touched, a, b)
		}
	}
	if len(touched) == 0 {
		return nil
	}
	out := make(map[string]string, len(touched))
	for _, n := range touched {
		out[n] = sets.Find(n)
	}
	return out
}
