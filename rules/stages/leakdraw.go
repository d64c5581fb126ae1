package stages

import (
	"slices"

	"pare/graph"
)

// leakPlaces extends the drawing template of each stage that hangs a
// capacitor from its device's control electrode (an oscillator's grid or
// base capacitor from the tank) with the stage's resistors on that
// electrode that the pattern does not name: the grid leak, a base bias
// resistor the stage keeps because it serves the device. The trade draws
// the leak from the grid wire to chassis beside the grid capacitor,
// further out from the device; left to the generic placement it stood in
// the grid capacitor's column, the tank's net tags on its leads (review15
// a01: C3 and R1 read as in series). Stages without such a capacitor in
// their template (the amplifier patterns name their leak) are left as
// they are.
func leakPlaces(c *graph.Circuit, tops []*found) {
	claimed, _ := claims(tops)
	for _, f := range tops {
		for _, st := range append([]*found{f}, f.subs...) {
			ltpPlaces(c, st.Stage)
			leakPlacesOf(c, st.Stage)
			feedPlaces(c, st.Stage, claimed)
			pairPlaces(c, st.Stage)
		}
	}
}

// leakPlacesOf is leakPlaces for one stage.
func leakPlacesOf(c *graph.Circuit, st *Stage) {
	if len(st.Draw) < 2 {
		return
	}
	dev := c.Part(st.Draw[0].Part)
	if dev == nil || !dev.IsActive() {
		return
	}
	g := dev.NetOf(dev.PinWithRole(graph.RoleControl))
	if g == "" || c.RoleOf(g).IsACGround() {
		return
	}
	placed := map[string]bool{}
	sign := 0
	for _, pl := range st.Draw {
		placed[pl.Part] = true
		if p := c.Part(pl.Part); pl.Row == 0 && pl.Col != 0 && p != nil && p.Kind == graph.Capacitor && onNet(p, g) {
			sign = pl.Col / abs(pl.Col)
		}
	}
	if sign == 0 {
		return
	}
	// the outermost row-0 slot on the grid capacitor's side
	side := 0
	for _, pl := range st.Draw {
		if pl.Row == 0 && pl.Col*sign > side*sign {
			side = pl.Col
		}
	}
	for _, ref := range st.Parts {
		p := c.Part(ref)
		if p == nil || placed[ref] || p.Kind != graph.Resistor || len(p.Pins) != 2 || !onNet(p, g) {
			continue
		}
		side += sign
		if abs(side) > maxSlot {
			return
		}
		st.Draw = append(st.Draw, Place{Part: ref, Col: side, Row: 0, Stand: "vertical"})
	}
}

func abs(n int) int {
	if n < 0 {
		return -n
	}
	return n
}

// feedPlaces extends the template of a stage that hangs a capacitor from
// its device's output electrode (an oscillator's DC block to the tank)
// with the one part that feeds that electrode from a rail (an RF choke,
// a load resistor), the stage's own or one no stage holds: it stands
// straight above the device, the electrode's wire rising into it and the
// block teeing off to the side, as a shunt-fed oscillator is drawn. Left
// to the generic placement it stood under the tank, its wire looping
// round the stage (a transistor Colpitts with a choke-fed collector).
func feedPlaces(c *graph.Circuit, st *Stage, claimed map[string]*found) {
	if len(st.Draw) < 2 {
		return
	}
	dev := c.Part(st.Draw[0].Part)
	if dev == nil || !dev.IsActive() {
		return
	}
	o := dev.NetOf(dev.PinWithRole(graph.RoleOutput))
	if o == "" || c.RoleOf(o).IsACGround() {
		return
	}
	placed, blocked := map[string]bool{}, false
	for _, pl := range st.Draw {
		placed[pl.Part] = true
		p := c.Part(pl.Part)
		if p == nil {
			continue
		}
		if pl.Row < 0 && pl.Col == 0 {
			return // the template stands something over the device already
		}
		blocked = blocked || pl.Row == 0 && pl.Col != 0 && p.Kind == graph.Capacitor && onNet(p, o)
	}
	if !blocked {
		return
	}
	var feed string
	for _, t := range c.ConnsOf(o) {
		p := t.Part
		if placed[p.Ref] || len(p.Pins) != 2 || p.Kind != graph.Resistor && p.Kind != graph.Inductor {
			continue
		}
		if f := claimed[p.Ref]; f != nil && f.Stage != st || !c.RoleOf(other(p, o)).IsACGround() {
			continue
		}
		if feed != "" {
			return // two feeds: which stands over the device is no clearer
		}
		feed = p.Ref
	}
	if feed != "" {
		st.Draw = append(st.Draw, Place{Part: feed, Col: 0, Row: -1, Stand: "vertical"})
	}
}

// other is the net of a two-terminal part's pin that is not on net.
func other(p *graph.Part, net string) string {
	if p.Pins[0].Net == net {
		return p.Pins[1].Net
	}
	return p.Pins[0].Net
}

// onNet says whether one of the part's pins is on net.
func onNet(p *graph.Part, net string) bool {
	return slices.ContainsFunc(p.Pins, func(pn graph.Pin) bool { return pn.Net == net })
}
