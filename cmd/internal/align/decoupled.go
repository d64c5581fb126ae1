package align

import (
	"slices"

	"pare/graph"
)

// A control electrode held at AC ground by a capacitor of its own (a
// long-tailed pair's second grid, a grounded-grid stage's grid, a
// cascode's upper base) is no signal point: a generator there drives
// nothing the set passes on, and a row for it reads as a stage whose gain
// is next to nothing (review20 a04: "V2a grid → ltp_g2 ×0.000179"). The
// solver decides, not the capacitor's size: driven from the declared
// input, the signal reaching the net at the row's frequency must be under
// decoupledShare of what an earlier point of the same band gets.

// decoupledShare is how far below the earlier points' signal a point must
// lie to be taken as held at AC ground: 40 dB (pare's choice; a working
// decoupler holds its net some 40–60 dB down, common practice).
const decoupledShare = 0.01

// dropDecoupled removes the points held at AC ground by a capacitor of
// their own; the input's point and the points of a circuit with no
// declared input stay.
func dropDecoupled(c *graph.Circuit, pts []point, g *Guide) []point {
	if len(c.Inputs) == 0 {
		return pts
	}
	in := c.Inputs[0]
	level := make([]float64, len(pts))
	for i := range pts {
		if pts[i].net == in {
			level[i] = 1
			continue
		}
		v, err := g.response(c, in, pts[i].net, rowFreq(c, pts[i].band, g), 0.5)
		if err != nil {
			level[i] = -1 // unknown: never dropped, never a yardstick
			continue
		}
		level[i] = v
	}
	var out []point
	for i, p := range pts {
		if !heldByCap(c, p.net) || level[i] < 0 || !quieterThanEarlier(pts, level, i) {
			out = append(out, p)
		}
	}
	return out
}

// quieterThanEarlier says point i's signal from the input is under
// decoupledShare of an earlier point's of the same band.
func quieterThanEarlier(pts []point, level []float64, i int) bool {
	for j := range i {
		if pts[j].band == pts[i].band && level[j] > 0 && level[i] < decoupledShare*level[j] {
			return true
		}
	}
	return false
}

// heldByCap says net has a fixed capacitor of its own to an AC-ground net
// (a decoupler), the net itself being no AC ground by role.
func heldByCap(c *graph.Circuit, net string) bool {
	if net == "" || c.RoleOf(net).IsACGround() {
		return false
	}
	return slices.ContainsFunc(c.Parts, func(p *graph.Part) bool {
		return p.Kind == graph.Capacitor && len(p.Pins) == 2 && p.Type != graph.CapVariable &&
			hasNet(p, net) && c.RoleOf(otherNet(p, net)).IsACGround()
	})
}
