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
					if ly.wiredSignal(far) && !ly.footOwn(stageOf, w, far, s) {
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

// footOwn says whether net far, the foot of winding w that feeds a device
// of stage s, holds only a decoupler (DecouplerFoot) while w is framed in
// another stage: the decoupler stays at the winding's foot, in w's stage,
// a column after the parts of its rank (footCol).
func (ly *state) footOwn(stageOf func(*cell) (int, bool), w *cell, far string, s int) bool {
	ws, framed := stageOf(w)
	if !framed || ws == s {
		return false
	}
	return DecouplerFoot(ly.c, w.part, far, ly.footPlace(stageOf, ws, nil))
}

// footPlace is where a part stands against a winding framed in stage ws
// (DecouplerFoot), the loose ones added to *loose.
func (ly *state) footPlace(stageOf func(*cell) (int, bool), ws int, loose *[]string) func(*graph.Part) Foot {
	return func(p *graph.Part) Foot {
		cl := ly.refCell[p.Ref]
		if cl == nil {
			return FootElsewhere
		}
		switch ps, framed := stageOf(cl); {
		case !framed:
			if loose != nil {
				*loose = append(*loose, p.Ref)
			}
			return FootLoose
		case ps == ws:
			return FootWith
		}
		return FootElsewhere
	}
}

// markFeet puts the decoupler at the foot of a winding framed without a
// device (an IF can's own frame) whose hot end
// leads on (to a part ranked after the winding, or off the sheet's right
// edge: an IF can's secondary) a column after its rank (footCol): in the
// can's column with the primary's anode decoupler, the two stacked made
// the can's frame two decouplers tall (review17 a03's IFT1: the row grew
// and the IF stage's row no longer fitted its page). The decoupler at the
// foot of a winding an anode or collector feeds, where both ends of the
// can's other winding lead on to other stages (bothLeave), stands a column
// before the winding's rank (footCol), under the device's output lead: right
// of the can, its leads crossed the secondary's lead on to the detector
// (review17 a03's IFT2 anode decoupler R5/C7 and det_k). Only on a row of
// a paged sheet (Options.DeviceStages): on the whole sheet of the
// if-detector-audio example it left the screen decoupler under the can,
// its lead beside the cathode's, which the misread ratchet counts; left
// for later.
func (ly *state) markFeet(stageOf func(*cell) (int, bool), byNet map[string][]*cell) {
	devices := map[int]bool{}
	for _, d := range ly.cells {
		if s, framed := stageOf(d); framed && d.part.IsActive() {
			devices[s] = true
		}
	}
	for _, w := range ly.cells {
		ws, framed := stageOf(w)
		if !framed || w.part.Kind != graph.Transformer {
			continue
		}
		for _, wd := range w.part.Windings {
			a, b := w.part.NetOf(wd.From), w.part.NetOf(wd.To)
			for _, e := range [][2]string{{a, b}, {b, a}} {
				hot, foot := e[0], e[1]
				if !ly.wiredSignal(foot) {
					continue
				}
				fed := ly.o.DeviceStages && ly.fedBy(hot, byNet) && ly.bothLeave(w, wd, ws, stageOf, byNet)
				if !fed && (devices[ws] || !ly.leadsOn(w, hot, byNet)) {
					continue
				}
				var loose []string
				if !DecouplerFoot(ly.c, w.part, foot, ly.footPlace(stageOf, ws, &loose)) {
					continue
				}
				for _, r := range loose {
					ly.footCol[r] = 3*ly.rankOf[r] + 1 // after its rank
					if fed {
						ly.footCol[r] = 3*ly.rankOf[w.ref] - 1 // before the winding
					}
				}
			}
		}
	}
}

// bothLeave says whether both ends of another winding of w than wd reach
// parts framed in other stages than ws: a secondary whose foot leads on
// too (a detector's return through its load), which the primary's
// decoupler right of the can stood across.
func (ly *state) bothLeave(w *cell, wd graph.Winding, ws int, stageOf func(*cell) (int, bool), byNet map[string][]*cell) bool {
	leaves := func(n string) bool {
		if !ly.wiredSignal(n) {
			return false
		}
		for _, nb := range byNet[n] {
			if s, framed := stageOf(nb); framed && s != ws {
				return true
			}
		}
		return false
	}
	for _, o := range w.part.Windings {
		if o.Name != wd.Name && leaves(w.part.NetOf(o.From)) && leaves(w.part.NetOf(o.To)) {
			return true
		}
	}
	return false
}

// fedBy says whether net hot is fed from a device's output electrode (an
// anode into its transformer's primary).
func (ly *state) fedBy(hot string, byNet map[string][]*cell) bool {
	for _, nb := range byNet[hot] {
		if d := nb.part; d.IsActive() && d.NetOf(d.PinWithRole(graph.RoleOutput)) == hot {
			return true
		}
	}
	return false
}

// leadsOn says whether net hot reaches past winding w: a part on it ranked
// after w, or the sheet's right edge.
func (ly *state) leadsOn(w *cell, hot string, byNet map[string][]*cell) bool {
	for _, nb := range byNet[hot] {
		if nb != w && (nb.edge == 1 || nb.edge == 0 && ly.rankOf[nb.ref] > ly.rankOf[w.ref]) {
			return true
		}
	}
	return false
}

// Foot is where a part on a winding's foot stands against the winding.
type Foot int

// The places of a part on a winding's foot (DecouplerFoot).
const (
	FootLoose     Foot = iota // in no stage yet
	FootWith                  // in the winding's own stage (its tuning capacitor)
	FootElsewhere             // in another stage
)

// DecouplerFoot says whether the parts on net far, the foot of winding w,
// other than w and the parts standing with it (its tuning capacitor) are
// all loose (where) and only decouple a line into the winding: a
// resistor from a rail other than chassis and a capacitor to chassis, at
// least one of each (an AGC decoupler at an IF can's cold end). Such a
// decoupler is drawn at the foot of the winding it feeds, as the can's
// other winding's anode decoupler is; moved to the stage of the device the
// winding feeds, review17 a03's AGC decoupler R2/C4 stood after the second
// IF can, a row from the first can's secondary, wired there by a
// connector. A bias divider (a resistor to chassis) is not one: it goes
// with its device.
func DecouplerFoot(c *graph.Circuit, w *graph.Part, far string, where func(*graph.Part) Foot) bool {
	r, caps := 0, 0
	for _, cn := range c.ConnsOf(far) {
		p := cn.Part
		if p == w {
			continue
		}
		switch at := where(p); {
		case at == FootWith:
			continue
		case at != FootLoose || len(p.Pins) != 2:
			return false
		}
		other := p.Pins[0].Net
		if other == far {
			other = p.Pins[1].Net
		}
		role := c.RoleOf(other)
		switch {
		case p.Kind == graph.Capacitor && role == graph.Ground:
			caps++
		case p.Kind == graph.Resistor && role.IsACGround() && role != graph.Ground:
			r++
		default:
			return false
		}
	}
	return r > 0 && caps > 0
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
