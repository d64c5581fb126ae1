package stages

import (
	"errors"
	"fmt"
	"sort"
	"strings"

	"pare/graph"
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
	isEnd  []bool   // net id → a declared input or output of the circuit or a region
	// onGround lists the parts with every terminal at AC ground (a reduced
	// circuit has none; a full one has its decoupling).
	onGround []int
	resAdj   map[int][]branch    // net → resistive branches, built on first use
	roles    [][]graph.TermRole  // part index → role per pin
	index    map[*graph.Part]int // part → its index
	dist     order               // part ref → distance from the inputs, built on first use
}

// signalDist is each part's breadth-first distance from the circuit's
// inputs (signalOrder), built once per world.
func (w *world) signalDist() order {
	if w.dist == nil {
		w.dist = signalOrder(w.c)
	}
	return w.dist
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
	w := &world{c: c, full: full, netID: map[string]int{}, byKind: map[graph.Kind][]int{}}
	w.names = append(w.names, "⏚")
	w.role = append(w.role, graph.Ground)
	for _, n := range c.Nets {
		folded := n.Role == graph.Ground
		if !full {
			folded = n.Role.IsACGround() || acGround[n.Name]
		}
		if folded {
			w.netID[n.Name] = groundNet
			continue
		}
		w.netID[n.Name] = len(w.names)
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

// match is one place where a pattern variant fits.
type match struct {
	v     *variant
	parts []int // circuit part per variant part (search order)
	nets  []int // circuit net per vnet
	bind  []int // which binding of each part was used (for transformers: the coil assignment)
	coils [][]int
	refs  []string // sorted refs
}

// ErrSearchLimit is wrapped by the error Find returns when its step budget
// ran out; the stages found until then are still returned.
var ErrSearchLimit = errors.New("search limit reached")

type searcher struct {
	w        *world
	steps    int
	limit    int
	partUsed []bool
	netOwner []int // circuit net → vnet bound to it, -1 none (ground is shared)
	found    []*match
	seen     map[string]bool
	scratch  [][]binding // per search depth, reused
}

func (s *searcher) run(v *variant) error {
	for len(s.scratch) < len(v.parts) {
		s.scratch = append(s.scratch, nil)
	}
	m := &match{v: v, parts: make([]int, len(v.parts)), nets: make([]int, len(v.nets)), bind: make([]int, len(v.parts)), coils: make([][]int, len(v.parts))}
	for i := range m.nets {
		m.nets[i] = -1
	}
	return s.place(m, 0)
}

func (s *searcher) place(m *match, depth int) error {
	v := m.v
	if depth == len(v.parts) {
		s.complete(m)
		return nil
	}
	vp := &v.parts[depth]
	cands, ok := s.linked(m, vp)
	if !ok {
		for _, k := range vp.kinds {
			cands = append(cands, s.w.byKind[k]...)
		}
		if len(vp.kinds) > 1 {
			sort.Ints(cands)
		}
	}
	for _, ci := range cands {
		if s.partUsed[ci] || !s.accepts(vp, ci) {
			continue
		}
		s.scratch[depth] = s.bindings(vp.pp, ci, s.scratch[depth][:0])
		for bi := range s.scratch[depth] {
			b := &s.scratch[depth][bi]
			s.steps++
			if s.steps > s.limit {
				return fmt.Errorf("%w: pattern %s stopped after %d steps (raise the limit, or reduce the circuit first)", ErrSearchLimit, v.p.ID, s.limit)
			}
			var newly []int
			ok := true
			for slot, net := range b.nets() {
				vn := vp.slots[slot]
				if cur := m.nets[vn]; cur >= 0 {
					if cur != net {
						ok = false
						break
					}
					continue
				}
				if !s.netFits(&v.nets[vn], net) {
					ok = false
					break
				}
				if net != groundNet && s.netOwner[net] >= 0 {
					ok = false
					break
				}
				m.nets[vn] = net
				if net != groundNet {
					s.netOwner[net] = vn
				}
				newly = append(newly, vn)
			}
			if ok {
				s.partUsed[ci] = true
				m.parts[depth], m.bind[depth] = ci, bi
				m.coils[depth] = append(m.coils[depth][:0], b.coil[:b.ncoil]...)
				if err := s.place(m, depth+1); err != nil {
					return err
				}
				s.partUsed[ci] = false
			}
			for _, vn := range newly {
				if net := m.nets[vn]; net != groundNet {
					s.netOwner[net] = -1
				}
				m.nets[vn] = -1
			}
		}
	}
	return nil
}

// linked draws a part's candidates from the terminals already placed: the
// placed non-ground net with the fewest connections, or, when every terminal
// is placed at AC ground, the parts that sit wholly on ground. ok is false
// when the part must be looked for among all parts of its kind.
func (s *searcher) linked(m *match, vp *vpart) ([]int, bool) {
	var best []int
	found, allPlaced := false, true
	for _, vn := range vp.slots {
		net := m.nets[vn]
		switch {
		case net < 0:
			allPlaced = false
		case net != groundNet:
			if l := s.w.conns[net]; !found || len(l) < len(best) {
				best, found = l, true
			}
		}
	}
	if found {
		return best, true
	}
	if allPlaced {
		return s.w.onGround, true
	}
	return nil, false
}

// netFits checks a vnet's "at" and degree against a circuit net.
func (s *searcher) netFits(vn *vnet, net int) bool {
	w := s.w
	switch vn.at {
	case "ground":
		if net != groundNet {
			return false
		}
	case "signal":
		if net == groundNet || w.full && w.role[net].IsACGround() {
			return false
		}
	case "rail":
		if net == groundNet || !w.role[net].IsACGround() {
			return false
		}
	case "not-ground":
		if net == groundNet {
			return false
		}
	}
	// Degree: the circuit net carries at least as many parts as the
	// pattern puts on it (parts are matched one to one).
	return net == groundNet || len(w.conns[net]) >= vn.parts
}

// complete checks the constraints that need the whole match, then records it.
func (s *searcher) complete(m *match) {
	w := s.w
	in := map[int]bool{}
	for _, ci := range m.parts {
		in[ci] = true
	}
	matchedNet := map[int]bool{}
	for _, n := range m.nets {
		matchedNet[n] = true
	}
	for vi, vn := range m.v.nets {
		net := m.nets[vi]
		if net <= groundNet || vn.outside == "" {
			continue // at AC ground, unconstrained, or used by absent parts only
		}
		var others []int
		for _, ci := range w.conns[net] {
			if !in[ci] {
				others = append(others, ci)
			}
		}
		switch vn.outside {
		case "none":
			if len(others) > 0 {
				return
			}
		case "some":
			if len(others) == 0 {
				return
			}
		case "source":
			fed := false
			for _, ci := range others {
				if k := w.parts[ci].Kind; k != graph.Resistor && k != graph.Capacitor {
					fed = true
				}
			}
			if !fed {
				return
			}
		case "signal":
			fed := w.isEnd[net]
			for _, ci := range others {
				if w.parts[ci].Kind == graph.Port {
					fed = true
				}
				for _, id := range w.pins[ci] {
					if id != groundNet && !matchedNet[id] && !(w.full && w.role[id].IsACGround()) {
						fed = true
					}
				}
			}
			if !fed {
				return
			}
		}
	}
	refs := make([]string, len(m.parts))
	for i, ci := range m.parts {
		refs[i] = w.parts[ci].Ref
	}
	sort.Strings(refs)
	key := m.v.p.ID + ":" + strings.Join(refs, ",")
	if s.seen[key] {
		return
	}
	s.seen[key] = true
	cp := &match{v: m.v, parts: append([]int(nil), m.parts...), nets: append([]int(nil), m.nets...),
		bind: append([]int(nil), m.bind...), coils: make([][]int, len(m.coils)), refs: refs}
	for i, c := range m.coils {
		cp.coils[i] = append([]int(nil), c...)
	}
	s.found = append(s.found, cp)
}

// deviceKindsOf maps a pattern device to the part kinds that may stand for it.
var deviceKindsOf = map[string][]graph.Kind{
	"active":       {graph.BJT, graph.FET, graph.Valve},
	"valve":        {graph.Valve},
	"double-diode": {graph.Valve},
	"bjt":          {graph.BJT},
	"fet":          {graph.FET},
	"resistor":     {graph.Resistor},
	"capacitor":    {graph.Capacitor},
	"inductor":     {graph.Inductor},
	"tapped-coil":  {graph.Inductor},
	"transformer":  {graph.Transformer},
	"diode":        {graph.Diode, graph.Valve},
	"crystal":      {graph.Crystal},
	"pot":          {graph.Pot},
	"element":      {graph.Capacitor, graph.Crystal, graph.Inductor, graph.Resistor},
}

func kindsFor(device string) []graph.Kind { return deviceKindsOf[device] }

// accepts filters a candidate by kind, type and value before any binding.
func (s *searcher) accepts(vp *vpart, ci int) bool {
	pp := vp.pp
	p := s.w.parts[ci]
	kindOK := false
	for _, k := range vp.kinds {
		if p.Kind == k {
			kindOK = true
		}
	}
	if !kindOK {
		return false
	}
	switch pp.Device {
	case "active", "valve":
		if !p.IsActive() {
			return false
		}
	case "diode":
		if p.Kind == graph.Valve && p.Type != "diode" && p.Type != "double-diode" {
			return false
		}
	case "double-diode":
		if p.Type != "double-diode" {
			return false
		}
	case "inductor":
		if len(p.Pins) != 2 {
			return false
		}
	case "tapped-coil":
		if len(p.Pins) != 3 || p.Pin("t") == nil {
			return false
		}
	}
	if len(pp.Types) > 0 && !contains(pp.Types, p.Type) {
		return false
	}
	if pp.Min > 0 || pp.Max > 0 {
		v := p.Value.Max
		if p.Kind == graph.Inductor {
			v = p.Inductance()
		}
		if pp.Min > 0 && v < pp.Min || pp.Max > 0 && v > pp.Max {
			return false
		}
	}
	return true
}

// binding is one way a candidate's terminals stand for the pattern part's:
// the circuit net per pattern terminal, and for a transformer the circuit
// coil per pattern winding. Fixed arrays keep the search from allocating.
type binding struct {
	net   [maxSlots]int
	n     int
	coil  [maxWindings]int
	ncoil int
}

const (
	maxSlots    = 12 // terminals of one pattern part (four three-pin windings)
	maxWindings = 4
)

func bind(nets ...int) binding {
	var b binding
	b.n = copy(b.net[:], nets)
	return b
}

func (b *binding) nets() []int { return b.net[:b.n] }

// bindings lists every way the candidate's terminals can stand for the
// pattern part's: both ways round for two-terminal parts and coil ends, each
// extra grid for a "grid" terminal, each assignment of windings to coils.
func (s *searcher) bindings(pp *PPart, ci int, out []binding) []binding {
	w := s.w
	p := w.parts[ci]
	switch pp.Device {
	case "resistor", "capacitor", "inductor", "crystal", "element":
		if len(w.pins[ci]) != 2 {
			return out
		}
		a, b := w.pins[ci][0], w.pins[ci][1]
		return append(out, bind(a, b), bind(b, a))
	case "tapped-coil", "pot":
		mid := "t"
		if pp.Device == "pot" {
			mid = "w"
		}
		one, t, two := w.pinNet(ci, "1"), w.pinNet(ci, mid), w.pinNet(ci, "2")
		if one < 0 || t < 0 || two < 0 {
			return out
		}
		return append(out, bind(one, t, two), bind(two, t, one))
	case "diode":
		anodes := []string{"a"}
		if p.Type == "double-diode" {
			anodes = []string{"a1", "a2"}
		}
		for _, an := range anodes {
			a, k := w.pinNet(ci, an), w.pinNet(ci, "k")
			if a < 0 || k < 0 {
				continue
			}
			if pp.Pins[0].Key == "" {
				out = append(out, bind(a, k), bind(k, a))
				continue
			}
			b := binding{n: 2}
			for i, pin := range pp.Pins {
				if pin.Key == "a" {
					b.net[i] = a
				} else {
					b.net[i] = k
				}
			}
			out = append(out, b)
		}
		return out
	case "double-diode":
		a1, a2, k := w.pinNet(ci, "a1"), w.pinNet(ci, "a2"), w.pinNet(ci, "k")
		for _, order := range [][2]int{{a1, a2}, {a2, a1}} {
			b := binding{n: len(pp.Pins)}
			for i, pin := range pp.Pins {
				switch pin.Key {
				case "a1":
					b.net[i] = order[0]
				case "a2":
					b.net[i] = order[1]
				case "k":
					b.net[i] = k
				}
			}
			out = append(out, b)
		}
		return out
	case "active", "valve", "bjt", "fet":
		return s.activeBindings(pp, ci, out)
	case "transformer":
		return s.transformerBindings(pp, ci, out)
	}
	return out
}

func (s *searcher) activeBindings(pp *PPart, ci int, out []binding) []binding {
	w := s.w
	p := w.parts[ci]
	var choiceBuf [4][8]int
	var choiceN [4]int
	if len(pp.Pins) > len(choiceBuf) {
		return out
	}
	choices := make([][]int, len(pp.Pins))
	for i, pin := range pp.Pins {
		role := graph.TermRole(pin.Key)
		for j := range p.Pins {
			if w.roles[ci][j] == role && choiceN[i] < len(choiceBuf[i]) {
				choiceBuf[i][choiceN[i]] = w.pins[ci][j]
				choiceN[i]++
				choices[i] = choiceBuf[i][:choiceN[i]]
				if role != graph.RoleGrid {
					break // one control, common, output per section
				}
			}
		}
		if len(choices[i]) == 0 {
			return out
		}
	}
	cur := binding{n: len(pp.Pins)}
	var rec func(i int)
	rec = func(i int) {
		if i == len(pp.Pins) {
			out = append(out, cur)
			return
		}
		for _, n := range choices[i] {
			cur.net[i] = n
			rec(i + 1)
		}
	}
	rec(0)
	return out
}

func (s *searcher) transformerBindings(pp *PPart, ci int, out []binding) []binding {
	w := s.w
	coils := w.coils[ci]
	if len(pp.Windings) > maxWindings || len(pp.Windings) > len(coils) {
		return out
	}
	used := make([]bool, len(coils))
	var cur binding
	cur.ncoil = len(pp.Windings)
	var rec func(i int)
	rec = func(i int) {
		if i == len(pp.Windings) {
			out = append(out, cur)
			return
		}
		pw := pp.Windings[i]
		for c, cl := range coils {
			if used[c] {
				continue
			}
			var ends [][]int
			switch {
			case len(pw) == 3 && len(cl.pins) == 3:
				one, t, two := w.pinNet(ci, cl.pins[0]), w.pinNet(ci, cl.pins[1]), w.pinNet(ci, cl.pins[2])
				ends = [][]int{{one, t, two}, {two, t, one}}
			case len(pw) == 2:
				one, two := w.pinNet(ci, cl.pins[0]), w.pinNet(ci, cl.pins[len(cl.pins)-1])
				ends = [][]int{{one, two}, {two, one}}
			default:
				continue
			}
			used[c] = true
			cur.coil[i] = c
			for _, e := range ends {
				if cur.n+len(e) > maxSlots {
					continue
				}
				copy(cur.net[cur.n:], e)
				cur.n += len(e)
				rec(i + 1)
				cur.n -= len(e)
			}
			used[c] = false
		}
	}
	rec(0)
	return out
}
