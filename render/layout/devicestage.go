package layout

import "pare/graph"

// deviceStages gives the unframed parts wired to a framed device's
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
func (ly *state) deviceStages(stageOf func(*cell) (int, bool), byNet map[string][]*cell) map[*cell]int {
	cand := map[*cell]int{} // -1: parts of more than one stage reached
	offer := func(n string, s int) {
		for _, nb := range byNet[n] {
			if _, framed := stageOf(nb); framed || nb.edge != 0 || nb.part.Kind == graph.Port || !ly.takes(s, nb) {
				continue
			}
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
			if !ly.wiredSignal(pn.Net) {
				continue
			}
			offer(pn.Net, s)
			if graph.RoleOfPin(d.part.Kind, pn.Name) != graph.RoleControl {
				continue
			}
			for _, w := range byNet[pn.Net] {
				for _, far := range farEnds(w.part, pn.Net) {
					if ly.wiredSignal(far) {
						offer(far, s)
					}
				}
			}
		}
	}
	for c, s := range cand {
		if s < 0 {
			delete(cand, c)
		}
	}
	return cand
}

// wiredSignal says whether net n is wired and not at AC ground.
func (ly *state) wiredSignal(n string) bool {
	return n != notConnected && n != "" && !ly.c.RoleOf(n).IsACGround()
}

// farEnds are the nets at the other end of each winding of coil or
// transformer p that has one end on net n (a plain two-pin coil is one
// winding).
func farEnds(p *graph.Part, n string) []string {
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
