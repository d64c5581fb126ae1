package layout

import (
	"math"

	"pare/graph"
	"pare/render/geom"
)

// A coil lying down between two live nets (a Colpitts or Clapp tank across
// its capacitive divider, whose centre is at chassis; a balanced tank from
// anode to grid) has no end at chassis to hang its capacitors from. The
// trade draws such a tank as one loop: the coil lying across, its trimmer
// or tuning capacitor parallel to it just above, joined at both ends, and
// the divider's capacitors standing from those ends down to chassis either
// side. standTank puts the capacitors above the coil (lying); the stage
// template then levels the coil's ends with the wired ends of the parts
// beside it in its row (levelLying), so each end is one straight wire.

// lying says whether a winding's end pins, upper (left) one first, are a
// two-terminal coil lying down: level, leaving it in opposite directions.
// A transformer's winding is drawn upright with its pins on one side, so
// this never takes it.
func lying(coil *cell, p1, p2 *geom.Pin) bool {
	return coil.part.Kind != graph.Transformer && p1.At.Y == p2.At.Y && p1.Dir != p2.Dir
}

// live says whether a net is wired on the sheet: neither AC ground nor
// left unconnected. A lying coil with one end at chassis keeps its
// capacitors beside that end (besideWinding), as before.
func (ly *state) live(net string) bool {
	return wired(net) && !ly.c.RoleOf(net).IsACGround()
}

// labelUnderCoil puts a lying coil's label under it: above it stand its
// capacitors, and a label between the two would sit inside the loop.
//
// A label wider than the coil is moved right until it starts at the left
// end's column: the router keeps a wire off every grid line a label's box
// reaches into, and a centred label a fifth of a step past the left end
// closed the column the wire from that end takes down to the divider
// capacitor standing just outside it (review16 a01: C2's lead was left
// unwired).
func (ly *state) labelUnderCoil(coil *cell) {
	placeLabel(ly.c, coil, []geom.Dir{geom.Down, geom.Left, geom.Right, geom.Up})
	b := coil.label.Box
	if len(coil.shape.Pins) != 2 || b.Y0 < coil.shape.Box.Y1 {
		return // not under it
	}
	left := math.Min(coil.shape.Pins[0].At.X, coil.shape.Pins[1].At.X)
	if b.X0 < left {
		coil.label.Box = b.Move(geom.Pt{X: left - b.X0})
	}
}

// levelLying levels, in a template's row other than the anchor's, the
// parts beside a lying tank coil with it: each other block in that row
// with a pin on one of the coil's end nets (a divider capacitor) moves up
// or down to put that pin level with the coil's, so each end of the tank
// is one straight wire. Centring each block in its row put the coil, with
// its capacitors above it, a few steps below the divider's tops and bent
// both end wires. The others move rather than the coil: the tank block is
// the taller, and moving it up ran it into the anchor's row.
func (ly *state) levelLying(slots []*slotted) {
	for _, s := range slots {
		if s.row == 0 || !s.b.tank {
			continue
		}
		coil := s.b.cells[0]
		if len(coil.shape.Pins) != 2 {
			continue // a tapped coil: its tap's wire decides its height
		}
		var ends []*geom.Pin
		for i := range coil.shape.Pins {
			p := &coil.shape.Pins[i]
			if ly.live(p.Net) {
				ends = append(ends, p)
			}
		}
		if len(ends) != 2 || !lying(coil, ends[0], ends[1]) {
			continue
		}
		for _, o := range slots {
			if o != s && o.row == s.row && !o.b.tank {
				if dy, ok := pinLevel(o.b, ends, s.d.Y); ok {
					o.d.Y = dy
				}
			}
		}
	}
}

// pinLevel is the move that puts the block's first pin on one of the
// coil's end nets level with that end, once the coil has moved by coilDY.
func pinLevel(b *block, ends []*geom.Pin, coilDY float64) (float64, bool) {
	for _, cl := range append(append([]*cell{}, b.cells...), b.chain...) {
		for _, q := range cl.shape.Pins {
			for _, p := range ends {
				if q.Net == p.Net {
					return p.At.Y + coilDY - q.At.Y, true
				}
			}
		}
	}
	return 0, false
}
