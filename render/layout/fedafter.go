package layout

import "pare/graph"

// fedNets are, for each transformer a device's output electrode feeds (an
// anode's or collector's IF can, interstage or output transformer), the
// output nets it may be entered from by the rank's walk: signal flows left
// to right, so such a transformer stands a layer after the device feeding
// it, never beside or before it because the walk reached one of its other
// windings sooner (review-align-c4-heptode's IF can, whose secondary's
// cold end sits on the AGC line the aerial coil's secondary also returns
// to, was ranked level with its mixer and drawn left of the anode). The
// output of a device without a control electrode (a diode's anode, where
// an IF can's secondary feeds the detector) feeds nothing here, and a
// transformer with a winding on a net a gang section tunes (an oscillator
// or signal tank's coil, drawn under its device) is left to the tank
// placement. A transformer with no other net the signal crosses is left
// as it is. Only on a sheet of the original circuit (Options.Quiet given,
// if empty): on the reduced sheets the templates place the cans, and a
// reaction winding entered from its anode only opened an empty column in
// the grid-leak detector's frame.
func (ly *state) fedNets(parts []*graph.Part) map[*graph.Part]map[string]bool {
	if ly.o.Quiet == nil {
		return nil
	}
	outputs := map[string]bool{}
	ganged := map[string]bool{}
	for _, p := range parts {
		if p.Gang != "" {
			for _, pn := range p.Pins {
				ganged[pn.Net] = true
			}
		}
		if !p.IsActive() || p.PinWithRole(graph.RoleControl) == "" {
			continue
		}
		for _, pn := range p.Pins {
			if graph.RoleOfPin(p.Kind, pn.Name) == graph.RoleOutput && ly.carries(pn.Net) {
				outputs[pn.Net] = true
			}
		}
	}
	out := map[*graph.Part]map[string]bool{}
	for _, p := range parts {
		if p.Kind != graph.Transformer {
			continue
		}
		fed, other, tuned := map[string]bool{}, false, false
		for _, pn := range p.Pins {
			switch {
			case ganged[pn.Net]:
				tuned = true
			case outputs[pn.Net]:
				fed[pn.Net] = true
			case ly.carries(pn.Net):
				other = true
			}
		}
		if len(fed) > 0 && other && !tuned {
			out[p] = fed
		}
	}
	return out
}
