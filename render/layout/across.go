package layout

import (
	"slices"

	"pare/graph"
)

// acrossStages gives each unframed resistor or capacitor wired across a
// framed part (its two nets are that part's two nets: a buffer capacitor
// across a rectifier diode, a resistor across a capacitor) the stage of
// that part, where every framed part it is across stands in one stage.
// Spread from the frames breadth first in the cells' order, such a part
// went to whichever stage's part sorted first on either net: review17
// a05's buffer capacitors across the bridge's + diodes share the
// reservoir line with the output transformer's top-cut capacitor (C13
// sorts before D1) and stood in the output stage's frame beside the
// loudspeaker, a page from the bridge they serve. Common practice on a
// service sheet: a part across another is drawn beside it.
//
// Only a part the reduction took away (Options.Faded) moves: the same rule
// on the parts it keeps moved the emitter capacitor of
// colpitts-blocked-no-feedback beside its resistor but left a wire end in
// line with another net's (the misread ratchet); left for later.
func (ly *state) acrossStages(stageOf func(*cell) (int, bool)) map[*cell]int {
	hosts := map[[2]string][]int{} // the stages of the framed parts on each pair of nets
	for _, cl := range ly.cells {
		s, framed := stageOf(cl)
		if !framed || cl.edge != 0 || cl.part.Kind == graph.Port {
			continue
		}
		if k, ok := TwoNets(cl.part); ok {
			hosts[k] = append(hosts[k], s)
		}
	}
	out := map[*cell]int{}
	for _, cl := range ly.cells {
		if _, framed := stageOf(cl); framed || cl.edge != 0 || cl.conn {
			continue
		}
		if cl.part.Kind != graph.Resistor && cl.part.Kind != graph.Capacitor || !ly.o.Faded[cl.ref] {
			continue
		}
		k, ok := TwoNets(cl.part)
		if !ok || len(hosts[k]) == 0 {
			continue
		}
		if s := hosts[k][0]; !slices.ContainsFunc(hosts[k], func(o int) bool { return o != s }) {
			out[cl] = s
		}
	}
	return out
}

// TwoNets is the two wired nets of a part wired to exactly two, in
// order, and whether it has two.
func TwoNets(p *graph.Part) ([2]string, bool) {
	var k [2]string
	n := 0
	for _, pn := range p.Pins {
		if pn.Net == notConnected || pn.Net == "" || slices.Contains(k[:n], pn.Net) {
			continue
		}
		if n == 2 {
			return k, false
		}
		k[n] = pn.Net
		n++
	}
	if n != 2 {
		return k, false
	}
	if k[1] < k[0] {
		k[0], k[1] = k[1], k[0]
	}
	return k, true
}
