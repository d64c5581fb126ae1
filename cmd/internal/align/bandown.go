package align

import "pare/graph"

// A band's own parts are also those the switch leaves in circuit only at
// this band's position while another position shorts them or leaves one
// end open: an LW aerial trimmer across the loading winding that the MW
// position shorts to chassis, a padder whose wafer contact is open on the
// other band. Their nets need not be on a contact closed at this position
// (the LW position of a shorting wafer closes nothing), so they are found
// by turning each band switch to its other positions and seeing which
// two-terminal parts drop out of circuit there.

// leftOutElsewhere are the two-terminal parts in circuit in c as its
// switches are set that some other position of one band switch (not a
// power switch) shorts or leaves open.
func leftOutElsewhere(c *graph.Circuit, power map[string]bool) map[string]bool {
	out := map[string]bool{}
	here := switched(c)
	for _, p := range c.Parts {
		pos := int(p.Set)
		if p.Kind != graph.Switch || pos < 1 || pos > len(p.Closes) || power[p.Ref] {
			continue
		}
		for other := 1; other <= len(p.Closes); other++ {
			if other == pos {
				continue
			}
			turned := c.Clone()
			turned.Part(p.Ref).Set = float64(other)
			there := switched(turned)
			for _, q := range here.Parts {
				if q.Kind != graph.Switch && len(q.Pins) == 2 && !outOfCircuit(here, q) {
					if r := there.Part(q.Ref); r == nil || outOfCircuit(there, r) {
						out[q.Ref] = true
					}
				}
			}
		}
	}
	return out
}

// outOfCircuit reports whether two-terminal part p of c carries no
// current: both pins on one net (shorted) or a pin on a net nothing else
// touches (open).
func outOfCircuit(c *graph.Circuit, p *graph.Part) bool {
	if p.Pins[0].Net == p.Pins[1].Net {
		return true
	}
	for _, pin := range p.Pins {
		if pin.Net == "nc" || len(c.ConnsOf(pin.Net)) < 2 {
			return true
		}
	}
	return false
}
