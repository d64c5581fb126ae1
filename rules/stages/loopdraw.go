package stages

import (
	"slices"

	"pare/graph"
)

// loopDraw extends a loop-found mixer's drawing template (the mixer
// pattern's, which knows the device and its IF transformer) with its
// oscillator, as the trade draws a frequency changer: the feedback
// transformer (the oscillator coil) below the device, the capacitors that
// tune its winding beside it on the left (the gang section and its
// trimmer level with it, a padder below it), and the parts between the
// tank and the device's electrodes (a grid capacitor, a grid leak) left
// of them, so the feedback leads stay short and run inside the
// stage rather than round the IF transformer. A stage without the
// device's own template gets one anchored on the device.
func loopDraw(w *world, st *Stage, dev *graph.Part, through string) []Place {
	draw := st.Draw
	if len(draw) == 0 || draw[0].Part != dev.Ref {
		draw = []Place{{Part: dev.Ref}}
	}
	placed := map[string]bool{}
	for _, pl := range draw {
		placed[pl.Part] = true
	}
	add := func(ref string, col, row int, stand string) {
		if ref == "" || placed[ref] || !slices.Contains(st.Parts, ref) {
			return
		}
		placed[ref] = true
		draw = append(draw, Place{Part: ref, Col: col, Row: row, Stand: stand})
	}
	add(through, 0, 1, "")
	for _, pl := range tankPlaces(w, through) {
		add(pl.Part, pl.Col, pl.Row, pl.Stand)
	}
	// the tank's coupling to the device: a capacitor from the tank to an
	// electrode (a grid capacitor) and a resistor on that electrode (a
	// grid leak) hanging from the electrode's wire left of the device
	var tnets map[string]bool
	if t := w.c.Part(through); t != nil {
		tnets = map[string]bool{}
		for _, pin := range t.Pins {
			tnets[pin.Net] = true
		}
	}
	col := -1
	for _, ref := range st.Parts {
		q := w.c.Part(ref)
		if q == nil || placed[ref] || len(q.Pins) != 2 || !touchesDevice(w.c, q, dev) {
			continue
		}
		if q.Kind == graph.Resistor || q.Kind == graph.Capacitor && touches(q, tnets) {
			add(ref, col, 0, "vertical")
			col--
		}
	}
	return draw
}

// touchesDevice tells whether two-terminal part q has a pin on one of the
// device's nets other than AC ground (where every return meets).
func touchesDevice(c *graph.Circuit, q, dev *graph.Part) bool {
	for _, p := range q.Pins {
		if c.RoleOf(p.Net).IsACGround() {
			continue
		}
		for _, d := range dev.Pins {
			if p.Net == d.Net {
				return true
			}
		}
	}
	return false
}

// tankPlaces are the slots of the capacitors that tune the oscillator
// coil's winding (the coil at column 0, row 1). With the gang section
// across the winding, it and the capacitors on its hot end (a trimmer)
// stand left of the coil, and the rest (a padder at the cold end) lies
// below it, from the cold end across to chassis (stood upright, its lead
// ran a step under the coil's ends, and a wire crossing the stage there
// read as joined to them). With a padder in series between the winding
// and the gang section, the padder stands left of the coil, hanging from
// its hot end, and the gang section with its trimmer below the padder,
// so the chain reads straight down to chassis.
func tankPlaces(w *world, through string) []Place {
	oc, caps, ok := loopTank(w, through)
	gang := gangSection(caps)
	if !ok || gang == nil {
		return nil
	}
	hot := ""
	for _, p := range gang.Pins {
		if !w.c.RoleOf(p.Net).IsACGround() {
			hot = p.Net
		}
	}
	ends := map[string]bool{w.names[oc.a]: true, w.names[oc.b]: true}
	on := func(c *graph.Part, nets map[string]bool) bool { return touches(c, nets) }
	var out []Place
	put := func(c *graph.Part, col, row int, stand string) {
		out = append(out, Place{Part: c.Ref, Col: col, Row: row, Stand: stand})
	}
	for _, c := range caps {
		switch {
		case ends[hot] && on(c, map[string]bool{hot: true}):
			put(c, -1, 1, "vertical") // the gang section and its trimmer
		case ends[hot]:
			put(c, 0, 2, "horizontal") // a padder at the cold end
		case on(c, ends) && on(c, map[string]bool{hot: true}):
			put(c, -1, 1, "vertical") // a series padder
		case on(c, map[string]bool{hot: true}):
			put(c, -1, 2, "vertical") // the gang section beyond it and its trimmer
		default:
			put(c, 0, 2, "vertical")
		}
	}
	// the slots in the order they stack, so a collision refuses the last
	slices.SortStableFunc(out, func(a, b Place) int { return a.Row - b.Row })
	return out
}
