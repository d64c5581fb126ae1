package align

import (
	"slices"

	"pare/graph"
)

// The guide reads the signal path from the circuit's wiring, not from pin
// names or the order stages were found in: a heptode's signal grid is
// whichever grid the aerial circuit drives (g3 in a triode-heptode, g1 in a
// pentagrid with the oscillator on g1 ... common practice varies), and the
// first IF can is the one no other IF can feeds.

// signalGrid is the grid (or base, gate) of p that the circuit's input
// reaches through passive parts alone: the mixer's signal grid. The
// oscillator's grid, reached only through the valve itself, never wins.
// With no input declared, or none reached, it is p's control electrode.
func signalGrid(c *graph.Circuit, p *graph.Part) string {
	dist := passiveDistances(c)
	best, bestD := p.PinWithRole(graph.RoleControl), -1
	for _, pin := range p.Pins {
		r := graph.RoleOfPin(p.Kind, pin.Name)
		if r != graph.RoleControl && r != graph.RoleGrid {
			continue
		}
		if d, ok := dist[pin.Net]; ok && (bestD < 0 || d < bestD) {
			best, bestD = pin.Name, d
		}
	}
	return best
}

// passiveDistances walks from the inputs over passive parts (transformers
// couple their windings), never across a net at AC ground or through an
// active part: how many parts the signal passes to reach each net.
func passiveDistances(c *graph.Circuit) map[string]int {
	dist := map[string]int{}
	var front []string
	for _, n := range c.Inputs {
		if _, ok := dist[n]; !ok {
			dist[n] = 0
			front = append(front, n)
		}
	}
	for d := 1; len(front) > 0; d++ {
		var next []string
		for _, p := range c.Parts {
			if p.IsActive() || !touchesAny(p, front) {
				continue
			}
			for _, n := range netsOf(p) {
				if _, ok := dist[n]; !ok && !c.RoleOf(n).IsACGround() {
					dist[n] = d
					next = append(next, n)
				}
			}
		}
		front = next
	}
	return dist
}

func touchesAny(p *graph.Part, nets []string) bool {
	for _, pin := range p.Pins {
		if slices.Contains(nets, pin.Net) {
			return true
		}
	}
	return false
}

// outputFeeder is the active part whose output electrode sits on one of
// the can's signal nets, or nil.
func outputFeeder(c *graph.Circuit, can *graph.Part) *graph.Part {
	on := signalNets(c, can)
	for _, p := range c.Parts {
		if !p.IsActive() {
			continue
		}
		if out := p.NetOf(p.PinWithRole(graph.RoleOutput)); out != "" && slices.Contains(on, out) {
			return p
		}
	}
	return nil
}

// gridOn reports whether one of p's grids (control or further) sits on
// one of the nets: p is driven from there.
func gridOn(p *graph.Part, nets []string) bool {
	for _, pin := range p.Pins {
		r := graph.RoleOfPin(p.Kind, pin.Name)
		if (r == graph.RoleControl || r == graph.RoleGrid) && slices.Contains(nets, pin.Net) {
			return true
		}
	}
	return false
}

// signalNets are the can's nets not at AC ground (its HT and earthy ends
// join every stage and order nothing).
func signalNets(c *graph.Circuit, p *graph.Part) []string {
	return slices.DeleteFunc(netsOf(p), func(n string) bool { return c.RoleOf(n).IsACGround() })
}

// orderCans puts the IF cans in signal order by wiring: a can comes after
// the can whose secondary drives the device feeding it. Cans the wiring
// does not order keep the stages' order.
func orderCans(c *graph.Circuit, cans []*graph.Part) []*graph.Part {
	// each can's feeder is found once: the pick below asks it of every
	// pair left, and finding it walks the whole circuit (a bank's cans)
	feeder := make(map[*graph.Part]*graph.Part, len(cans))
	for _, b := range cans {
		feeder[b] = outputFeeder(c, b)
	}
	fedBy := func(b, a *graph.Part) bool {
		f := feeder[b]
		return f != nil && gridOn(f, signalNets(c, a))
	}
	rest := slices.Clone(cans)
	var out []*graph.Part
	for len(rest) > 0 {
		pick := 0
		for i, b := range rest {
			if !slices.ContainsFunc(rest, func(a *graph.Part) bool { return a != b && fedBy(b, a) }) {
				pick = i
				break
			}
		}
		out = append(out, rest[pick])
		rest = slices.Delete(rest, pick, pick+1)
	}
	return out
}

// downstreamOfIF reports whether p is driven from an IF can: an IF
// amplifier, never the mixer.
func downstreamOfIF(c *graph.Circuit, cans []*graph.Part, p *graph.Part) bool {
	for _, can := range cans {
		if gridOn(p, signalNets(c, can)) {
			return true
		}
	}
	return false
}
