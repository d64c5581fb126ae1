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
// standing, and nil for an oscillator coil, whose other winding returns
// to the same device's control or common electrode: it is no step of the
// signal path, and its template lays its windings out round the device
// (flipped primary-left, the example transistor front end's three-winding
// coil read worse).
func (ly *state) primaryPins(p *graph.Part) map[string]bool {
	if ly.outNets == nil {
		ly.outNets = map[string][]*graph.Part{}
		for _, cl := range ly.cells {
			if !cl.part.IsActive() {
				continue
			}
			for _, pn := range cl.part.Pins {
				if graph.RoleOfPin(cl.part.Kind, pn.Name) == graph.RoleOutput && ly.carries(pn.Net) {
					ly.outNets[pn.Net] = append(ly.outNets[pn.Net], cl.part)
				}
			}
		}
	}
	pins := map[string]bool{}
	var drivers []*graph.Part
	for _, w := range p.Windings {
		drivers = append(ly.outNets[p.NetOf(w.From)], ly.outNets[p.NetOf(w.To)]...)
		if len(drivers) > 0 {
			pins[w.From], pins[w.To] = true, true
			break
		}
	}
	for grown := len(pins) > 0; grown; {
		grown = false
		for _, w := range p.Windings {
			if pins[w.From] != pins[w.To] {
				pins[w.From], pins[w.To], grown = true, true, true
			}
		}
	}
	if len(pins) == 0 || len(pins) == len(p.Pins) || ly.reaction(p, pins, drivers) {
		return nil
	}
	return pins
}

// reaction says whether a pin of p off its primary (pins) is on a control
// or common electrode of one of the devices driving the primary, directly
// or through one capacitor (a link winding's coupling to the emitter).
func (ly *state) reaction(p *graph.Part, pins map[string]bool, drivers []*graph.Part) bool {
	into := map[string]bool{}
	for _, d := range drivers {
		for _, dp := range d.Pins {
			if r := graph.RoleOfPin(d.Kind, dp.Name); r == graph.RoleControl || r == graph.RoleCommon {
				into[dp.Net] = true
			}
		}
	}
	for _, pn := range p.Pins {
		if pins[pn.Name] || !ly.carries(pn.Net) {
			continue
		}
		if into[pn.Net] {
			return true
		}
		for _, cl := range ly.cells {
			q := cl.part
			if q.Kind == graph.Capacitor && len(q.Pins) == 2 && (q.Pins[0].Net == pn.Net && into[q.Pins[1].Net] || q.Pins[1].Net == pn.Net && into[q.Pins[0].Net]) {
				return true
			}
		}
	}
	return false
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
