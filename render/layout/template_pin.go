package layout

import (
	"math"

	"pare/render/geom"
)

// stopperGap is the lead, in grid steps, between a part in line with an
// electrode and the electrode's pin: room for a junction and no more.
const stopperGap = 2

// closeIn brings each part a template lays ("horizontal") in the column
// just left of its anchor's up to the pin of a part in the anchor's column
// and its own row that its right-hand end joins, level with it: a grid or
// base stopper at its holder's pin, as the trade draws it and as it is
// wired, not a slot's width and a label away, where a reader takes the
// lead between for part of the grid circuit. A part further left (an
// injection capacitor beyond the grid capacitor and leak) stays. It stops stopperGap short of the pin, or short of the first
// block (the device's label) in the way; it never moves away.
func (ly *state) closeIn(anchor *block, slots []*slotted, all []*block) {
	// the parts in the anchor's column, by row
	col0 := map[int][]colPart{0: {{anchor.cells[0], geom.Pt{}}}}
	for _, s := range slots {
		if s.keep && s.col == 0 && len(s.b.cells) == 1 {
			col0[s.row] = append(col0[s.row], colPart{s.b.cells[0], s.d})
		}
	}
	at := func(b *block) geom.Rect {
		for _, s := range slots {
			if s.b == b && s.keep {
				return b.fp.Move(s.d)
			}
		}
		return b.fp
	}
	stands := ly.stands()
	for _, s := range slots {
		if !s.keep || s.col != -1 || len(s.b.cells) != 1 || len(s.b.chain) > 0 || stands[s.b.cells[0].ref] != "horizontal" ||
			standOf(s.b.cells[0].shape) != "horizontal" {
			continue
		}
		to, ok := ly.pinTarget(s.b.cells[0], col0[s.row])
		if !ok {
			continue
		}
		cl := s.b.cells[0]
		d := ly.nearest(s, to, at, all)
		if d.X < to.X {
			// the device's label in the way: the part's own label below
			// it instead of above, if that lets it nearer
			label, fp := cl.label, s.b.fp
			placeLabel(ly.c, cl, []geom.Dir{geom.Down})
			s.b.fp = cl.footprint()
			if d2 := ly.nearest(s, to, at, all); d2.X > d.X {
				d = d2
			} else {
				cl.label, s.b.fp = label, fp
			}
		}
		s.d = d
	}
}

// nearest is the move nearest to to, in whole steps rightwards from the
// slot's own and level with the pin where there is room, at which slot s's
// block touches no other block: the slot's own move when none nearer is.
func (ly *state) nearest(s *slotted, to geom.Pt, at func(*block) geom.Rect, all []*block) geom.Pt {
	free := func(d geom.Pt) bool {
		r := s.b.fp.Move(d).Inset(1)
		for _, o := range all {
			if o == s.b || !at(o).Overlaps(r) {
				continue
			}
			// the block's box is the union of its parts' symbols,
			// labels and locals: the corner under a device's label
			// beside its grid is free
			shift := geom.Pt{X: at(o).X0 - o.fp.X0, Y: at(o).Y0 - o.fp.Y0}
			for _, cl := range append(append([]*cell{}, o.cells...), o.chain...) {
				for _, b := range cellBoxes(cl) {
					if b.Move(shift).Overlaps(r) {
						return false
					}
				}
			}
		}
		return true
	}
	d := geom.Pt{X: s.d.X, Y: to.Y}
	if !free(d) {
		d.Y = s.d.Y
	}
	for x := s.d.X + 1; x <= to.X; x++ {
		if !free(geom.Pt{X: x, Y: d.Y}) {
			break
		}
		d.X = x
	}
	if !free(d) {
		return s.d
	}
	return d
}

// pinTarget is the move that puts cl's right-hand pin stopperGap left of,
// and level with, the left-facing pin on its net of a part in the anchor's
// column (each at its move).
func (ly *state) pinTarget(cl *cell, col0 []colPart) (geom.Pt, bool) {
	for _, p := range cl.shape.Pins {
		if p.Dir != geom.Right || p.Net == "" || p.Net == notConnected || ly.c.RoleOf(p.Net).IsACGround() {
			continue
		}
		for _, o := range col0 {
			for _, q := range o.cl.shape.Pins {
				if q.Net == p.Net && q.Dir == geom.Left {
					return geom.Pt{X: math.Round(q.At.X + o.d.X - stopperGap - p.At.X), Y: math.Round(q.At.Y + o.d.Y - p.At.Y)}, true
				}
			}
		}
	}
	return geom.Pt{}, false
}

// cellBoxes are the boxes a cell's drawing takes: its symbol, its label
// and its locals.
func cellBoxes(cl *cell) []geom.Rect {
	out := []geom.Rect{cl.shape.Box}
	if len(cl.label.Lines) > 0 {
		out = append(out, cl.label.Box)
	}
	for _, l := range cl.locals {
		out = append(out, l.Box)
		for _, st := range l.Stub {
			out = append(out, st.Box())
		}
	}
	return out
}
