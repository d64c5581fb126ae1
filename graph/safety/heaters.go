// Heater and mains-winding evidence: which valves are rectifiers fed by a
// mains winding, which heater windings sit at HT, and series heater chains.

package safety

import (
	"fmt"

	"pare/graph"
)

// fedByMainsWinding says whether a valve diode's anodes hang on a winding
// of a transformer that declares its mains frequency: a rectifier, whether
// or not the netlist declares the HT its cathode charges (review21 a04's
// directly heated rectifier, its reservoir an estimated rail, lost the
// caution that its filament winding sits at the full HT).
func fedByMainsWinding(c *graph.Circuit, p *graph.Part) bool {
	for _, pin := range p.Pins {
		if pin.Name != "a" && pin.Name != "a1" && pin.Name != "a2" {
			continue
		}
		if n := c.Net(pin.Net); n != nil && n.Role == graph.Ground {
			// an unused diode anode strapped to chassis (a detector
			// diode-triode's spare) touches a winding's centre tap
			// there, yet no winding drives it: it rectifies nothing
			continue
		}
		for _, cn := range c.ConnsOf(pin.Net) {
			if _, mains := cn.Part.Params["hz"]; mains && cn.Part.Kind == graph.Transformer {
				return true
			}
		}
	}
	return false
}

// hotHeaterWindings finds the transformer windings that feed a valve's
// heater with an end on a net at HT. The filament of a directly heated
// rectifier valve is its cathode, so its winding sits at the full HT: its
// tags, leads and the valve's filament pins are live at HT though the
// winding gives only a few volts (common practice: technicians are warned
// of it). A heater winding returned to chassis is not listed.
func hotHeaterWindings(c *graph.Circuit, hot map[string]bool) []string {
	var out []string
	for _, p := range c.Parts {
		if p.Kind != graph.Transformer {
			continue
		}
		for _, w := range p.Windings {
			ends := []string{p.NetOf(w.From), p.NetOf(w.To)}
			var on string
			for _, e := range ends {
				if hot[e] {
					on = e
				}
			}
			if on == "" {
				continue
			}
			if v := heatedBy(c, ends[:1]); v != "" && v == heatedBy(c, ends[1:]) {
				// a heater across the winding: one valve's heater pins on
				// both its ends (an output transformer's primary on the HT
				// a directly heated rectifier's filament also sits on is
				// no heater winding)
				out = append(out, fmt.Sprintf("%s winding %s, %s's heater, on %s", p.Ref, w.Name, v, on))
			}
		}
	}
	return out
}

// heatedBy names the first valve with a heater pin on one of nets, or "".
func heatedBy(c *graph.Circuit, nets []string) string {
	for _, n := range nets {
		for _, cn := range c.ConnsOf(n) {
			if cn.Part.Kind == graph.Valve && graph.RoleOfPin(graph.Valve, cn.Pin) == graph.RoleHeater {
				return cn.Part.Ref
			}
		}
	}
	return ""
}

// spreadMains follows the mains from the nets that bring it in through
// the parts that pass it on unchanged: a switch's contacts (any pair some
// position closes: the on/off switch on the volume control) and a fuse. A
// mains transformer behind the switch is still on the mains; without this
// the set would count as one with no mains transformer at all.
func spreadMains(c *graph.Circuit, mains map[string]bool) {
	for grew := len(mains) > 0; grew; {
		grew = false
		for _, p := range c.Parts {
			for _, pair := range passes(p) {
				a, b := p.NetOf(pair[0]), p.NetOf(pair[1])
				if a == "" || b == "" || a == "nc" || b == "nc" || mains[a] == mains[b] {
					continue
				}
				mains[a], mains[b] = true, true
				grew = true
			}
		}
	}
}

// seriesHeaters finds valves whose heaters are wired in series: in a
// parallel heater supply every valve has the same pair of heater nets,
// while in a chain two valves share exactly one heater net and each has
// its other heater pin elsewhere. Sections of one envelope count once.
func seriesHeaters(c *graph.Circuit) []string {
	type heater struct {
		who  string
		nets [2]string
	}
	var hs []heater
	seen := map[string]bool{}
	for _, p := range c.Parts {
		if p.Kind != graph.Valve {
			continue
		}
		h1, h2 := p.NetOf("h1"), p.NetOf("h2")
		if h1 == "" || h2 == "" || h1 == h2 {
			continue // one heater pin ("h") or a shorted heater says nothing
		}
		who := p.Ref
		if p.Envelope != "" {
			who = p.Envelope
		}
		if seen[who] {
			continue
		}
		seen[who] = true
		hs = append(hs, heater{who, [2]string{h1, h2}})
	}
	var out []string
	for i := range hs {
		for j := i + 1; j < len(hs); j++ {
			a, b := hs[i].nets, hs[j].nets
			shared := 0
			for _, x := range a {
				if x == b[0] || x == b[1] {
					shared++
				}
			}
			if shared == 1 {
				out = append(out, hs[i].who+"–"+hs[j].who)
			}
		}
	}
	return out
}

// mainsWord and mainsAC find a mains input in a name or label: the word
// itself, or an AC voltage in the range of public supplies (100–250 V,
// written "230 V~", "240 V AC", "120VAC"). A mains label that names a
// transformer ("from the mains transformer") means the transformer is
// there, cut away from the sheet. acdcWord finds a set called AC/DC or
// universal outright.
