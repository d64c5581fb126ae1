// Which circuit parts a pattern part accepts, and every way their terminals
// can be bound to the pattern's nets (both ways round, each coil assignment).

package stages

import (
	"pare/graph"
)

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
	"loudspeaker":  {graph.Loudspeaker},
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
	if pp.DCBlock && !s.w.blocksDC(ci) {
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
	case "resistor", "capacitor", "inductor", "crystal", "element", "loudspeaker":
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
		out = append(out, bind(one, t, two), bind(two, t, one))
		if pp.Device == "pot" && rheostat(pp) && (t == one) != (t == two) {
			// A preset strapped as a variable resistor is a resistor
			// between its two nets whichever end its wiper is strapped
			// to (that only sets which way the track turns): the
			// pattern's strapped end may stand on either net.
			free, held := two, one
			if t == two {
				free, held = one, two
			}
			out = append(out, bind(held, free, free), bind(free, free, held))
		}
		return out
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

// bypassRatio is how much larger than a capacitor another one from its end
// to AC ground must be to hold that end at AC ground for it: the signal it
// passes to that end is at most C/Cshunt, under −60 dB at 1000 at every
// frequency (a capacitive divider), whatever the band. A top-coupling
// capacitor into a tank (1–10 pF into 100–500 pF, a ratio under 500) stays
// a coupling; an IF bypass into a cathode that a 25 µF bypass holds
// (100 pF, a ratio of 250,000) does not.
const bypassRatio = 1000

// blocksDC reports whether a two-terminal capacitor couples signal between
// two stages as a DC block: no resistor, coil or pot track straight across
// it (a capacitor across a resistor bypasses it, as a cathode bypass across
// the upper part of a split cathode resistor does) and neither end held at
// AC ground by a capacitor to ground bypassRatio times larger (a bypass or
// decoupling capacitor from a signal node to a bypassed cathode or line),
// nor a static electrode's bypass (bypassesElectrode).
func (w *world) blocksDC(ci int) bool {
	p := w.parts[ci]
	if len(w.pins[ci]) != 2 || !(p.Value.Max > 0) {
		return true
	}
	if w.bypassesElectrode(ci) {
		return false
	}
	a, b := w.pins[ci][0], w.pins[ci][1]
	for _, end := range []int{a, b} {
		for _, j := range w.conns[end] {
			q := w.parts[j]
			if j == ci || len(w.pins[j]) < 2 {
				continue
			}
			switch q.Kind {
			case graph.Resistor, graph.Inductor, graph.Pot:
				if end == a && w.joins(j, a, b) {
					return false
				}
			case graph.Capacitor:
				other := w.pins[j][0]
				if other == end {
					other = w.pins[j][1]
				}
				if len(w.pins[j]) == 2 && other == groundNet && end != groundNet && q.Value.Max >= bypassRatio*p.Value.Max {
					return false
				}
			}
		}
	}
	return true
}

// joins reports whether part j has terminals on both nets a and b.
func (w *world) joins(j, a, b int) bool {
	onA, onB := false, false
	for _, n := range w.pins[j] {
		onA = onA || n == a
		onB = onB || n == b
	}
	return onA && onB
}

// rheostat reports whether a pattern pot is strapped as a variable
// resistor: its wiper on the same pattern net as one end.
func rheostat(pp *PPart) bool {
	if len(pp.Pins) != 3 {
		return false
	}
	w := pp.Pins[1].Net
	return (w == pp.Pins[0].Net) != (w == pp.Pins[2].Net)
}
