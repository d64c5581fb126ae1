package layout

import (
	"math"

	"pare/graph"
	"pare/render/geom"
)

// Rail sockets at the foot. A socket every pin of which is on a rail or
// chassis (the HT or heater supply coming in, a battery lead, an AGC line
// from elsewhere) is drawn with the rail's tag, as every pin on that rail
// is: no wire reaches it, so it has no place in the signal's order. In the
// first column, beside the input, its long name made that column as wide
// as a stage (a valve oscillator's faded view, 20 parts, came out ten per
// cent wider than an A3 page at 2.5 mm text and was cut into two rows
// joined by connectors for it). It stands instead in a line under the
// drawing, from the left, where a service sheet notes its supply
// connections.

// footGap is the room, in grid steps, between the drawing and the line of
// rail sockets under it: a frame's margin below its parts, and a
// routing track.
const footGap = rowGap + framePad + 2

// railSocket says whether a cell is a socket none of whose pins is wired:
// every one on a rail or chassis, drawn as the rail's tag.
func railSocket(c *graph.Circuit, cl *cell) bool {
	if cl.part == nil || cl.part.Kind != graph.Port || cl.conn || len(cl.shape.Pins) == 0 {
		return false
	}
	for _, p := range cl.shape.Pins {
		if !c.RoleOf(p.Net).IsACGround() {
			return false
		}
	}
	return true
}

// footSockets takes the blocks holding only rail sockets out of their
// columns: the columns are sized and placed without them (placeFeet puts
// them under the drawing once it is placed).
func (ly *state) footSockets(cols [][]*block) ([][]*block, []*block) {
	var feet []*block
	for i, col := range cols {
		var keep []*block
		for _, b := range col {
			if ly.onlyRailSockets(b) {
				feet = append(feet, b)
				continue
			}
			keep = append(keep, b)
		}
		cols[i] = keep
	}
	return cols, feet
}

// footWidth is the width of column i without the rail sockets taken out of
// it, w, narrowed from its width with them by whole grid steps only: the
// columns after it then move by whole steps, which keeps every part's
// rounding to the grid, so the sheet is the one it was, shifted, and
// routed as it was.
func footWidth(w float64, i int, feet []*block) float64 {
	with := w
	for _, b := range feet {
		if b.col == i {
			with = math.Max(with, b.fp.W())
		}
	}
	return with - math.Floor(with-w)
}

// onlyRailSockets says whether every part of a block is a rail socket.
func (ly *state) onlyRailSockets(b *block) bool {
	if len(b.cells) == 0 || len(b.chain) > 0 {
		return false
	}
	for _, cl := range b.cells {
		if !railSocket(ly.c, cl) {
			return false
		}
	}
	return true
}

// placeFeet sets the rail sockets side by side in a line from the
// drawing's left edge, in the order their columns held them (the
// netlist's order within a column), footGap under the parts placed above
// that line's span, a column's gap either side, and the frames there
// (never inside a stage's frame, nor with a tag against its edge):
// under the first stages, where the sheet is seldom at its deepest, so the
// line seldom makes it taller. The frames are drawn before it: a rail
// socket is in none.
func (ly *state) placeFeet(feet []*block) {
	if len(feet) == 0 {
		return
	}
	in := map[*cell]bool{}
	span := 0.0
	for i, b := range feet {
		for _, cl := range b.cells {
			in[cl] = true
		}
		if i > 0 {
			span += colGap
		}
		span += b.fp.W()
	}
	all := geom.Rect{}
	for _, cl := range ly.cells {
		if !in[cl] {
			all = all.Union(cl.footprint())
		}
	}
	x := all.X0
	bottom := math.Inf(-1)
	for _, cl := range ly.cells {
		if fp := cl.footprint(); !in[cl] && fp.X1 > x && fp.X0 < x+span+colGap {
			bottom = math.Max(bottom, fp.Y1)
		}
	}
	for _, f := range ly.frames {
		if f.Box.X1 > x && f.Box.X0 < x+span+colGap {
			bottom = math.Max(bottom, f.Box.Y1)
		}
	}
	y := bottom + footGap
	if math.IsInf(bottom, -1) {
		y = all.Y0
	}
	for _, b := range feet {
		d := geom.Pt{X: math.Round(x - b.fp.X0), Y: math.Round(y - b.fp.Y0)}
		b.move(d)
		x = b.fp.X1 + colGap
	}
}
