package layout

import (
	"pare/graph"
	"pare/render/geom"
)

// laneMode is how firstClear keeps a local symbol off the lines out of the
// cell's other wired pins: not at all, its bars not facing one (an earth's
// stub read as running on into the wire a step past its bars), or nowhere
// near one (nearLane).
type laneMode int

const (
	laneNone laneMode = iota
	laneFacing
	laneNear
)

// facesLane says whether earth l's bars face, less than a grid step on
// and across their width, the line faceLane steps straight out of a wired
// pin of another net (render/check counts such earths as EarthsFacing).
func facesLane(l geom.Local, wired []geom.Pin, net string) bool {
	if l.Kind != geom.LocalGround {
		return false
	}
	b := l.Box
	ahead := geom.R(b.X0, b.Y0-1, b.X1, b.Y0)
	if l.Down {
		ahead = geom.R(b.X0, b.Y1, b.X1, b.Y1+1)
	}
	for _, q := range wired {
		if q.Net == net {
			continue
		}
		st := q.Dir.Step()
		if ahead.Overlaps(geom.R(q.At.X, q.At.Y, q.At.X+faceLane*st.X, q.At.Y+faceLane*st.Y)) {
			return true
		}
	}
	return false
}

// faceLane is how far out of a pin facesLane looks: the pin's corridor (two
// steps, kept free for its wire) and the step after it.
const faceLane = 3

// shunted are the pins of wired whose net has a capacitor to an AC-ground
// net on it (a tank's capacitor across a winding, a bypass): that
// capacitor stands beside the part or hangs from the row, so the wire out
// of the pin runs straight along its lane to it, and an earth facing the
// lane faces the wire (review21 b05's aerial tank). Other pins' wires turn
// as often as not inside the lane: turning up the earth of review17's
// reaction winding, which no wire faced, set it in line with the link
// winding's wire.
func shunted(c *graph.Circuit, wired []geom.Pin) []geom.Pin {
	var out []geom.Pin
	for _, q := range wired {
		for _, cn := range c.ConnsOf(q.Net) {
			if cn.Part.Kind != graph.Capacitor || len(cn.Part.Pins) != 2 {
				continue
			}
			other := cn.Part.Pins[0].Net
			if other == q.Net {
				other = cn.Part.Pins[1].Net
			}
			if c.RoleOf(other).IsACGround() {
				out = append(out, q)
				break
			}
		}
	}
	return out
}
