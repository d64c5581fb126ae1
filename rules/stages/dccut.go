package stages

import (
	"slices"

	"pare/graph"
)

// dcCut is the circuit the DC loads of the diodes among idx are taken on:
// the parts their DC paths can run through (resistors, pots, coils and
// windings, switches), reached from the diodes' nets without passing a net
// that returns DC (ground, a supply or heater rail, a bias supply with a
// voltage: the solver's DC returns, the nets freed excepted), each part
// followed only along what it joins for DC (dcStep), with the nets those
// parts touch. A diode's DC load is the resistance of its own
// DC network, which the rest of the set does not meet: the solver's DC
// network of a wider circuit is this one beside others that share no node
// with it, numbered and ordered alike (block by block), so it gives the
// same load (TestPiecesAreWide holds the figures to the wide circuit's).
// The walk costs the diodes' own DC paths, not the set. ok is false where
// a path reaches stop (the rail a supply filter section is driven from:
// what lies beyond it is not in the section's wide circuit) or the world
// folds nets the solver does not return DC through; then the caller takes
// the wide circuit.
func (x *figCtx) dcCut(idx []int, stop int, freed []string) (c *graph.Circuit, ok bool) {
	w := x.w
	if !w.full {
		return nil, false
	}
	in := map[int]bool{}
	seen := map[int]bool{}
	var cut, frontier []int
	add := func(ci int) {
		if in[ci] {
			return
		}
		in[ci] = true
		cut = append(cut, ci)
		for _, id := range w.pins[ci] {
			if !seen[id] {
				seen[id] = true
				frontier = append(frontier, id)
			}
		}
	}
	for _, ci := range idx {
		if isDiode(w.parts[ci]) {
			add(ci)
		}
	}
	for len(frontier) > 0 {
		id := frontier[len(frontier)-1]
		frontier = frontier[:len(frontier)-1]
		if id == stop {
			return nil, false
		}
		if id == groundNet || x.returnsDC(id, freed) {
			continue
		}
		for _, cj := range w.conns[id] {
			x.dcStep(cj, id, func(o int) {
				if !in[cj] {
					in[cj] = true
					cut = append(cut, cj)
				}
				if !seen[o] {
					seen[o] = true
					frontier = append(frontier, o)
				}
			})
		}
	}
	slices.Sort(cut)
	return x.cutFreed(cut, nil, freed), true
}

// returnsDC tells whether net id is one of the solver's DC returns
// (ac's dcReturn) as the wide circuit has it: a net freed is a signal net.
func (x *figCtx) returnsDC(id int, freed []string) bool {
	name := x.netName(id)
	i, ok := x.w.netAt[name]
	if !ok || slices.Contains(freed, name) {
		return false
	}
	switch n := x.w.c.Nets[i]; n.Role {
	case graph.Ground, graph.Supply, graph.Heater:
		return true
	case graph.Bias:
		return n.Volts != 0
	}
	return false
}

// dcStep calls to with each net part ci joins net id to in the solver's DC
// network: through a resistor or a pot's track, along a coil or one of a
// transformer's windings (not from one winding to another), across a
// switch's closed contacts. Capacitors, diodes and amplifying parts pass
// no DC there, and an unconnected terminal joins nothing.
func (x *figCtx) dcStep(ci, id int, to func(int)) {
	w := x.w
	p := w.parts[ci]
	for j, at := range w.pins[ci] {
		if at != id || !usable(p.Pins[j].Net) {
			continue
		}
		for _, other := range dcJoined(p, p.Pins[j].Name) {
			if n := p.NetOf(other); usable(n) {
				if o, ok := w.netID[n]; ok {
					to(o)
				}
			}
		}
	}
}

// dcJoined is the pins a part joins pin to for DC (as ac's DC network
// stamps it).
func dcJoined(p *graph.Part, pin string) []string {
	var out []string
	pair := func(a, b string) {
		switch pin {
		case a:
			out = append(out, b)
		case b:
			out = append(out, a)
		}
	}
	switch p.Kind {
	case graph.Resistor:
		pair("1", "2")
	case graph.Pot:
		pair("1", "w")
		pair("w", "2")
	case graph.Inductor, graph.Transformer:
		if len(p.Windings) == 0 {
			pair("1", "2")
		}
		for _, wd := range p.Windings {
			pair(wd.From, wd.To)
		}
	case graph.Switch:
		if pos := int(p.Set); pos >= 1 && pos <= len(p.Closes) {
			for _, c := range p.Closes[pos-1] {
				pair(c[0], c[1])
			}
		}
	}
	return out
}

// usable is a net that joins something: not empty, not "nc".
func usable(net string) bool { return net != "" && net != "nc" }

// isDiode tells whether a part is a diode or a valve diode, whose DC load
// the solver takes from the DC paths.
func isDiode(p *graph.Part) bool {
	return p.Kind == graph.Diode || p.Kind == graph.Valve && (p.Type == "diode" || p.Type == "double-diode")
}
