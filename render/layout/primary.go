package layout

import (
	"pare/graph"
	"pare/render/geom"
	"pare/render/symbol"
)

// The trade draws a transformer primary left, secondary right, the signal
// going through it left to right (../shared/DRAWING-NOTES.md); scoring
// the pins alone drew review17 b05's output transformer mirrored on its
// faded view, where the secondary's loudspeaker lead happened to be the
// nearer one on the left. So a transformer's orientation keeps its
// primary's pins out of the right side.

// primaryPins are the pin names of a transformer's primary: the coil
// (windings chained at shared pins) with a pin on a net an active part's
// output electrode drives (an anode, collector or drain feeding it); nil
// when no coil is so fed, the symbol's own order (first winding left)
// standing.
func (ly *state) primaryPins(p *graph.Part) map[string]bool {
	if ly.outNets == nil {
		ly.outNets = map[string]bool{}
		for _, cl := range ly.cells {
			if !cl.part.IsActive() {
				continue
			}
			for _, pn := range cl.part.Pins {
				if graph.RoleOfPin(cl.part.Kind, pn.Name) == graph.RoleOutput && ly.carries(pn.Net) {
					ly.outNets[pn.Net] = true
				}
			}
		}
	}
	pins := map[string]bool{}
	for _, w := range p.Windings {
		if ly.outNets[p.NetOf(w.From)] || ly.outNets[p.NetOf(w.To)] {
			pins[w.From], pins[w.To] = true, true
			break
		}
	}
	if len(pins) == 0 || len(pins) == len(p.Pins) {
		return nil
	}
	for grown := true; grown; {
		grown = false
		for _, w := range p.Windings {
			if pins[w.From] != pins[w.To] {
				pins[w.From], pins[w.To], grown = true, true, true
			}
		}
	}
	if len(pins) == len(p.Pins) {
		return nil // one coil, tapped: no side to keep
	}
	return pins
}

// primaryLeft says whether shape s keeps every primary pin off the right.
func primaryLeft(s symbol.Shape, prim map[string]bool) bool {
	for _, pn := range s.Pins {
		if prim[pn.Name] && pn.Dir == geom.Right {
			return false
		}
	}
	return true
}
