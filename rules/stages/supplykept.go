package stages

import (
	"maps"
	"slices"
	"strings"

	"pare/graph"
)

// A supply stage is found on the full circuit, but the reduction may keep
// some of its parts on the reduced one: a region declared at the supply's
// own band (the ripple's) holds its smoothing resistor and capacitor, and
// a decoupler that feeds a line leaving the set by a port has no stage on
// the sheet to be grounded for. Those parts are the supply stage's, named
// by its wiring: the signal search, which sees only a resistor into a
// capacitor to chassis, must neither name them a signal stage ("RC low-pass
// section") nor fold them into the stage that draws on the line.

// supplyParts are the parts of the supply stages (group "power") the
// reduced circuit still holds, but a screen feed's: the trade draws a
// screen's dropper and bypass at the valve they feed. A merged part that
// also stands for a device's bias feed is not one: a base bias resistor
// from a decoupled line to the bias node (the cold end of the base
// winding, held by its own capacitor) runs from the line to AC ground as
// the line's decoupler does, so the reduction merges the two, and the
// device stage takes the merged part with it. A bleeder merged with the
// smoothing resistor stays the supply's: it feeds no electrode.
func supplyParts(power []*found, reduced, full *graph.Circuit) map[string]bool {
	held := map[string]bool{}
	for _, f := range power {
		if f.group != "power" || f.Topology == ScreenFeedTopology {
			continue // a screen feed is drawn with the stage whose screen it feeds
		}
		for r := range f.set {
			held[r] = true
		}
	}
	bias := biasNets(full)
	kept := map[string]bool{}
	for r := range held {
		if p := reduced.Part(r); p != nil && !feedsBias(p.Origins(), held, full, bias) {
			kept[r] = true
		}
	}
	return kept
}

// biasNets are the nets of the full circuit a device's control electrode
// sits on, and the far ends of the windings that reach one (the cold end
// of a base or grid winding, where its bias is fed) but chassis and
// supply lines: a winding returned there feeds no bias of its own.
func biasNets(full *graph.Circuit) map[string]bool {
	out := map[string]bool{}
	if full == nil {
		return out
	}
	for _, p := range full.Parts {
		if pin := p.PinWithRole(graph.RoleControl); pin != "" && p.IsActive() {
			out[p.NetOf(pin)] = true
		}
	}
	for _, p := range full.Parts {
		for _, w := range p.Windings {
			a, b := p.NetOf(w.From), p.NetOf(w.To)
			switch {
			case out[a] && !out[b] && full.RoleOf(b) == graph.Signal && b != "":
				out[b] = true
			case out[b] && !out[a] && full.RoleOf(a) == graph.Signal && a != "":
				out[a] = true
			}
		}
	}
	return out
}

// feedsBias tells whether a merged part stands for an original part no
// supply stage holds that has a terminal on a bias net.
func feedsBias(refs []string, held map[string]bool, full *graph.Circuit, bias map[string]bool) bool {
	for _, r := range refs {
		if held[r] || full == nil {
			continue
		}
		if p := full.Part(r); p != nil && p.Kind == graph.Resistor {
			for _, pin := range p.Pins {
				if bias[pin.Net] {
					return true
				}
			}
		}
	}
	return false
}

// withoutSupplied drops the signal stages whose every part a single supply
// stage holds: the supply stage says what they are (a decoupler, not a
// low-pass section in the signal path), and the "RC low-pass sections"
// whose capacitor is a supply stage's (a load resistor into a decoupler's
// capacitor: its output is a supply line). A stage with sub-stages is
// never dropped.
func withoutSupplied(signal, power []*found, c *graph.Circuit) []*found {
	var out []*found
	for _, f := range signal {
		if len(f.subs) > 0 || !coveredBySupply(f, power) && !(f.Topology == "rc-low-pass" && capsBySupply(f, power, c)) {
			out = append(out, f)
		}
	}
	return out
}

// coveredBySupply tells whether one supply stage holds every part of f.
func coveredBySupply(f *found, power []*found) bool {
	for _, p := range power {
		if p.group != "power" {
			continue
		}
		all := len(f.set) > 0
		for r := range f.set {
			all = all && p.set[r]
		}
		if all {
			return true
		}
	}
	return false
}

// StandsAlone tells whether the reduced circuit keeps ref as a part of
// the stage whose parts are given: it is there and stands for none but
// those parts. A parallel merge may keep a screen feed's ref for seven
// resistors from the HT line (its smoothing resistor, a bleeder,
// decouplers: review 17's b05); that part is not the screen feed's, and a
// frame or note that calls it so tells the reader the bundle does the
// screen feed's job.
func StandsAlone(reduced *graph.Circuit, ref string, parts []string) bool {
	p := reduced.Part(ref)
	if p == nil {
		return false
	}
	for _, o := range p.Origins() {
		if !slices.Contains(parts, o) {
			return false
		}
	}
	return true
}

// supplyNoteFor is SupplyNote, or where the reduction keeps some of the
// stage's parts, the note that says which stay on the reduced sheet.
func supplyNoteFor(parts []string, reduced *graph.Circuit) string {
	var kept []string
	for _, r := range parts {
		if StandsAlone(reduced, r, parts) {
			kept = append(kept, r)
		}
	}
	switch len(kept) {
	case 0:
		return SupplyNote
	case len(parts):
		return "supply stage found on the full circuit; the reduction keeps its parts on the reduced sheet"
	case 1:
		return "supply stage found on the full circuit; of its parts only " + kept[0] + " stays on the reduced sheet"
	}
	return "supply stage found on the full circuit; of its parts only " + strings.Join(kept[:len(kept)-1], ", ") + " and " + kept[len(kept)-1] + " stay on the reduced sheet"
}

// mergeSets is a new set holding the members of both.
func mergeSets(a, b map[string]bool) map[string]bool {
	out := make(map[string]bool, len(a)+len(b))
	for k := range a {
		out[k] = true
	}
	for k := range b {
		out[k] = true
	}
	return out
}

// capsBySupply tells whether f has capacitors and a supply stage holds
// each of them.
func capsBySupply(f *found, power []*found, c *graph.Circuit) bool {
	n := 0
	for r := range f.set {
		if p := c.Part(r); p == nil || p.Kind != graph.Capacitor {
			continue
		}
		n++
		held := false
		for _, p := range power {
			held = held || p.group == "power" && p.set[r]
		}
		if !held {
			return false
		}
	}
	return n > 0
}

// withSupplyLines is acg plus the lines the kept supply parts decouple:
// the net a kept capacitor holds against chassis or AC ground (a preamp's
// rail behind its decoupling resistor). The reduction keeps such a line
// because in band it is not quite AC ground, and the solver works on it as
// it is; but for the drawing a resistor from a device's electrode to it is
// that device's load or bias, returned to a supply, not a part of the
// signal path: left loose, it was drawn inside whatever frame stood next to
// it (a preamplifier's collector load in the next coupling's frame).
func withSupplyLines(c *graph.Circuit, acg, kept map[string]bool) map[string]bool {
	out := maps.Clone(acg)
	ground := func(net string) bool { return acg[net] || c.RoleOf(net).IsACGround() }
	for _, ref := range slices.Sorted(maps.Keys(kept)) {
		p := c.Part(ref)
		if p == nil || p.Kind != graph.Capacitor || len(p.Pins) != 2 {
			continue
		}
		a, b := p.Pins[0].Net, p.Pins[1].Net
		if ground(a) && !ground(b) {
			out[b] = true
		} else if ground(b) && !ground(a) {
			out[a] = true
		}
	}
	return out
}
