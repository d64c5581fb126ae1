package dc

import (
	"fmt"
	"strings"

	"pare/graph"
	"pare/graph/value"
)

// sinkingRail words a declared rail that takes current in rather than
// giving it out: the circuit feeds it (a supply through a dropper) more
// than its loads draw, and pare, holding the declared voltage, sinks the
// difference in the rail itself. In the set a shunt regulator across the
// rail (a zener) carries that current; held by the rail, the regulator
// shows next to none, which a reader would take for an open zener (a blind
// review's "D8 forward current 0 A"). "" for a rail that gives current, and
// for a bias line.
func (p *Point) sinkingRail(net string, amps float64) string {
	if amps > -1e-6 || p.Circuit.RoleOf(net) == graph.Bias {
		// a bias line (an AGC line held at rest) takes in the current of
		// the dividers returned to it: its source (the detector's load)
		// sinks that in the set too, no fault of the capture
		return ""
	}
	var shunts []string
	for _, cn := range p.Circuit.ConnsOf(net) {
		d := cn.Part
		if d.Kind != graph.Diode || d.Type != "zener" || len(d.Pins) != 2 {
			continue
		}
		other := d.Pins[0].Net
		if other == net {
			other = d.Pins[1].Net
		}
		if p.Circuit.RoleOf(other) == graph.Ground {
			shunts = append(shunts, d.Ref)
		}
	}
	taken := value.FormatPrec(-amps, value.Ampere, value.Symbol, 3)
	if len(shunts) == 0 {
		return fmt.Sprintf("rail %s takes in %s from the circuit instead of giving current: something feeds it more than its loads draw, and the declared voltage is held regardless (check the capture)", net, taken)
	}
	return fmt.Sprintf("rail %s is held at its declared voltage and takes in %s from the circuit: in the set the shunt regulator %s across it carries that current (shown here next to none, the declared voltage holding the rail); check it at the bench, not against this chart",
		net, taken, strings.Join(shunts, ", "))
}
