package check

import (
	"fmt"
	"slices"

	"pare/render/geom"
)

// outputPins are the pin names of a device's output electrode: a valve's
// anode (or either anode of a double one), a transistor's collector, a
// FET's drain (render/symbol's pin names); a valve's only when it has a
// control grid.
var outputPins = map[string][]string{
	"valve": {"a", "a1", "a2"},
	"bjt":   {"c"},
	"fet":   {"d"},
}

// feedOrder reports a transformer drawn left of the device whose output
// feeds it (common practice, ../shared/DRAWING-NOTES.md): signal flows left
// to right, so an anode's IF can, interstage or output transformer stands
// right of its valve, and one drawn left makes the reader follow the
// anode wire backwards over the stage (mixerOrder's IF-transformer rule,
// for every stage). A transformer with a winding on a net a gang section
// tunes is an oscillator's or a signal tank's coil, drawn below its device,
// and is left out; so is an output on a net a ground or rail symbol
// stands on (a collector at chassis feeds nothing: every part there shares
// the net), and a transformer not level with the device (a part on another
// row of a page is placed by the page flow, not by this order). A
// transformer counts as level when its box reaches into the band one
// device height above and below the device's box.
func (r *Report) feedOrder(g *geom.Sheet) {
	tuned, acg := gangTuned(g), acGround(g)
	for _, d := range g.Symbols {
		outs := outputPins[d.Kind]
		if outs == nil || d.Kind == "valve" && !gridded(d) {
			continue
		}
		for _, dp := range d.Pins {
			if !slices.Contains(outs, dp.Name) || acg[dp.Net] {
				continue
			}
			for _, t := range g.Symbols {
				if t.Kind != "transformer" || !feeds(t, dp.Net, tuned) || !level(d.Box, t.Box) {
					continue
				}
				if centre(t.Box).X <= d.Box.X1 {
					r.FeedOrder = append(r.FeedOrder, fmt.Sprintf("transformer %s fed by %s's %s (%s) drawn left of it", t.Ref, d.Ref, dp.Name, dp.Net))
				}
			}
		}
	}
	slices.Sort(r.FeedOrder)
	r.FeedOrder = slices.Compact(r.FeedOrder)
}

// gridded tells whether a valve has a control grid: a diode's anode is
// where the signal comes in (an IF can's secondary feeds a detector diode),
// not an output.
func gridded(v geom.Symbol) bool {
	return slices.ContainsFunc(v.Pins, func(p geom.Pin) bool { return p.Name == "g" || p.Name == "g1" })
}

// feeds tells whether t has a pin on net and none on a gang-tuned net.
func feeds(t geom.Symbol, net string, tuned map[string]bool) bool {
	on := false
	for _, p := range t.Pins {
		if tuned[p.Net] {
			return false
		}
		on = on || p.Net == net
	}
	return on
}

// level tells whether b reaches into the band one height of a above and
// below a.
func level(a, b geom.Rect) bool {
	h := a.Y1 - a.Y0
	return b.Y1 >= a.Y0-h && b.Y0 <= a.Y1+h
}
