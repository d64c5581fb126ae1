package pipeline

import (
	"slices"

	"pare/graph"
	"pare/render"
)

// An RC ladder (a phase-shift oscillator's feedback network, a chain of
// low-pass sections inside one stage) is drawn the way the trade draws
// one: its series parts in a line, each inner node's shunt part hanging
// from the line between the two series parts it joins, down to chassis, in
// the order the signal passes them (common practice). Left to the generic
// placement, review14 b01's ladder came out tangled round the oscillator's
// collector load.

// ladder is a chain of series parts joined at inner nets, each holding
// exactly one shunt part to AC ground: elems alternate series, shunt,
// series ... series.
type ladder struct {
	elems []string
}

// ladderMin is the fewest inner nodes that make a ladder worth a template:
// two (three sections of a phase-shift network, or a pi and a half); a
// single node is an L or a pi section the generic placement draws in line.
const ladderMin = 2

// findLadder is the longest ladder among parts on c, ok false for none.
// An inner net holds the stage's two series parts and its one shunt, and
// no device and no other part of the stage; a part of another stage may
// tap it (a buffer's coupling capacitor on the ladder's middle node).
func findLadder(parts []string, c *graph.Circuit) (ladder, bool) {
	in := map[string]bool{}
	for _, r := range parts {
		in[r] = true
	}
	ground := func(n string) bool { return c.RoleOf(n).IsACGround() }
	twoEnded := func(p *graph.Part) bool {
		return p != nil && in[p.Ref] && len(p.Pins) == 2 &&
			(p.Kind == graph.Resistor || p.Kind == graph.Capacitor || p.Kind == graph.Inductor)
	}
	series, shunt := map[string][]string{}, map[string][]string{}
	for _, r := range parts {
		p := c.Part(r)
		if !twoEnded(p) {
			continue
		}
		a, b := p.Pins[0].Net, p.Pins[1].Net
		switch {
		case ground(a) && !ground(b):
			shunt[b] = append(shunt[b], r)
		case ground(b) && !ground(a):
			shunt[a] = append(shunt[a], r)
		case !ground(a) && !ground(b) && a != b:
			series[a] = append(series[a], r)
			series[b] = append(series[b], r)
		}
	}
	inner := func(n string) bool {
		if len(series[n]) != 2 || len(shunt[n]) != 1 {
			return false
		}
		for _, k := range c.ConnsOf(n) {
			if p := k.Part; p == nil || p.IsActive() || in[p.Ref] && !slices.Contains(series[n], p.Ref) && shunt[n][0] != p.Ref {
				return false
			}
		}
		return true
	}
	var best ladder
	for _, r := range parts {
		p := c.Part(r)
		if !twoEnded(p) || len(series[p.Pins[0].Net]) == 0 || len(series[p.Pins[1].Net]) == 0 {
			continue
		}
		// start at a series part with an end that is no inner net
		for _, end := range p.Pins {
			if inner(end.Net) {
				continue
			}
			l := walkLadder(c, p, end.Net, series, shunt, inner)
			if len(l.elems) > len(best.elems) {
				best = l
			}
		}
	}
	return best, len(best.elems) >= 2*ladderMin+1
}

// walkLadder follows a ladder from series part p entered at net from.
func walkLadder(c *graph.Circuit, p *graph.Part, from string, series, shunt map[string][]string, inner func(string) bool) ladder {
	var l ladder
	seen := map[string]bool{}
	for p != nil && !seen[p.Ref] {
		seen[p.Ref] = true
		l.elems = append(l.elems, p.Ref)
		next := p.Pins[0].Net
		if next == from {
			next = p.Pins[1].Net
		}
		if !inner(next) {
			break
		}
		l.elems = append(l.elems, shunt[next][0])
		var q *graph.Part
		for _, r := range series[next] {
			if r != p.Ref {
				q = c.Part(r)
			}
		}
		p, from = q, next
	}
	if len(l.elems)%2 == 0 { // ended on a shunt: the series part was seen
		l.elems = l.elems[:len(l.elems)-1]
	}
	return l
}

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
	first, last := c.Part(l.elems[0]), c.Part(l.elems[len(l.elems)-1])
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
		case hasNet(first, ctl) && hasNet(last, out):
		case hasNet(first, out) && hasNet(last, ctl):
			els = slices.Clone(els)
			slices.Reverse(els)
		default:
			continue
		}
		half := len(els) / 2
		if half > ladderReach {
			return nil
		}
		places := []render.Place{{Ref: dev.Ref, Anchor: dev.Ref}}
		row := 2
		places = append(places, devicePlaces(dev, parts, c, held)...)
		if splitLead(dev, parts, c) {
			// a part-bypassed lead takes row 1 under the device
			// (leadPlaces), the ladder row 2 under it: left to the
			// generic placement the ladder came out as capacitors
			// scattered round the collector (review16 b01)
			places = append(places, leadPlaces(dev, parts, c)...)
		}
		for i, ref := range els {
			pl := render.Place{Ref: ref, Anchor: dev.Ref, Col: i - half, Row: row, Stand: "horizontal", Line: true}
			if i%2 == 1 {
				pl.Row, pl.Stand, pl.Line = row+1, "vertical", false
			}
			places = append(places, pl)
		}
		return places
	}
	return nil
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
