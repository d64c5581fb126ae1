package stages

import "pare/graph"

// vbeMultiplierAcross reports whether p is a Vbe multiplier: a bipolar
// transistor whose base sits on the tap of a divider from its collector to
// its emitter (a resistor or preset straight from the collector to the
// base, and one or two in series from the base to the emitter; handbook
// amplified-diode bias, from memory). It is a bias source that stands
// between an output pair's bases like a chain of diodes: a walk from a
// load to its driver crosses it, collector to emitter, rather than taking
// it for the driver.
func vbeMultiplierAcross(c *graph.Circuit, p *graph.Part) bool {
	if p.Kind != graph.BJT {
		return false
	}
	b, col, e := p.NetOf("b"), p.NetOf("c"), p.NetOf("e")
	if b == "" || col == "" || e == "" || b == col || b == e || col == e {
		return false
	}
	return resistiveSteps(c, col, b, 1) && resistiveSteps(c, b, e, 2)
}

// resistiveSteps reports whether from reaches to through at most n
// resistors or presets in series (any of a preset's pins counts), not
// through AC ground.
func resistiveSteps(c *graph.Circuit, from, to string, n int) bool {
	if n <= 0 {
		return false
	}
	for _, cn := range c.ConnsOf(from) {
		p := cn.Part
		if p.Kind != graph.Resistor && p.Kind != graph.Pot {
			continue
		}
		for _, q := range p.Pins {
			if q.Net == to {
				return true
			}
			if q.Net != from && !c.RoleOf(q.Net).IsACGround() && resistiveSteps(c, q.Net, to, n-1) {
				return true
			}
		}
	}
	return false
}
