package pipeline

import (
	"slices"

	"pare/graph"
)

// withoutIdleWindings is the reduced circuit as its sheet draws it: a
// transformer's winding with an end that goes nowhere left off its symbol.
// Such a winding carries no current, so it neither loads nor drives the
// others on its core: the small-signal circuit is the same without it. The
// reduction leaves it there when a band switch is resolved (review21 b05:
// the oscillator coil's LW extension winding, in series with the tuned
// winding only on LW, has its far end on the switch's open contact on MW),
// and drawn it was a lead ending in the air, the coil read as two parts.
// The circuit is copied only when a winding goes; the reduction, its proof
// and the figures keep the part whole.
func withoutIdleWindings(c *graph.Circuit) *graph.Circuit {
	idle := map[string][]graph.Winding{}
	for _, p := range c.Parts {
		if p.Kind != graph.Transformer {
			continue
		}
		if keep := activeWindings(c, p); len(keep) < len(p.Windings) {
			idle[p.Ref] = keep
		}
	}
	if len(idle) == 0 {
		return c
	}
	out := c.CloneSharing(func(p *graph.Part) bool { return idle[p.Ref] != nil })
	for _, p := range out.Parts {
		keep, ok := idle[p.Ref]
		if !ok {
			continue
		}
		p.Windings = keep
		for _, pn := range slices.Clone(p.Pins) {
			if !windingsUse(keep, pn.Name) {
				out.DropPin(p.Ref, pn.Name)
			}
		}
	}
	return out
}

// activeWindings are p's windings less the idle ones, found again after
// each one goes (a tapped coil's far section idle leaves the tap the next
// section's open end when nothing else is on it). One winding always
// stays: the part is still drawn.
func activeWindings(c *graph.Circuit, p *graph.Part) []graph.Winding {
	keep := slices.Clone(p.Windings)
	for changed := true; changed && len(keep) > 1; {
		changed = false
		for i, w := range keep {
			if openEnd(c, p, keep, w.From) || openEnd(c, p, keep, w.To) {
				keep = slices.Delete(keep, i, i+1)
				changed = true
				break
			}
		}
	}
	return keep
}

// openEnd says whether pin is a winding end that goes nowhere: no other
// kept winding of the part shares it (a tap carries current on through the
// next section) and its net has no other terminal but ends of windings
// already found idle. An AC-ground or supply
// net goes somewhere even with one terminal drawn on it, and so does the
// circuit's input or output (an output transformer's secondary into the
// output flag when no speaker is captured).
func openEnd(c *graph.Circuit, p *graph.Part, keep []graph.Winding, pin string) bool {
	n := 0
	for _, w := range keep {
		if w.From == pin || w.To == pin {
			n++
		}
	}
	if n != 1 {
		return false
	}
	net := p.NetOf(pin)
	if net == "" || net == graph.NotConnected {
		return true
	}
	if c.RoleOf(net).IsACGround() || slices.Contains(c.Inputs, net) || slices.Contains(c.Outputs, net) {
		return false
	}
	for _, cn := range c.ConnsOf(net) {
		if cn.Part != p || cn.Pin != pin && windingsUse(keep, cn.Pin) {
			return false // another part, or a kept winding's end, is on it
		}
	}
	return true
}

// windingsUse says whether any of ws has pin as an end.
func windingsUse(ws []graph.Winding, pin string) bool {
	for _, w := range ws {
		if w.From == pin || w.To == pin {
			return true
		}
	}
	return false
}
