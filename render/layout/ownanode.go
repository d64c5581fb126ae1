package layout

import (
	"math"
	"slices"

	"pare/graph"
	"pare/render/geom"
)

// A valve's further grid or cathode whose net goes on in another row (a
// mixer's injector grid to an oscillator drawn in another row, its shared
// cathode) has its pin on the valve's side, below the anode; the anode
// lead leaves upward and comes down to its load on that same side. A
// connector level with the pin is reached only across the anode lead, or
// by a wire looping round the load and back to the connector (a mixer's
// injector grid and shared cathode led to an oscillator in a later row:
// review19 a02's mixer row, with the oscillator's grid leak drawn in the
// oscillator's stage, crossed the anode lead). Stood below the row's foot
// instead, the wire leaves the valve downward, the side a static
// electrode's feed leaves it.

// pastOwnAnode is level y of a connector on net at the left (right) edge,
// or, when the pin nearest that edge is a valve's grid or cathode and the
// valve's anode lead comes down to a pin between that pin and the edge at
// or below y, a step below the foot of every part in that span.
func (ly *state) pastOwnAnode(net string, y float64, left bool) float64 {
	cl, pin, ok := ly.edgePin(net, left)
	if !ok || !ly.anodeAcross(cl, pin, y, left) {
		return y
	}
	x0, x1 := pin.At.X, math.Inf(1)
	if left {
		x0, x1 = math.Inf(-1), pin.At.X
	}
	foot := y
	for _, c := range ly.cells {
		if c.edge != 0 || c.conn {
			continue
		}
		if b := c.footprint(); b.X1 > x0 && b.X0 < x1 {
			foot = math.Max(foot, b.Y1)
		}
	}
	return math.Ceil(foot) + ly.gapY()
}

// edgePin is the cell and pin on net nearest the left (right) edge among
// the cells off the edge columns, the highest level (wireLevel) among
// equals: the pin edgeLevel reads.
func (ly *state) edgePin(net string, left bool) (*cell, geom.Pin, bool) {
	best := math.Inf(1)
	var at *cell
	var pin geom.Pin
	for _, cl := range ly.cells {
		if cl.edge != 0 {
			continue
		}
		for _, p := range cl.shape.Pins {
			if p.Net != net {
				continue
			}
			if d := edgeDistance(p, left); d < best || d == best && wireLevel(p) < wireLevel(pin) {
				best, at, pin = d, cl, p
			}
		}
	}
	return at, pin, at != nil
}

// edgeDistance is how far a pin stands from the left (right) edge, up to
// a constant.
func edgeDistance(p geom.Pin, left bool) float64 {
	if left {
		return p.At.X
	}
	return -p.At.X
}

// wireLevel is the y where a pin meets its wire: a pin leaving up or down
// meets it a step off its tip, where a part hangs under a sideways wire
// (hangOff).
func wireLevel(p geom.Pin) float64 {
	switch p.Dir {
	case geom.Up:
		return p.At.Y - 1
	case geom.Down:
		return p.At.Y + 1
	}
	return p.At.Y
}

// anodeAcross says whether cl is a valve, pin one of its grids or its
// cathode, and a pin of its anode's net on another part stands between
// pin and the edge at level y or below: the anode lead comes down there,
// across a run from pin to the edge at y.
func (ly *state) anodeAcross(cl *cell, pin geom.Pin, y float64, left bool) bool {
	p := realPart(cl)
	if p == nil || p.Kind != graph.Valve {
		return false
	}
	if r := graph.RoleOfPin(p.Kind, pin.Name); r != graph.RoleGrid && r != graph.RoleCommon {
		return false
	}
	var anodes []string
	for _, pn := range cl.shape.Pins {
		if graph.RoleOfPin(p.Kind, pn.Name) == graph.RoleOutput && pn.At.Y < pin.At.Y {
			anodes = append(anodes, pn.Net)
		}
	}
	if len(anodes) == 0 {
		return false
	}
	for _, c := range ly.cells {
		if c == cl || c.edge != 0 || c.conn {
			continue
		}
		for _, q := range c.shape.Pins {
			beyond := q.At.X > pin.At.X
			if left {
				beyond = q.At.X < pin.At.X
			}
			if beyond && q.At.Y >= y && slices.Contains(anodes, q.Net) {
				return true
			}
		}
	}
	return false
}
