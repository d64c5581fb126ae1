package pipeline

import (
	"slices"

	"pare/graph"
	"pare/render"
)

// An RC ladder (a phase-shift oscillator's feedback network, a chain of
// low-pass sections inside one stage) is drawn the way the trade draws
// one: its series parts in a line, each inner node's shunt arm hanging
// from the line between the two series arms it joins, down to chassis, in
// the order the signal passes them (common practice). Left to the generic
// placement, review14 b01's ladder came out tangled round the oscillator's
// collector load.

// ladderPlaces is the template of a ladder among a stage's parts that runs
// from a device's output electrode back to its control electrode
// (feedbackLadder). Nil for none: a ladder elsewhere keeps the generic
// placement (laid on its own row by a template, a Clapp's coil and
// capacitors, read as one, were turned about).
func ladderPlaces(parts []string, c *graph.Circuit) []render.Place {
	l, ok := findLadder(parts, c)
	if !ok {
		return nil
	}
	return feedbackLadder(l, parts, c, func(n string) bool { return c.RoleOf(n).IsACGround() })
}

// ladderReach is how many slots a template reaches either side of its
// anchor (render/layout's slotReach).
const ladderReach = 4

// feedbackLadder is the template of a ladder that runs from a device's
// output electrode back to its control electrode (a phase-shift
// oscillator's), anchored on the device, as the trade draws it: the
// device's common-lead parts under it, its output load up to the rail
// beside the output electrode, and the ladder in a line below them, its
// series parts along row 2 from the control side (left) to the output
// side (right), each shunt under the line between the two series parts it
// joins. Nil when no device of the stage has the ladder's ends on its
// output and control electrodes, or the ladder is longer than a template
// reaches.
func feedbackLadder(l ladder, parts []string, c *graph.Circuit, held func(string) bool) []render.Place {
	for _, r := range parts {
		dev := c.Part(r)
		if dev == nil || !dev.IsActive() {
			continue
		}
		ctl, out := dev.NetOf(dev.PinWithRole(graph.RoleControl)), dev.NetOf(dev.PinWithRole(graph.RoleOutput))
		els := l.elems
		switch {
		case ctl == "" || out == "":
			continue
		case l.start() == ctl && l.end() == out:
		case l.start() == out && l.end() == ctl:
			els = reversed(els)
		default:
			continue
		}
		line := ladderLine(els, dev.Ref, 2)
		if line == nil {
			return nil
		}
		places := []render.Place{{Ref: dev.Ref, Anchor: dev.Ref}}
		places = append(places, devicePlaces(dev, parts, c, held)...)
		if splitLead(dev, parts, c) {
			// a part-bypassed lead takes row 1 under the device
			// (leadPlaces), the ladder row 2 under it: left to the
			// generic placement the ladder came out as capacitors
			// scattered round the collector (review16 b01)
			places = append(places, leadPlaces(dev, parts, c)...)
		}
		return append(places, line...)
	}
	return nil
}

// reversed is a ladder's arms walked from its other end: the series arms
// turned about, each shunt arm still from its inner net down.
func reversed(els []arm) []arm {
	out := make([]arm, len(els))
	for i, m := range els {
		if i%2 == 0 {
			m = m.flipped()
		}
		out[len(els)-1-i] = m
	}
	return out
}

// ladderLine are the slots of a ladder's arms round anchor: each series
// part a column of its own along row, each shunt arm a column between
// the series arms it joins, its parts stacked down from the line. Nil
// when the line reaches further than a template does either side.
func ladderLine(els []arm, anchor string, row int) []render.Place {
	cols := 0
	for i, m := range els {
		if i%2 == 0 {
			cols += len(m.parts)
		} else {
			cols++
		}
	}
	half := cols / 2
	if half > ladderReach || cols-1-half > ladderReach {
		return nil
	}
	var places []render.Place
	col := -half
	for i, m := range els {
		for j, ref := range m.parts {
			if i%2 == 0 {
				places = append(places, render.Place{Ref: ref, Anchor: anchor, Col: col, Row: row, Stand: "horizontal", Line: true})
				col++
				continue
			}
			places = append(places, render.Place{Ref: ref, Anchor: anchor, Col: col, Row: row + 1 + j, Stand: "vertical"})
		}
		if i%2 == 1 {
			col++
		}
	}
	return places
}

// devicePlaces are the slots of a device's own two-terminal parts round
// it: those from its common electrode to AC ground under it, those from
// its output electrode to AC ground (its load to the rail) above and
// right of it, those from its control electrode to AC ground (bias, the
// ladder's last leg) hanging from the wire into it, left of it.
func devicePlaces(dev *graph.Part, parts []string, c *graph.Circuit, held func(string) bool) []render.Place {
	common, out := dev.NetOf(dev.PinWithRole(graph.RoleCommon)), dev.NetOf(dev.PinWithRole(graph.RoleOutput))
	ctl := dev.NetOf(dev.PinWithRole(graph.RoleControl))
	var places []render.Place
	col := -1
	for _, r := range parts {
		p := c.Part(r)
		if p == nil || p == dev || len(p.Pins) != 2 {
			continue
		}
		a, b := p.Pins[0].Net, p.Pins[1].Net
		if held(a) {
			a, b = b, a
		}
		feed := a == ctl && !c.RoleOf(b).IsACGround() && len(p.Origins()) == 1
		if !held(b) || held(a) || a != out && !c.RoleOf(b).IsACGround() && !feed {
			continue // a line is a rail to the output load and a bias feed only
		}
		if feed {
			// a bias feed from a decoupled line stands over the wire into
			// the control electrode, up to its line: left to the generic
			// placement it took the slot under the split lead's second part
			// (good/review-osc-c3-phaseshift's R3 over R8's lead)
			places = append(places, render.Place{Ref: r, Anchor: dev.Ref, Col: -1, Row: -1, Stand: "vertical"})
			continue
		}
		switch a {
		case common:
			places = append(places, render.Place{Ref: r, Anchor: dev.Ref, Col: 0, Row: 1, Stand: "vertical"})
		case out:
			places = append(places, render.Place{Ref: r, Anchor: dev.Ref, Col: 1, Row: -1, Stand: "vertical"})
		case ctl:
			// a merged bias divider is drawn as its halves across the
			// wire into the control electrode (halfSlots), not as one
			// part in a slot of its own: review16 b01's last leg read
			// "R5 9k56 ≡ R5, R6" where the set has a divider
			if len(p.Origins()) > 1 {
				continue
			}
			if col >= -ladderReach {
				places = append(places, render.Place{Ref: r, Anchor: dev.Ref, Col: col, Row: 0, Stand: "vertical"})
				col--
			}
		}
	}
	return places
}

