package layout

import (
	"slices"
	"sort"

	"pare/graph"
)

// A tuned circuit is drawn as one unit (common practice): the winding and
// the capacitors across it side by side, both upright, joined at top and
// bottom. Ranked one by one, a tuning capacitor reached through its coil
// stood a column later, beside the next stage's valve or transistor, and
// its leads crossed that device to reach the coil. The tanks are found
// here on the circuit's nets alone; the stage frames (pipeline) put a tank
// in its winding's frame, and placement (tankplace.go) stands each
// capacitor beside its winding.

// TankCap is a capacitor across one winding of a coil or transformer.
type TankCap struct {
	Cap  string    // the capacitor's ref
	Coil string    // the coil's or transformer's ref
	Ends [2]string // the winding's end pins, in the order written
	// Hot is the winding end the capacitor shares when it is across the
	// winding in series with a capacitor at the winding's other end (a
	// padder, or the cold end's bypass); empty when it is across the
	// winding's own two ends.
	Hot string
}

// Tanks lists the capacitors across the windings of c's coils and
// transformers, in part order, each capacitor once (to the first winding
// it is across). A capacitor is across a winding when its nets are the
// winding's two ends (AC-ground nets counting as one), or one end and AC
// ground while the other end returns to AC ground through a capacitor and
// carries nothing else but resistors (a padder, a decoupled cold end).
func Tanks(c *graph.Circuit) []TankCap {
	acg := func(n string) bool { return c.RoleOf(n).IsACGround() }
	same := func(a, b string) bool { return a == b || acg(a) && acg(b) }
	onNet := map[string][]*graph.Part{}
	for _, p := range c.Parts {
		for _, pn := range p.Pins {
			onNet[pn.Net] = append(onNet[pn.Net], p)
		}
	}
	capAt := map[*graph.Part]int{}
	for _, p := range c.Parts {
		if p.Kind == graph.Capacitor && p.Type != graph.CapElectrolytic && len(p.Pins) == 2 && wired(p.Pins[0].Net) && wired(p.Pins[1].Net) &&
			!(acg(p.Pins[0].Net) && acg(p.Pins[1].Net)) {
			capAt[p] = len(capAt)
		}
	}
	used := map[string]bool{}
	var out []TankCap
	for _, coil := range c.Parts {
		if coil.Type == graph.IndChoke {
			continue // a choke stops signal: nothing tunes it
		}
		for _, ends := range WindingEnds(coil) {
			e1, e2 := coil.NetOf(ends[0]), coil.NetOf(ends[1])
			if !wired(e1) || !wired(e2) || same(e1, e2) {
				continue
			}
			for _, cp := range capsAt(onNet, capAt, e1, e2, acg) {
				if used[cp.Ref] {
					continue
				}
				a, b := cp.Pins[0].Net, cp.Pins[1].Net
				hot := ""
				switch {
				case same(a, e1) && same(b, e2) || same(a, e2) && same(b, e1):
				case acg(b) && a == e1 && returns(c, onNet, coil, cp, e2), acg(a) && b == e1 && returns(c, onNet, coil, cp, e2):
					hot = ends[0]
				case acg(b) && a == e2 && returns(c, onNet, coil, cp, e1), acg(a) && b == e2 && returns(c, onNet, coil, cp, e1):
					hot = ends[1]
				default:
					continue
				}
				used[cp.Ref] = true
				out = append(out, TankCap{Cap: cp.Ref, Coil: coil.Ref, Ends: ends, Hot: hot})
			}
		}
	}
	return out
}

func wired(n string) bool { return n != "" && n != notConnected }

// capsAt are the candidate tuning capacitors on either end of a winding,
// in the circuit's order, each once. A capacitor that tunes a winding has
// a pin on one of its ends that is no AC ground (the ends are never both
// AC ground, and a capacitor with both pins on AC ground is none), so only
// these are tried: trying every capacitor for every
// winding made a whole set's layout grow with its square.
func capsAt(onNet map[string][]*graph.Part, capAt map[*graph.Part]int, e1, e2 string, acg func(string) bool) []*graph.Part {
	var out []*graph.Part
	for _, n := range [2]string{e1, e2} {
		if acg(n) {
			continue // a capacitor on this end alone has its other pin on AC ground too, or is on the other end
		}
		for _, p := range onNet[n] {
			if _, ok := capAt[p]; ok && !slices.Contains(out, p) {
				out = append(out, p)
			}
		}
	}
	sort.Slice(out, func(i, j int) bool { return capAt[out[i]] < capAt[out[j]] })
	return out
}

