package graph

import (
	"slices"

	"pare/graph/value"
)

// checkRegionStrays warns for a part listed in a region whose every signal
// terminal sits on a net no other part of that region touches, while
// parts outside the region do: the part is judged at the region's band
// (a decoupler's bypass test, a coupling capacitor's), not at the band of
// the stages it serves. A supply decoupler listed with the audio parts
// turned an IF line into a signal net at 50 Hz, silently (review15 b03,
// as the reviewer first captured it).
func checkRegionStrays(c *Circuit) ErrorList {
	var w ErrorList
	for _, rg := range c.Regions {
		for _, ref := range rg.Parts {
			p := c.Part(ref)
			if p == nil || p.Kind == Port {
				continue
			}
			if net, ok := strayNet(c, rg, p); ok {
				w.Add(p.Pos, "%s is in region %s (%s), but no other part of that region is on %s, where parts outside it are: it is judged at the region's band, not at the band of the stages it serves; if it serves them (a supply decoupler), leave it out of the region",
					p.Ref, rg.Name, value.FormatRange(rg.Band, value.Hertz, value.Symbol), net)
			}
		}
	}
	return w
}

// strayNet is the first signal net of p when no net of p other than AC
// ground holds another part of rg (or is one of rg's nets) and some net of
// p holds a part outside rg that is a stage's (not a port or a switch).
func strayNet(c *Circuit, rg *Region, p *Part) (string, bool) {
	first, outside := "", false
	for _, pin := range p.Pins {
		n := pin.Net
		if n == "nc" || c.RoleOf(n).IsACGround() {
			continue
		}
		if slices.Contains(rg.Nets, n) || n == rg.Input || n == rg.Output {
			return "", false
		}
		if first == "" {
			first = n
		}
		for _, cn := range c.ConnsOf(n) {
			if cn.Part == p {
				continue
			}
			if slices.Contains(rg.Parts, cn.Part.Ref) {
				return "", false
			}
			// a port or a switch contact joins stages, it is none: a coil
			// reached through a wavechange switch is no stray
			outside = outside || cn.Part.Kind != Port && cn.Part.Kind != Switch && cn.Part.Kind != Generic
		}
	}
	return first, first != "" && outside
}
