// The stages before a frequency change: a superhet's aerial coupling, RF
// amplifier and RF transformer work at the signal frequency, and a linear
// model has no mixing, so the input-to-output transfer proves nothing
// there. The proof compares the transfer from the input to the grid (base,
// gate) of the first frequency changer instead, over the input's bands:
// every stage between the declared input and the frequency change.

package ac

import (
	"fmt"

	"pare/graph"
	"pare/graph/value"
)

// changer is the first frequency changer after an input: the device, and
// its electrode nearest the input (where the signal enters it).
type changer struct {
	ref, entry, output string
}

// frequencyChanger finds, walking from the input without passing AC ground,
// the nearest active device whose output electrode carries the IF band
// (its net shares a band with the detector's IF net: a part of the IF
// region hangs on it): the valve or transistor whose anode or collector is
// the first at the IF. ok is false when no device is found.
func frequencyChanger(c *graph.Circuit, v *graph.View, bandsAt func(string) []value.Range, in, ifNet string) (changer, bool) {
	w := graph.NewWalk(v)
	w.Follow = func(net string) bool { return !c.RoleOf(net).IsACGround() }
	w.FromNets([]string{in}, 0)
	var best changer
	bestD := -1
	for _, p := range w.Parts() { // what the walk reached: one channel of a set, not the set
		if p.Kind != graph.Valve && p.Kind != graph.BJT && p.Kind != graph.FET {
			continue
		}
		d, ok := w.PartDist(p)
		if !ok || (bestD >= 0 && d >= bestD) {
			continue
		}
		out := electrodeNet(p, graph.RoleOutput)
		if out == "" || !overlaps(bandsAt(out), bandsAt(ifNet)) {
			continue
		}
		entry := nearestElectrode(c, w, p)
		if entry == "" {
			continue
		}
		best, bestD = changer{ref: p.Ref, entry: entry, output: out}, d
	}
	return best, bestD >= 0
}

// electrodeNet is the net of p's first terminal of the role, "" if none.
func electrodeNet(p *graph.Part, role graph.TermRole) string {
	for _, pin := range p.Pins {
		if graph.RoleOfPin(p.Kind, pin.Name) == role && usable(pin.Net) {
			return pin.Net
		}
	}
	return ""
}

// nearestElectrode is the net of p's control, common or grid electrode
// nearest the walk's start, not at AC ground: where the signal enters it
// (the signal grid of a heptode, the one grid of a self-oscillating
// pentode, the base of a transistor mixer).
func nearestElectrode(c *graph.Circuit, w *graph.Walk, p *graph.Part) string {
	best, bestD := "", -1
	for _, pin := range p.Pins {
		switch graph.RoleOfPin(p.Kind, pin.Name) {
		case graph.RoleControl, graph.RoleCommon, graph.RoleGrid:
		default:
			continue
		}
		if !usable(pin.Net) || c.RoleOf(pin.Net).IsACGround() {
			continue
		}
		if d, ok := w.NetDist(pin.Net); ok && (bestD < 0 || d < bestD || d == bestD && pin.Net < best) {
			best, bestD = pin.Net, d
		}
	}
	return best
}

// frontEnd adds the transfer from the input to the frequency changer's
// entry over the input's bands, and returns what the note says instead of
// the input-to-output pair.
func (ql *quantityList) frontEnd(in string, i int, ifNet string) string {
	if ql.view == nil {
		ql.view = ql.orig.View()
	}
	ch, ok := frequencyChanger(ql.orig, ql.view, ql.bandsAt, in, ifNet)
	if !ok {
		return "no frequency changer was found between them, so nothing compares the stages from the input to the IF"
	}
	rin, ok1 := ql.mapped(in, ql.inputAlt(i))
	rEntry, ok2 := ql.mapped(ch.entry, noAlt)
	if !ok1 || !ok2 {
		return fmt.Sprintf("the stages from %s to frequency changer %s are not compared: a net is gone from the reduced circuit", in, ch.ref)
	}
	ql.add(quantity{what: "transfer", from: in, to: ch.entry, rFrom: rin, rTo: rEntry, bands: ql.bandsAt(in)})
	text := fmt.Sprintf("V(%s)/V(%s) is compared there instead, through every stage up to frequency changer %s; %s's conversion from %s to %s is not compared (a linear model does not mix)",
		ch.entry, in, ch.ref, ch.ref, ch.entry, ch.output)
	if r := ql.regionFrom(ch.output); r != "" {
		return text + fmt.Sprintf(", region %s's pair covers the stages from %s on", r, ch.output)
	}
	return text + fmt.Sprintf(", and no region's pair starts at %s", ch.output)
}

// regionFrom names the region whose declared input is net, "" if none.
func (ql *quantityList) regionFrom(net string) string {
	for _, r := range ql.orig.Regions {
		if r.Input == net && r.Output != "" && r.Band.Min > 0 {
			return r.Name
		}
	}
	return ""
}