// returns says whether a winding's cold-end net returns to AC ground
// through a fixed capacitor other than cp and carries only resistors and
// fixed capacitors besides the winding: a padder or a decoupled cold end,
// not a pi network's far side (which feeds a device, a port or another
// winding), nor the hot end a gang section or trimmer tunes.
func returns(c *graph.Circuit, onNet map[string][]*graph.Part, coil, cp *graph.Part, net string) bool {
	if c.RoleOf(net).IsACGround() {
		return false
	}
	found := false
	for _, p := range onNet[net] {
		switch {
		case p == coil || p == cp:
		case p.Kind == graph.Resistor:
		case p.Kind == graph.Capacitor && len(p.Pins) == 2 && (p.Type == graph.CapVariable || p.Type == graph.CapTrimmer):
			return false // a gang section or trimmer: the tank's hot end
		case p.Kind == graph.Capacitor && len(p.Pins) == 2:
			other := p.Pins[0].Net
			if other == net {
				other = p.Pins[1].Net
			}
			found = found || c.RoleOf(other).IsACGround()
		default:
			return false
		}
	}
	return found
}

// WindingEnds are the end pins of each coil of a part: a two-terminal or
// tapped inductor's pins 1 and 2, each chain of a transformer's windings
// (joined at their taps) from its first pin to its last.
func WindingEnds(p *graph.Part) [][2]string {
	switch p.Kind {
	case graph.Inductor:
		if len(p.Pins) == 2 {
			return [][2]string{{p.Pins[0].Name, p.Pins[1].Name}}
		}
		if p.Pin("1") != nil && p.Pin("2") != nil {
			return [][2]string{{"1", "2"}}
		}
	case graph.Transformer:
		return chainEnds(p.Windings)
	}
	return nil
}

// chainEnds joins windings that share a tap pin into chains, as the
// transformer symbol draws them, and gives each chain's ends.
func chainEnds(ws []graph.Winding) [][2]string {
	ws = append([]graph.Winding(nil), ws...)
	sort.Slice(ws, func(i, j int) bool { return ws[i].Name < ws[j].Name })
	used := make([]bool, len(ws))
	var out [][2]string
	for i := range ws {
		if used[i] {
			continue
		}
		used[i] = true
		first, last := ws[i].From, ws[i].To
		for grown := true; grown; {
			grown = false
			for j := range ws {
				switch {
				case used[j]:
					continue
				case ws[j].From == last:
					last = ws[j].To
				case ws[j].To == first:
					first = ws[j].From
				default:
					continue
				}
				used[j], grown = true, true
			}
		}
		out = append(out, [2]string{first, last})
	}
	return out
}

// coldUnder puts the faded shunts on a tuned winding's dead-end cold end
// (an AGC line's capacitor and resistor to chassis) in the winding's
// layer, to stand under it, as commonUnder does for a cathode's parts.
// Ranked one layer on from the winding they took a column of their own
// beyond the tank, which stands in the winding's layer (tankRanks), and
// widened the stage: a self-oscillating mixer's IF can had its AGC
// decoupler right of its secondary's capacitor and outgrew an A3 page at
// 2.5 mm text. A cold end is a winding end that is not AC ground and
// carries besides the winding and its tank capacitors only two-terminal
// resistors and fixed capacitors to chassis. An end fed from a rail or
// running on to another stage is left alone (moved, a feed's parts pulled
// its rail's wires across the stage), and so are the parts of a reduced
// sheet, which draws the signal path's own parts where they were.
func (ly *state) coldUnder(rank map[string]int) {
	tuned := map[*cell]bool{}
	for _, t := range ly.tankOf {
		tuned[t.coil] = true
	}
	onNet := ly.cellsByNet()
	for _, coil := range ly.cells {
		r, ok := rank[coil.ref]
		if !tuned[coil] || !ok {
			continue
		}
		for _, ends := range WindingEnds(coil.part) {
			for _, end := range ends {
				for _, cl := range ly.coldShunts(coil, coil.part.NetOf(end), onNet) {
					rank[cl.ref] = r
					delete(ly.before, cl.ref)
				}
			}
		}
	}
}

// coldShunts are the faded shunts to chassis on a winding's end net when
// that net is a dead-end cold end (coldUnder), else none.
func (ly *state) coldShunts(coil *cell, net string, onNet map[string][]*cell) []*cell {
	if !wired(net) || ly.c.RoleOf(net).IsACGround() {
		return nil
	}
	var out []*cell
	for _, cl := range onNet[net] {
		p := cl.part
		switch {
		case cl == coil:
			continue
		case cl.edge != 0 || cl.conn:
			return nil
		case p.Kind == graph.Resistor:
		case p.Kind == graph.Capacitor && p.Type != graph.CapVariable && p.Type != graph.CapTrimmer:
		default:
			return nil
		}
		if _, tank := ly.tankOf[cl]; tank {
			continue
		}
		if len(p.Pins) != 2 {
			return nil
		}
		other := p.Pins[0].Net
		if other == net {
			other = p.Pins[1].Net
		}
		if ly.c.RoleOf(other) != graph.Ground {
			// a feed from a rail or on to another stage: the end is not
			// a dead end, its parts stay in their own layer
			return nil
		}
		if cl.faded {
			out = append(out, cl)
		}
	}
	return out
}
