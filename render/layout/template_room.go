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

// A template that moves blocks from right of its anchor to its left (an
// oscillator's grid leak, grid capacitor and gang section stood left of
// the valve) leaves their columns empty, and makeRoom has already moved
// the stages after it right by what the slots need on the left: the
// stretch came out wider than its parts by those empty columns (review21
// a05's reduced mixer, 142 units for 107 placed, its text drawn at
// 2.39 mm). The stages after it move back left until the gap before them
// is the one the generic placement left, wide enough for the same routing
// tracks.

// rightOf is the blocks standing right of a stage's blocks, none of its
// own, and the gap between them and everything else (the least x of
// theirs less the greatest x of the rest); gap < 0 where none stand
// there or a block of the rest reaches over them.
func (ly *state) rightOf(stage int, all []*block) (map[*block]bool, float64) {
	extent := geom.Rect{}
	for _, b := range all {
		if ly.blockStage(b) == stage {
			extent = extent.Union(b.fp)
		}
	}
	if extent == (geom.Rect{}) {
		return nil, -1
	}
	after := map[*block]bool{}
	for _, b := range all {
		if ly.blockStage(b) != stage && b.fp.X0 >= extent.X1 {
			after[b] = true
		}
	}
	return after, ly.gapBefore(stage, after, all)
}

// gapBefore is the gap between the blocks after a stage and the rest,
// the stage's frame title counted where it is wider than the stage's
// parts (the frame is drawn round both); -1 for none after.
func (ly *state) gapBefore(stage int, after map[*block]bool, all []*block) float64 {
	lo, hi, own := math.Inf(1), math.Inf(-1), geom.Rect{}
	for _, b := range all {
		if after[b] {
			lo = math.Min(lo, b.fp.X0)
			continue
		}
		hi = math.Max(hi, b.fp.X1)
		if ly.blockStage(b) == stage {
			own = own.Union(b.fp)
		}
	}
	if stage >= 0 && stage < len(ly.o.Frames) && own != (geom.Rect{}) {
		hi = math.Max(hi, own.X0+titleWidth(ly.o.Frames[stage], own.W()))
	}
	if math.IsInf(lo, 1) || math.IsInf(hi, -1) {
		return -1
	}
	return lo - hi
}

// giveBack moves the blocks after a stage left by what its template left
// empty before them: back to the gap they had (rightOf) before the
// template moved anything.
func (ly *state) giveBack(stage int, after map[*block]bool, gap float64, all []*block) {
	if gap < 0 || len(after) == 0 {
		return
	}
	d := math.Floor(ly.gapBefore(stage, after, all) - gap)
	if d <= 0 {
		return
	}
	for _, b := range all {
		if after[b] {
			b.move(geom.Pt{X: -d})
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
