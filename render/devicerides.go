package render

import (
	"pare/graph"
	"pare/render/geom"
	"pare/render/layout"
)

// deviceRides gives each unframed part (sockets aside) wired to the control
// electrode of an active part a stretch holds, or to the far end of a
// winding whose other end is on one (a base fed through a coupling
// winding), that stretch, where every such device it reaches stands on one
// stretch and beside (with) gave it none, or one with no active part on
// it. By x in the whole sheet's placement, review15 b03's first IF
// transformer was a stretch of its own after the detector, so it was drawn
// in the AGC filter's frame a page from the transistor its secondary
// feeds; b02's base bias network, wired only to the aerial coupling
// winding's cold end, rode on the aerial stage's stretch, a page from its
// transistor. The parts returned are added to blockOf.
func deviceRides(c *graph.Circuit, blockOf, with map[string]int, ext map[string]geom.Rect) map[string]int {
	cand := map[string]int{} // -1: devices on several stretches
	offer := func(n string, i int) {
		for _, cn := range c.ConnsOf(n) {
			p := cn.Part
			if _, in := blockOf[p.Ref]; in || !biasKind(p) {
				continue
			}
			if j, ok := cand[p.Ref]; ok && j != i {
				cand[p.Ref] = -1
			} else {
				cand[p.Ref] = i
			}
		}
	}
	for _, d := range c.Parts {
		i, in := blockOf[d.Ref]
		if !in || !d.IsActive() {
			continue
		}
		for _, pn := range d.Pins {
			if !signalNet(c, pn.Net) || graph.RoleOfPin(d.Kind, pn.Name) != graph.RoleControl {
				continue
			}
			offer(pn.Net, i)
			for _, cn := range c.ConnsOf(pn.Net) {
				for _, far := range layout.FarEnds(cn.Part, pn.Net) {
					if signalNet(c, far) && !footOwn(c, cn.Part, far, i, blockOf) {
						offer(far, i)
					}
				}
			}
		}
	}
	devices := map[int]bool{}
	for _, d := range c.Parts {
		if i, in := blockOf[d.Ref]; in && d.IsActive() {
			devices[i] = true
		}
	}
	out := map[string]int{}
	for ref, i := range cand {
		if w, ok := with[ref]; i >= 0 && ext[ref] != (geom.Rect{}) && (!ok || w < 0 || w != i && !devices[w]) &&
			!touchesOther(c, c.Part(ref), i, blockOf, devices) {
			out[ref] = i
		}
	}
	if len(out) == 0 {
		return nil
	}
	// none where it leaves a part beside gave a stretch with none: the
	// rest of a group cut off (a wavechange contact and a decoupler) would
	// stand alone, a page of leftovers
	joined := map[string]int{}
	for r, i := range blockOf {
		joined[r] = i
	}
	for r, i := range out {
		joined[r] = i
	}
	again := beside(c, joined)
	for r := range with {
		if _, moved := out[r]; !moved {
			if _, ok := again[r]; !ok {
				return nil
			}
		}
	}
	for r, i := range out {
		blockOf[r] = i
	}
	return out
}

// footOwn says whether net far, the foot of winding w that feeds a device
// on stretch i, holds only a decoupler (layout.DecouplerFoot) while w
// stands on a stretch of its own: the decoupler stays at the winding's foot.
func footOwn(c *graph.Circuit, w *graph.Part, far string, i int, blockOf map[string]int) bool {
	j, in := blockOf[w.Ref]
	return in && j != i && layout.DecouplerFoot(c, w, far, func(p *graph.Part) layout.Foot {
		switch k, in := blockOf[p.Ref]; {
		case !in:
			return layout.FootLoose
		case k == j:
			return layout.FootWith
		}
		return layout.FootElsewhere
	})
}

// touchesOther says whether p shares a net with a part of a stretch other
// than i that holds a device: an upper bias resistor from a supply line
// that also feeds the next stage's collector would bring that line into
// the row, and the row's walk from its incoming nets along it would rank
// the next stage's transformer before its transistor.
func touchesOther(c *graph.Circuit, p *graph.Part, i int, blockOf map[string]int, devices map[int]bool) bool {
	for _, pn := range p.Pins {
		if !signalNet(c, pn.Net) {
			continue
		}
		for _, cn := range c.ConnsOf(pn.Net) {
			if j, in := blockOf[cn.Part.Ref]; in && j != i && devices[j] {
				return true
			}
		}
	}
	return false
}

// biasKind says whether p is a part that biases or couples into a
// device's control electrode (a resistor, capacitor, coil or
// transformer), not a switch section, which goes with the coils it
// switches, nor a socket.
func biasKind(p *graph.Part) bool {
	switch p.Kind {
	case graph.Resistor, graph.Capacitor, graph.Inductor, graph.Transformer:
		return true
	}
	return false
}

// signalNet says whether net n is wired and not at AC ground.
func signalNet(c *graph.Circuit, n string) bool {
	return n != "" && n != graph.NotConnected && !c.RoleOf(n).IsACGround()
}
