package layout

import (
	"math"

	"pare/graph"
	"pare/render/geom"
)

// Room for a template: the blocks it moves clear of the others, the ones
// that yield to it, and a mirrored pair's centre line (template.go places
// the slots; these keep what it places from landing on what stays).

// makeRoom widens the sheet where a template's slots reach past its
// stage's parts: everything from the stage's left edge on moves right by
// what the slots need on the left, and everything right of the stage by
// what they need on the right, so the gaps between stages stay as the
// generic placement left them.
func (ly *state) makeRoom(stage int, slots []*slotted, all []*block) {
	extent, reach := geom.Rect{}, geom.Rect{}
	for _, b := range all {
		if ly.blockStage(b) == stage {
			extent = extent.Union(b.fp)
		}
	}
	for _, s := range slots {
		reach = reach.Union(s.b.fp.Move(s.d))
	}
	if extent == (geom.Rect{}) || reach == (geom.Rect{}) {
		return
	}
	if left := math.Ceil(extent.X0 - reach.X0); left > 0 {
		for _, b := range all {
			if b.fp.X0 >= extent.X0 {
				b.move(geom.Pt{X: left})
			}
		}
		extent = extent.Move(geom.Pt{X: left})
		reach = reach.Move(geom.Pt{X: left})
	}
	if right := math.Ceil(reach.X1 - extent.X1); right > 0 {
		for _, b := range all {
			if ly.blockStage(b) != stage && b.fp.X0 >= extent.X1 {
				b.move(geom.Pt{X: right})
			}
		}
	}
}

// refuseCollisions refuses the slots that would touch another block or
// stretch the stage's frame over a part of another stage or none,
// refusing one at a time, the last listed first, until the rest fit.
func (ly *state) refuseCollisions(stage int, slots []*slotted, all []*block) {
	at := func(b *block) geom.Rect {
		for _, s := range slots {
			if s.b == b && s.keep {
				return b.fp.Move(s.d)
			}
		}
		return b.fp
	}
	for {
		frame := geom.Rect{}
		for _, b := range all {
			if ly.blockStage(b) == stage {
				frame = frame.Union(at(b))
			}
		}
		bad := -1
		for i, s := range slots {
			if !s.keep {
				continue
			}
			r := at(s.b).Inset(1)
			for _, o := range all {
				if o == s.b {
					continue
				}
				if ly.yields(o) {
					continue // moved aside afterwards (clearRails)
				}
				other := ly.blockStage(o) != stage
				if at(o).Overlaps(r) || other && at(o).Overlaps(frame.Inset(framePad+1)) {
					bad = i
				}
			}
		}
		if bad < 0 {
			return
		}
		slots[bad].keep = false
	}
}

// yields says whether a block gives way to a template: every part in it
// wired to rails and ground only (a reservoir or supply bypass, which the
// generic placement puts among the stage it sits beside) or faded (a part
// the reduction removed, on the faded sheet: a battery switch in the
// supply lead); a template is not refused for it, and it moves aside
// (clearRails).
func (ly *state) yields(b *block) bool {
	for _, cells := range [2][]*cell{b.cells, b.chain} {
		for _, cl := range cells {
			if cl.edge != 0 || cl.conn || len(ly.signalNets(cl)) > 0 && !cl.faded {
				return false
			}
		}
	}
	return true
}

// blockStage is the stage of a block's first part, -1 for none.
func (ly *state) blockStage(b *block) int {
	if s, ok := ly.stageOf[b.cells[0].ref]; ok && b.cells[0].edge == 0 {
		return s
	}
	return -1
}

// clearMoves are the moves clearRails tries, in turn: down one step at a
// time, then up.
func clearMoves() []float64 {
	var out []float64
	for dy := 1.0; dy < 200; dy++ {
		out = append(out, dy)
	}
	for dy := 1.0; dy < 200; dy++ {
		out = append(out, -dy)
	}
	return out
}

// commonTop is the y of a block's pin, pointing up, on the anchor's common
// electrode's net (a cathode or emitter resistor's top); false for none.
func commonTop(a *cell, b *block) (float64, bool) {
	pin := a.part.PinWithRole(graph.RoleCommon)
	if pin == "" || len(b.cells) != 1 {
		return 0, false
	}
	net := ""
	for _, p := range a.part.Pins {
		if p.Name == pin {
			net = p.Net
		}
	}
	for _, p := range b.cells[0].shape.Pins {
		if p.Net == net && p.Dir == geom.Up {
			return p.At.Y, true
		}
	}
	return 0, false
}

// flippedBelow says whether a template's slots stand a device upside down
// (StandFlipped): the lower half of a mirrored pair.
func (ly *state) flippedBelow(slots []*slotted) bool {
	stands := ly.stands()
	for _, s := range slots {
		for _, cl := range s.b.cells {
			if stands[cl.ref] == StandFlipped {
				return true
			}
		}
	}
	return false
}
