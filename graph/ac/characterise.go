package ac

import (
	"pare/graph"
)

// What still characterises a circuit with no declared input (an
// oscillator, a VFO): the driving-point impedance of each tank, and the
// transfer from each amplifying part's control electrode to its output
// (to its common electrode when the output is at AC ground: a follower).
// Without these the only quantity left may be the impedance of an output
// behind a buffer, and a proof of that alone says nothing about the
// frequency-setting parts.

// characterise adds those quantities, in part order, when orig declares no
// input. A tank net is one that carries both a coil's pin and a
// capacitor's and is not at AC ground.
func (ql *quantityList) characterise() {
	orig := ql.orig
	if len(orig.Inputs) > 0 {
		return
	}
	coil, capa := map[string]bool{}, map[string]bool{}
	var order []string
	for _, p := range orig.Parts {
		for _, pin := range p.Pins {
			switch p.Kind {
			case graph.Inductor, graph.Transformer:
				coil[pin.Net] = true
			case graph.Capacitor:
				capa[pin.Net] = true
			default:
				continue
			}
			order = append(order, pin.Net)
		}
	}
	for _, net := range order {
		if !coil[net] || !capa[net] || !usable(net) || orig.RoleOf(net).IsACGround() {
			continue
		}
		rn, ok := ql.mapped(net, noAlt)
		if !ok {
			continue
		}
		ql.add(quantity{what: "impedance", tank: true, from: net, rFrom: rn, bands: ql.bandsAt(net)})
		// A declared output is what the circuit is for: the transfer from
		// the tank to it (an oscillator's buffer and its load) is compared
		// too, not only the tank itself.
		for j, out := range orig.Outputs {
			if out == net {
				continue
			}
			if rout, ok := ql.mapped(out, ql.outputAlt(j)); ok {
				ql.add(quantity{what: "transfer", from: net, to: out, rFrom: rn, rTo: rout, bands: ql.bandsAt(net)})
			}
		}
	}
	for _, p := range orig.Parts {
		if !p.IsActive() {
			continue
		}
		in, out := p.NetOf(p.PinWithRole(graph.RoleControl)), p.NetOf(p.PinWithRole(graph.RoleOutput))
		if orig.RoleOf(out).IsACGround() {
			out = p.NetOf(p.PinWithRole(graph.RoleCommon)) // a follower: the signal leaves by the common electrode
		}
		if !usable(in) || !usable(out) || in == out || orig.RoleOf(in).IsACGround() || orig.RoleOf(out).IsACGround() {
			continue
		}
		rin, ok1 := ql.mapped(in, noAlt)
		rout, ok2 := ql.mapped(out, noAlt)
		if ok1 && ok2 {
			ql.add(quantity{what: "transfer", from: in, to: out, rFrom: rin, rTo: rout, bands: ql.bandsAt(in)})
		}
	}
}
