package layout

import (
	"math"
	"sort"

	"pare/graph"
	"pare/render/geom"
)

// levelConnectors stands each off-row connector (rows.go) at its row's
// edge level with the pin of its net nearest that edge, once the parts
// and the stage templates are placed, so that the wire to it is a short
// straight run. Placement stacks the cells of the edge columns from the
// top in the order the crossing reduction left them, and a connector's
// neighbours stand many columns away, so that order was arbitrary: a
// connector stood above another whose net runs higher, their wires
// crossed, and a wire ran past its connector to the edge and came back
// round it (review16 b03's right edge, a04's push-pull page). The
// connectors keep the order of their nets' levels, each as near its level
// as the cells already in the column leave room for.
func (ly *state) levelConnectors(cols [][]*block) {
	if len(cols) < 2 {
		return
	}
	ly.levelEdge(cols[0], true)
	ly.levelEdge(cols[len(cols)-1], false)
}

// levelEdge places the connectors of one edge column.
func (ly *state) levelEdge(col []*block, left bool) {
	type want struct {
		b     *block
		y     float64 // the wanted level of the connector's pin
		off   float64 // the pin below the block's top
		reach float64 // how far the pin it levels with stands from the edge
	}
	var ws []want
	var fixed []*block
	for _, b := range col {
		cl := b.cells[0]
		if len(b.cells) != 1 || len(b.chain) > 0 || !cl.conn || len(cl.shape.Pins) != 1 {
			fixed = append(fixed, b)
			continue
		}
		p := cl.shape.Pins[0]
		y, reach, ok := ly.edgeLevel(p.Net, left)
		if !ok {
			fixed = append(fixed, b)
			continue
		}
		y = ly.pastOwnAnode(p.Net, y, left)
		x0, x1 := p.At.X, p.At.X+reach
		if !left {
			x0, x1 = p.At.X-reach, p.At.X
		}
		y = ly.clearOfFrames(p.Net, ly.underDevices(p.Net, y, x0, x1), x0, x1)
		// the pin on the routing grid's nearest line: a pin between
		// lines is left unwired
		ws = append(ws, want{b: b, y: math.Round(y), off: p.At.Y - b.fp.Y0, reach: reach})
	}
	if len(ws) == 0 {
		return
	}
	sort.SliceStable(ws, func(i, j int) bool {
		if ws[i].y != ws[j].y {
			return ws[i].y < ws[j].y
		}
		// of two on one level, the one whose net stands further in
		// goes above: its wire comes round whatever stands between, and
		// from below the nearer one's straight run it would loop round
		// that connector (review16 a04's two grid connectors)
		return ws[i].reach > ws[j].reach
	})
	top := math.Inf(-1)
	for _, w := range ws {
		// the pin stays on the routing grid, so its wire meets it square
		// (moved from its level by whole steps only)
		down := func(to float64) float64 { return w.y + math.Ceil(math.Max(0, to-w.y)-geom.Eps) }
		y := down(top + w.off)
		for moved := true; moved; {
			moved = false
			for _, f := range fixed {
				if t := y - w.off; t < f.fp.Y1+ly.gapY() && t+w.b.fp.H() > f.fp.Y0-ly.gapY() {
					y, moved = down(f.fp.Y1+ly.gapY()+w.off), true
				}
			}
		}
		w.b.move(geom.Pt{Y: y - w.off - w.b.fp.Y0})
		top = w.b.fp.Y1 + ly.gapY()
	}
}

// edgeLevel is the y of the pin on net nearest the left (right) edge among
// the cells off the edge columns, and its distance from that edge; false
// when no such cell has a pin on the net.
func (ly *state) edgeLevel(net string, left bool) (y, reach float64, ok bool) {
	_, p, ok := ly.edgePin(net, left)
	if !ok {
		return 0, math.Inf(1), false
	}
	return wireLevel(p), edgeDistance(p, left), true
}

// underDevices is level y, run from x0 to x1, or, when that run would
// pass a device (a valve or transistor) with no pin on net, a step below
// every part standing in the span (above, when the level is above the
// middle of the devices there): a wire from the edge to a pin beyond a
// stage's devices (an overall feedback lead from an output winding back to
// an earlier row) runs along the stage's foot, as the trade draws a
// feedback lead, not between the devices across their leads (review17
// a04's push-pull page, the feedback across the pair's cathode lead).
func (ly *state) underDevices(net string, y, x0, x1 float64) float64 {
	above, below, through := false, false, false
	top, foot := math.Inf(1), math.Inf(-1)
	mid, devs := 0.0, 0.0 // the devices' mean height
	for _, cl := range ly.cells {
		if cl.edge != 0 || cl.conn {
			continue
		}
		b := cl.footprint()
		if b.X1 <= x0 || b.X0 >= x1 {
			continue
		}
		top, foot = math.Min(top, b.Y0), math.Max(foot, b.Y1)
		if !activeCell(cl) || onNet(cl, net) {
			continue
		}
		// the symbol itself, not its label, stands in the run's way
		if b = cl.shape.Box; b.X1 <= x0 || b.X0 >= x1 {
			continue
		}
		through = through || b.Y0 < y && y < b.Y1
		mid, devs = mid+(b.Y0+b.Y1)/2, devs+1
		above = above || b.Y1 <= y
		below = below || b.Y0 >= y
	}
	switch {
	case !through && !(above && below):
		return y
	case y < mid/devs:
		return math.Floor(top) - ly.gapY()
	}
	return math.Ceil(foot) + ly.gapY()
}

// activeCell says whether a cell is a device: a part with a control
// electrode (a valve's grid, a transistor's base or gate).
func activeCell(cl *cell) bool {
	return cl.part != nil && cl.part.PinWithRole(graph.RoleControl) != ""
}

// onNet says whether a cell has a pin on net.
func onNet(cl *cell, net string) bool {
	for _, p := range cl.shape.Pins {
		if p.Net == net {
			return true
		}
	}
	return false
}

// clearOfFrames moves level y, run from x0 to x1, just above or below (the
// nearer) each stage frame it would cross that holds no pin of net: a
// connector's wire through another stage's frame tells the reader the net
// is that stage's.
func (ly *state) clearOfFrames(net string, y, x0, x1 float64) float64 {
	var pins []geom.Pt
	for _, cl := range ly.cells {
		for _, p := range cl.shape.Pins {
			if p.Net == net {
				pins = append(pins, p.At)
			}
		}
	}
	for range ly.frames {
		moved := false
		for _, f := range ly.frames {
			b := f.Box
			if b.X1 < x0 || b.X0 > x1 || y < b.Y0-geom.Eps || y > b.Y1+geom.Eps || holdsAny(b, pins) {
				continue
			}
			if y-b.Y0 < b.Y1-y {
				y = b.Y0 - 2
			} else {
				y = b.Y1 + 2
			}
			moved = true
		}
		if !moved {
			break
		}
	}
	return y
}

// holdsAny reports whether any of the points lies in r.
func holdsAny(r geom.Rect, pts []geom.Pt) bool {
	for _, p := range pts {
		if r.Contains(p) {
			return true
		}
	}
	return false
}
