package main

import (
	"math"
	"slices"

	"pare/graph"
	"pare/render/geom"
	"pare/render/layout"
)

// fadedServeFar is how far (sheet units, centre to centre; an A3 page is
// about 140 wide) a greyed part may stand from what it serves (servedBy)
// before a reader looks for it: about three columns of a row, a
// decoupler's column beside its can or under its device's load.
const fadedServeFar = 25.0

// servedBy names what a part serves, which a reader looks for it beside:
// on each of its nets off AC ground (in the circuit as drawn, before the
// reduction tied decoupled lines to AC ground), the devices there, the windings there
// and the devices at their far ends (through a winding: an AGC decoupler
// serves the can whose foot it feeds and the grid beyond), and the device
// a load there feeds. A part on a line that feeds a device's load (a
// supply decoupler) serves only the windings there and the devices whose
// loads it feeds, as a
// decoupler is put in for the stage whose load it feeds, not for a
// follower whose collector sits on the same line (common practice).
func servedBy(c *graph.Circuit, p *graph.Part) []string {
	var all, coils, loads []string
	add := func(list *[]string, ref string) {
		if !slices.Contains(*list, ref) {
			*list = append(*list, ref)
		}
	}
	for _, pn := range p.Pins {
		if pn.Net == "" || pn.Net == graph.NotConnected || c.RoleOf(pn.Net).IsACGround() {
			continue
		}
		for _, cn := range c.ConnsOf(pn.Net) {
			o := cn.Part
			switch {
			case o == p || o.Kind == graph.Port:
			case o.IsActive():
				add(&all, o.Ref)
			case o.Kind == graph.Inductor || o.Kind == graph.Transformer:
				add(&all, o.Ref)
				add(&coils, o.Ref)
				for _, far := range layout.FarEnds(o, pn.Net) {
					for _, d := range devicesOn(c, far) {
						add(&all, d)
					}
				}
			default:
				for _, d := range loadFed(c, o, pn.Net) {
					add(&loads, d)
				}
			}
		}
	}
	if len(loads) > 0 {
		return append(coils, loads...)
	}
	return all
}

// devicesOn are the active parts with a pin on net n (off AC ground).
func devicesOn(c *graph.Circuit, n string) []string {
	var out []string
	if n == "" || c.RoleOf(n).IsACGround() {
		return nil
	}
	for _, cn := range c.ConnsOf(n) {
		if cn.Part.IsActive() {
			out = append(out, cn.Part.Ref)
		}
	}
	return out
}

// loadFed are the devices whose output electrode two-pin passive part o
// joins to line: o is their load.
func loadFed(c *graph.Circuit, o *graph.Part, line string) []string {
	if len(o.Pins) != 2 || o.IsActive() {
		return nil
	}
	other := o.Pins[0].Net
	if other == line {
		other = o.Pins[1].Net
	}
	if other == line || other == "" || c.RoleOf(other).IsACGround() {
		return nil
	}
	var out []string
	for _, cn := range c.ConnsOf(other) {
		if d := cn.Part; d.IsActive() && d.NetOf(d.PinWithRole(graph.RoleOutput)) == other {
			out = append(out, d.Ref)
		}
	}
	return out
}

// unserved names the greyed parts farther than fadedServeFar from all
// they serve (servedBy), or on another page than all of it, with the
// nearest: a decoupler in another stage's corner, an AGC decoupler a row
// from the can it feeds. A part that serves nothing drawn is left to
// farParts.
func unserved(c *graph.Circuit, pages []*geom.Sheet) []placed {
	var out []placed
	for _, p := range c.Parts {
		pp, box, faded := symbolFaded(pages, p.Ref)
		if pp < 0 || !faded || p.Kind != graph.Resistor && p.Kind != graph.Capacitor {
			continue
		}
		best := placed{ref: p.Ref, gap: math.Inf(1)}
		for _, r := range servedBy(c, p) {
			op, obox, _ := symbolFaded(pages, r)
			if op < 0 {
				continue
			}
			if best.host == "" {
				best.host = r
			}
			if op == pp && centreGap(box, obox) < best.gap {
				best.host, best.gap = r, centreGap(box, obox)
			}
		}
		if best.host != "" && best.gap > fadedServeFar {
			out = append(out, best)
		}
	}
	return out
}
