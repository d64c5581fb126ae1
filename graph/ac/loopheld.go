package ac

import (
	"slices"

	"pare/graph"
)

// The inputs a loop search holds. A declared input is where a generator
// goes when the signal path is measured, and every transfer holds the
// others at 0 V through their ideal sources, the generators idle. A loop
// is asked of the circuit as it runs, so a held input must be one a
// generator of low impedance really drives, or the loop answers for
// another circuit. Two kinds of input are left free:
//
//   - One on the device's own nets (its control, its common, the nets its
//     controlled current flows between): a generator's zero impedance there
//     would tie that electrode to AC ground and cut the feedback the device
//     closes through it. An RC phase-shift oscillator captured with its
//     input at the base (testdata/review14/b01.toml) showed "no 0° loop
//     phase" for its held base, where ngspice, with nothing on the base,
//     finds it running at 1.17 kHz with a margin of +7.7 dB.
//   - One a tuned circuit stands across: an inductance and a capacitance
//     from that node to the same return (the capacitance possibly a chain,
//     a padder in series with a gang section, or returned through a bypass):
//     a tuned coil or tuned winding of a transformer, its tap too. A
//     generator couples into such a point loosely (a ferrite rod, a loop
//     aerial, a tank fed through a dummy aerial) and the set runs with its
//     aerial, not with a short across its tank. A mains transistor set with
//     its input at the hot end of the ferrite-rod tank (testdata/review23/
//     b05.toml) had the aerial tank shorted, which reaches the oscillator's
//     loop through the mixer's emitter and read its top end at 2.030 MHz,
//     where ngspice's return ratio with the tank free gives 2.008 MHz
//     (docs/references.md §53).
//
// Any other input (a generator on an untuned input resistor, an audio
// input, the untuned coupling winding of an aerial coil, made for an aerial
// of low impedance) stays held, as the transfers hold it.

// loopHeld are the nodes of c's declared inputs that the loop of the
// controlled sources srcs, ruled by V(cn) − V(dn), holds at 0 V.
func loopHeld(c *graph.Circuit, nl *netlist, srcs []loopSource, cn, dn int) []int {
	own := []int{cn, dn}
	for _, q := range srcs {
		own = append(own, q.a, q.b)
	}
	held := slices.DeleteFunc(otherInputs(c, nl, -1), func(n int) bool { return slices.Contains(own, n) })
	if len(held) == 0 {
		return held
	}
	t := newTanks(c, nl)
	return slices.DeleteFunc(held, t.across)
}

// tanks answers which nodes of a netlist a tuned circuit stands across.
type tanks struct {
	c    *graph.Circuit
	nl   *netlist
	caps graph.DisjointSets // nodes joined by capacitors alone (capacitor parts, no device's)
}

func newTanks(c *graph.Circuit, nl *netlist) *tanks {
	t := &tanks{c: c, nl: nl}
	for _, p := range nl.prims {
		if p.kind != primC {
			continue
		}
		if part := c.Part(p.ref); part != nil && part.Kind == graph.Capacitor {
			t.caps.Union(p.a, p.b)
		}
	}
	return t
}

// tuned says whether nodes x and y, the two ends of an inductance, are
// also joined by capacitance alone: a tank.
func (t *tanks) tuned(x, y int) bool { return x != y && t.caps.Find(x) == t.caps.Find(y) }

// across says whether a tuned circuit stands across node n: n is on a coil
// whose ends a capacitance closes. A coil is an uncoupled winding, or the
// windings of one coupled group that join in series (the sections of a
// tapped winding, so a tap counts too). A group's other windings are not
// the tank: an untuned coupling winding (an aerial coil's primary) is where
// a generator of low impedance drives the tuned one, and stays held.
func (t *tanks) across(n int) bool {
	for _, p := range t.nl.prims {
		if p.kind == primRL && p.l > 0 && (p.a == n || p.b == n) && t.tuned(p.a, p.b) {
			return true
		}
	}
	for _, g := range t.nl.groups {
		if t.coilTuned(g, n) {
			return true
		}
	}
	return false
}

// coilTuned says whether n is on a coil of g two of whose ends are joined
// by capacitance alone. A coil is the windings of g that share a pin (the
// sections of a tapped winding), not those that merely meet on a net: an
// aerial coil's primary and secondary both returned to chassis are two.
func (t *tanks) coilTuned(g group, n int) bool {
	part := t.c.Part(g.ref)
	if part == nil {
		return false
	}
	var coil graph.DisjointSets
	first := map[string]int{} // pin name -> the first winding on it
	for i, w := range g.winds {
		pw := part.Winding(w.name)
		if pw == nil {
			continue
		}
		for _, pin := range []string{pw.From, pw.To} {
			if j, ok := first[pin]; ok {
				coil.Union(i, j)
			} else {
				first[pin] = i
			}
		}
	}
	for i, w := range g.winds {
		if w.a != n && w.b != n {
			continue
		}
		var ends []int
		for j, v := range g.winds {
			if coil.Find(j) == coil.Find(i) {
				ends = append(ends, v.a, v.b)
			}
		}
		for k, x := range ends {
			for _, y := range ends[k+1:] {
				if t.tuned(x, y) {
					return true
				}
			}
		}
	}
	return false
}