// hasNet tells whether a part has a pin on net.
func hasNet(p *graph.Part, net string) bool {
	for _, pn := range p.Pins {
		if pn.Net == net {
			return true
		}
	}
	return false
}

// splitLead tells whether a part of the stage runs from the device's
// common electrode to a net other than AC ground (a part-bypassed
// emitter's unbypassed resistor): the template places a common lead only
// as parts straight to chassis under the device, and with such a lead its
// ladder's slots collided and the sheet came out worse than the generic
// placement's.
func splitLead(dev *graph.Part, parts []string, c *graph.Circuit) bool {
	common := dev.NetOf(dev.PinWithRole(graph.RoleCommon))
	if common == "" || c.RoleOf(common).IsACGround() {
		return false
	}
	for _, r := range parts {
		p := c.Part(r)
		if p == nil || p == dev || !hasNet(p, common) {
			continue
		}
		for _, pn := range p.Pins {
			if pn.Net != common && !c.RoleOf(pn.Net).IsACGround() {
				return true
			}
		}
	}
	return false
}

// leadRow2 and leadRow2Col are where leadPlaces puts the parts a split
// lead leads on to: beside the lead's first part in its row, so the lead
// takes one row and the ladder keeps row 2.
const leadRow2, leadRow2Col = 1, 1

// leadPlaces are the slots of a split common lead under its device: the
// parts on the common electrode in row 1 (the unbypassed resistor, a
// preset), those on the nets they lead on to in row 2 side by side (the
// bypassed part, its capacitor), as the trade draws a partly bypassed
// emitter.
func leadPlaces(dev *graph.Part, parts []string, c *graph.Circuit) []render.Place {
	common := dev.NetOf(dev.PinWithRole(graph.RoleCommon))
	var out []render.Place
	placed := map[string]bool{dev.Ref: true}
	next := map[string]bool{}
	col := 0
	for _, r := range parts {
		p := c.Part(r)
		if p == nil || placed[r] || p.IsActive() || !hasNet(p, common) {
			continue
		}
		placed[r] = true
		out = append(out, render.Place{Ref: r, Anchor: dev.Ref, Col: col, Row: 1, Stand: "vertical"})
		col++
		for _, pn := range p.Pins {
			if pn.Net != common && !c.RoleOf(pn.Net).IsACGround() {
				next[pn.Net] = true
			}
		}
	}
	col = max(col, leadRow2Col)
	for _, r := range parts {
		p := c.Part(r)
		if p == nil || placed[r] || p.IsActive() || len(p.Pins) != 2 || col > ladderReach {
			continue
		}
		if next[p.Pins[0].Net] || next[p.Pins[1].Net] {
			placed[r] = true
			out = append(out, render.Place{Ref: r, Anchor: dev.Ref, Col: col, Row: leadRow2, Stand: "vertical"})
			col++
		}
	}
	return out
}

// fullLadder is ladderPlaces on the original circuit's sheet, none when a
// part the stage does not hold hangs on the device's common electrode (a
// cathode bias the reduction removed, faded): the template's common-lead
// slots left it where the ladder goes, and the router failed the anode
// and cathode nets (testdata/phase-shift/valve-highpass4, faded).
func fullLadder(parts []string, reduced, full *graph.Circuit) []render.Place {
	l, ok := findLadder(parts, full)
	if !ok {
		return nil
	}
	// a decoupled supply line (a net the reduction held at AC ground or
	// took away) is a rail to the device's output load: the collector
	// load goes up over the output electrode as on the reduced sheet,
	// where left in the generic place it stood in the ladder's row
	// (good/review-osc-c3-phaseshift); the bias to it keeps its generic
	// place, which hung review16 b01's divider clear of the ladder
	held := func(n string) bool {
		return full.RoleOf(n).IsACGround() || reduced.Net(n) == nil || reduced.RoleOf(n).IsACGround()
	}
	places := feedbackLadder(l, parts, full, held)
	if len(places) == 0 {
		return nil
	}
	dev := full.Part(places[0].Anchor)
	common := dev.NetOf(dev.PinWithRole(graph.RoleCommon))
	if common == "" || full.RoleOf(common).IsACGround() {
		return places
	}
	for _, k := range full.ConnsOf(common) {
		if k.Part != nil && k.Part != dev && !slices.Contains(parts, k.Part.Ref) {
			return nil
		}
	}
	return places
}
