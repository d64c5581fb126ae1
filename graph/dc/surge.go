package dc

import "pare/graph"

// surgeResistor is the one resistor from the rectifier's net to a net with
// a reservoir capacitor (a surge-limiting resistor before the reservoir),
// nil when the net has no such resistor or more than one part besides the
// rectifying junctions: review17's reviewer was told only "capacitor-input
// filters only", not how to capture the common surge resistor.
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
