package stages

import (
	"pare/graph"
)

// A ganged set has one tank per gang section: the oscillator's and the
// signal circuit's (aerial, RF). An oscillator found by its loop gathers
// its parts outward from the device, and a mixer's signal input (the
// aerial coil's base winding) leads straight into the aerial tank; when no
// pattern named that tank as a stage of its own (a band whose aerial coil
// is two windings in series, a loading winding switched in on LW) the
// oscillator would swallow it, and the alignment would then take the
// aerial section for the oscillator's. The tank of another gang section is
// the signal circuit's, whatever band the switches select: it stays out of
// the oscillator's stage as it does on the band a pattern names.

// otherSections says which parts sit on the tank of a gang section other
// than the one that tunes the oscillator's winding on transformer through
// (nil when that winding is not tuned by a gang section: then no section
// is known to be the oscillator's). A part touching another section's hot
// net (its coil, its trimmers, the aerial's coupling capacitor) is that
// tank's.
func otherSections(w *world, through string) func(*graph.Part) bool {
	if through == "" {
		return nil
	}
	oc, caps, ok := loopTank(w, through)
	own := gangSection(caps)
	if !ok || own == nil {
		return nil
	}
	mine := map[string]bool{w.names[oc.a]: true, w.names[oc.b]: true}
	for _, p := range caps {
		for _, pin := range p.Pins {
			mine[pin.Net] = true
		}
	}
	hot := map[string]bool{}
	for _, p := range w.c.Parts {
		if p == own || p.Kind != graph.Capacitor || p.Gang != own.Gang || p.Type != graph.CapVariable {
			continue
		}
		for _, pin := range p.Pins {
			if n, ok := w.netID[pin.Net]; ok && n != groundNet && !mine[pin.Net] {
				hot[pin.Net] = true // its hot end: the cold one is folded into ground
			}
		}
	}
	if len(hot) == 0 {
		return nil
	}
	return func(q *graph.Part) bool { return touches(q, hot) }
}
