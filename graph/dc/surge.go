package dc

import (
	"fmt"

	"pare/graph"
	"pare/graph/value"
)

// surgeResistor is the one resistor from the rectifier's net to a net with
// a reservoir capacitor (a surge-limiting resistor before the reservoir),
// nil when the net has no such resistor or more than one part besides the
// rectifying junctions. It is modelled (rectifier.go): review19's reviewer
// captured the common 47 Ω surge limiter as a part of its own and got no DC
// chart.
func surgeResistor(c *graph.Circuit, net string) *graph.Part {
	var found *graph.Part
	for _, k := range c.ConnsOf(net) {
		p := k.Part
		if p == nil || p.Kind == graph.Diode || p.Kind == graph.Valve {
			continue
		}
		if found != nil || p.Kind != graph.Resistor || len(p.Pins) != 2 {
			return nil
		}
		found = p
	}
	if found == nil {
		return nil
	}
	far := found.Pins[0].Net
	if far == net {
		far = found.Pins[1].Net
	}
	if !(reservoir(c, far) > 0) {
		return nil
	}
	return found
}

// surgeFed is the rectifier whose surge resistor's rectifier end is the
// held net name, or nil.
func (m *model) surgeFed(name string) *rectifier {
	for k := range m.rects {
		if r := &m.rects[k]; r.feed != "" && r.feed == name {
			return r
		}
	}
	return nil
}

// SurgeHeatNote says where a surge resistor's watts come from.
const SurgeHeatNote = "the charging pulses' RMS current squared times R, from the rectifier's steady state"

// surgeEstimate is the estimate of the rectifier whose surge resistor is
// ref, or nil.
func (p *Point) surgeEstimate(ref string) *Estimate {
	for _, r := range p.m.rects {
		if r.surge == ref {
			return p.estimateFor(r.net)
		}
	}
	return nil
}

// Through says what an estimate's rectifier feeds its reservoir through
// beside the winding (" through R1, 47 Ω"), "" when straight.
func Through(e *Estimate) string {
	if e.Surge == "" {
		return ""
	}
	return fmt.Sprintf(" through %s, %s", e.Surge, value.FormatPrec(e.SurgeOhms, value.Ohm, value.Symbol, 3))
}

// held is the net the DC solve holds: the diodes' cathodes' net when a
// surge resistor stands before the reservoir, else the reservoir's.
func (r *rectifier) held() string {
	if r.feed != "" {
		return r.feed
	}
	return r.net
}

// heldVolts is the voltage the held net takes for estimate e: the
// reservoir's mean, plus the load current's drop in a surge resistor.
func (r *rectifier) heldVolts(e Estimate) float64 {
	if r.dead {
		return 0
	}
	if r.feed == "" { // no resistor before the reservoir (a mains-fed one's limiter is on the anode's side)
		return e.Volts
	}
	return e.Volts + e.Amps*r.rsurge
}
