package layout

import (
	"math"
	"pare/graph/figure"
	"strings"

	"pare/graph"
	"pare/render/geom"
)

// pinReturn is the net a pin's local symbol stands for: on a reduced
// circuit, the rail the terminal returned to before the reduction tied that
// rail to AC ground (graph.Pin.Rail), else the pin's own net. So a return to
// HT is drawn as HT, never as chassis.
func pinReturn(c *graph.Circuit, part *graph.Part, p geom.Pin) *graph.Net {
	if part != nil && c.RoleOf(p.Net).IsACGround() {
		if pn := part.Pin(p.Name); pn != nil {
			return c.ReturnOf(*pn)
		}
	}
	return c.Net(p.Net)
}

// pinRole is the role a pin's local symbol is drawn for: its return rail's
// role where it has one, else the role of its net.
func pinRole(c *graph.Circuit, part *graph.Part, p geom.Pin) graph.Role {
	if n := pinReturn(c, part, p); n != nil && n.Role.IsRail() {
		return n.Role
	}
	return c.RoleOf(p.Net)
}

// railWant is where a pin on an AC-ground net should point, and whether it
// has a preference at all: higher potential up, lower down (common
// practice). Chassis goes down; a supply or heater rail up, unless its
// declared voltage is negative; a bias rail (grid bias, AGC) down, unless
// its declared voltage is positive.
func railWant(c *graph.Circuit, part *graph.Part, p geom.Pin) (geom.Dir, bool) {
	role := pinRole(c, part, p)
	volts := 0.0
	if n := pinReturn(c, part, p); n != nil {
		volts = n.Volts
	}
	switch {
	case role == graph.Ground:
		return geom.Down, true
	case role == graph.Supply || role == graph.Heater:
		if volts < 0 {
			return geom.Down, true
		}
		return geom.Up, true
	case role == graph.Bias:
		if volts > 0 {
			return geom.Up, true
		}
		return geom.Down, true
	}
	return geom.Right, false
}

// railText is what a rail tag says: the net's label with its declared
// voltage ("HT +250 V"; the voltage is added in brackets when the label does
// not state it), else the signed voltage ("+9 V", "−6 V"), else the net's
// name. The text is the netlist's; the writer escapes it for SVG.
// RailText is the tag a rail's pins carry on a sheet (railText).
func RailText(n *graph.Net) string { return railText(n, n.Name) }

func railText(n *graph.Net, name string) string {
	if n == nil {
		return name
	}
	volts := ""
	if n.Volts != 0 {
		sign := "+"
		if n.Volts < 0 {
			sign = "−" // U+2212 MINUS SIGN, as typeset
		}
		volts = sign + figure.Plain(math.Abs(n.Volts)) + " V"
	}
	// A label that states the voltage, at the netlist's precision or the
	// sheet's, needs no bracket.
	stated := strings.Contains(n.Label, formatG(math.Abs(n.Volts))) || strings.Contains(n.Label, figure.Plain(math.Abs(n.Volts)))
	switch {
	case n.Label != "" && volts != "" && !stated:
		return n.Label + " (" + volts + ")"
	case n.Label != "":
		return n.Label
	case volts != "":
		return volts
	}
	return name
}

// railStages gives each part that only touches rails (a heater bypass, a
// rail's capacitor) and that no frame holds the stage of the part railLayers
// stood it beside: the lowest-ranked part sharing a rail with it, so it
// stands next to that part's electrode, not after every frame (a heater
// bypass was drawn beyond the loudspeaker, outside any frame).
func (ly *state) railStages(st map[string]int, framed func(*cell) (int, bool)) {
	onNet := map[string][]*cell{}
	for _, cl := range ly.cells {
		for _, pn := range cl.part.Pins {
			if wired(pn.Net) && ly.c.RoleOf(pn.Net) != graph.Ground {
				onNet[pn.Net] = append(onNet[pn.Net], cl)
			}
		}
	}
	for _, cl := range ly.cells {
		if _, ok := st[cl.ref]; ok || cl.edge != 0 || cl.conn || len(ly.signalNets(cl)) > 0 {
			continue
		}
		if _, ok := framed(cl); ok {
			continue
		}
		var best *cell
		for _, pn := range cl.part.Pins {
			for _, nb := range onNet[pn.Net] {
				if _, ok := st[nb.ref]; !ok || nb == cl || len(ly.signalNets(nb)) == 0 {
					continue
				}
				if best == nil || ly.rankOf[nb.ref] < ly.rankOf[best.ref] {
					best = nb
				}
			}
		}
		if best != nil {
			st[cl.ref] = st[best.ref]
		}
	}
}
