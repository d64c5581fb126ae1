package layout

import "pare/graph"

// deviceStages gives the unframed transformers, on a row of a paged sheet
// (Options.DeviceStages) the other unframed parts, and on every sheet the
// bias-point parts (biasPoint), wired to a framed device's
// electrode, or to the far end of a winding whose other end is on a
// framed device's control electrode (a base or grid fed through a coupling
// winding), that device's stage, where the parts so wired reach only one
// stage's devices. stages then spreads from them as from framed parts: a
// part is drawn beside the device it works on. Spread from the framed parts
// alone, in the cells' order, a part tied between two stages went to the
// one whose parts sort first: review15 b03's first IF transformer, wired
// to Q1's base and to the AGC filter's capacitor at its secondary's cold
// end, stood in the AGC filter's frame a sheet away from Q1, and b02's
// base bias network, at the cold end of the aerial coupling winding whose
// hot end feeds Q1's base, in the aerial stage's frame on another page.
func (ly *state) deviceStages(stageOf func(*cell) (int, bool), byNet map[string][]*cell, plain map[string]int) map[*cell]int {
	cand := map[*cell]int{}     // -1: parts of more than one stage reached
	devices := map[int]bool{}   // the stages holding a device
	coldEnd := map[*cell]bool{} // reached at the far end of a winding
	for _, d := range ly.cells {
		if s, framed := stageOf(d); framed && d.part.IsActive() {
			devices[s] = true
		}
	}
	offer := func(n string, s int, far bool) {
		for _, nb := range byNet[n] {
			if _, framed := stageOf(nb); framed || nb.edge != 0 || !biasKind(nb.part) || !ly.takes(s, nb) {
				continue
			}
			coldEnd[nb] = coldEnd[nb] || far
			if c, ok := cand[nb]; ok && c != s {
				cand[nb] = -1
			} else {
				cand[nb] = s
			}
		}
	}
	for _, d := range ly.cells {
		s, framed := stageOf(d)
		if !framed || !d.part.IsActive() {
			continue
		}
		for _, pn := range d.part.Pins {
			if !ly.wiredSignal(pn.Net) || graph.RoleOfPin(d.part.Kind, pn.Name) != graph.RoleControl {
				continue
			}
			offer(pn.Net, s, false)
			for _, w := range byNet[pn.Net] {
				for _, far := range FarEnds(w.part, pn.Net) {
					if ly.wiredSignal(far) {
						offer(far, s, true)
					}
				}
			}
		}
	}
	for c, s := range cand {
		// a transformer moves from any other stage (on every sheet: the
		// can whose secondary feeds a base stands before that base, not
		// in the frame of whatever stage shares its decoupled supply
		// line, review16 b03); another part only from a stage without a
		// device (an AGC filter, an aerial tank) or none, on a row, and
		// on a whole sheet only a bias-point part (biasPoint)
		p, ok := plain[c.ref]
		switch {
		case s < 0 || ok && p == s:
			delete(cand, c)
		case c.part.Kind == graph.Transformer:
		case ok && devices[p]:
			delete(cand, c)
		case !ly.o.DeviceStages && !(coldEnd[c] && ly.biasPoint(c) && (!ok || p > s)):
			delete(cand, c)
		}
	}
	return cand
}

// biasPoint says whether every signal net of c is one the reduction tied
// to AC ground (Options.Quiet): a part at the bypassed cold end of a link
// winding into a base (a bias divider, its decoupler). The walk crosses no
// quiet net, so such a part was spread by name order from whatever later
// stage shares its supply line: review13 b02's bias point stood in the RF
// transformer's stage, three columns wide, and the small sheet no longer
// fitted A3 in one piece.
func (ly *state) biasPoint(c *cell) bool {
	for _, pn := range c.part.Pins {
		if ly.wiredSignal(pn.Net) && !ly.o.Quiet[pn.Net] {
			return false
		}
	}
	return true
}

// biasKind says whether p biases or couples into a control electrode: a
// resistor, capacitor, coil or transformer (not a switch section, which
// stands with the coils it switches, nor a socket).
func biasKind(p *graph.Part) bool {
	switch p.Kind {
	case graph.Resistor, graph.Capacitor, graph.Inductor, graph.Transformer:
		return true
	}
	return false
}

// wiredSignal says whether net n is wired and not at AC ground.
func (ly *state) wiredSignal(n string) bool {
	return n != notConnected && n != "" && !ly.c.RoleOf(n).IsACGround()
}

// FarEnds are the nets at the other end of each winding of coil or
// transformer p that has one end on net n (a plain two-pin coil is one
// winding).
func FarEnds(p *graph.Part, n string) []string {
	if p.Kind != graph.Inductor && p.Kind != graph.Transformer {
		return nil
	}
	var out []string
	if len(p.Windings) == 0 {
		if len(p.Pins) == 2 {
			for i, pn := range p.Pins {
				if pn.Net == n {
					out = append(out, p.Pins[1-i].Net)
				}
			}
		}
		return out
	}
	for _, w := range p.Windings {
		a, b := p.NetOf(w.From), p.NetOf(w.To)
		switch n {
		case a:
			out = append(out, b)
		case b:
			out = append(out, a)
		}
	}
	return out
}
