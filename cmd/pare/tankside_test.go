package main

import (
	"path/filepath"
	"testing"

	"pare/graph"
	"pare/render"
	"pare/render/geom"
)

// TestTankElectrodesOnTheirSide: on the reduced sheet of an oscillator,
// every part of the device's frame on its control or output electrode's
// net stands out beyond the device on the side that electrode's pin
// leaves it (left of a grid drawn from the left, above an anode drawn
// upwards): the grid capacitor and grid leak hang from the grid wire
// beside the valve, the anode's feed choke and DC block from the anode
// wire above it, the tank below (common practice; ../shared/DRAWING-NOTES.md:
// "the grid capacitor and leak sit between the tank's hot end and the
// grid; an amplifier's load rises to the rail above the output
// electrode"). Before, the generic placement
// left a grid leak right of the valve with its wire looped over it (a
// Colpitts with the divider's centre on the cathode) and a collector's
// RF choke under the tank (a choke-fed transistor Colpitts).
func TestTankElectrodesOnTheirSide(t *testing.T) {
	files := tankFiles(t)
	for _, f := range files {
		c, err := graph.LoadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		s := cachedSheet(t, f, render.Reduced, render.IEC)
		for _, bad := range offSide(c, s.g) {
			t.Errorf("%s: %s", filepath.Base(f), bad)
		}
	}
}

// offSide lists the parts framed with an active device whose pin on the
// device's control or output net stands short of the device on that
// electrode's side.
func offSide(c *graph.Circuit, g *geom.Sheet) []string {
	sym := map[string]geom.Symbol{}
	for _, s := range g.Symbols {
		sym[s.Ref] = s
	}
	wired := map[string]bool{} // AC ground and rails are tags, not wires
	for _, w := range g.Wires {
		wired[w.Net] = true
	}
	var out []string
	for _, fr := range g.Frames {
		for _, ref := range fr.Parts {
			dev, ok := sym[ref]
			if p := c.Part(ref); !ok || p == nil || !p.IsActive() {
				continue
			}
			for _, e := range dev.Pins {
				r := graph.RoleOfPin(c.Part(ref).Kind, e.Name)
				if r != graph.RoleControl && r != graph.RoleOutput || !wired[e.Net] {
					continue
				}
				for _, other := range fr.Parts {
					o, ok := sym[other]
					if !ok || other == ref {
						continue
					}
					for _, q := range o.Pins {
						if q.Net == e.Net && !beyond(q.At, dev.Box, e.Dir) {
							out = append(out, other+"."+q.Name+" on "+e.Net+" short of "+ref+"."+e.Name+"'s side")
						}
					}
				}
			}
		}
	}
	return out
}

// beyond says whether pt lies past box's edge in direction d (on it
// counts: a part hangs from the wire at the pin's tip).
func beyond(pt geom.Pt, box geom.Rect, d geom.Dir) bool {
	const slack = 1e-6
	switch d {
	case geom.Left:
		return pt.X <= box.X0+slack
	case geom.Right:
		return pt.X >= box.X1-slack
	case geom.Up:
		return pt.Y <= box.Y0+slack
	}
	return pt.Y >= box.Y1-slack
}
