package layout

import (
	"math"

	"pare/render/geom"
	"pare/render/symbol"
)

// Labels apart: two parts' labels set on one line with hardly any room
// between them read as one label, and a narrow standing part between them
// does not set them apart (review21 b03 "C15 180pT1": a tank capacitor's
// label on its outer side, the transformer's name against its plates on
// the inner side; a02 "C8 100p T3 k=0.01"). Each label is placed on its
// own (labels.go) and the cells are packed by their footprints, so two
// neighbours' labels can end up so. Once the cells stand, such a label is
// set on another side of its part, or further out, where it is clear of
// every other cell and runs together with no label; failing that it stays
// (render/check's RunTogether counts what stays).

// labelRoom is the empty room, in grid steps, two labels on one line keep
// between them once the narrow bodies between are taken out: one and a
// half character widths (render/check runGap).
const labelRoom = 1.5 * symbol.CharW

// narrowCell is the widest symbol the eye jumps between two labels: a
// standing resistor's or capacitor's body (render/check narrowBody).
const narrowCell = 2.5

// apartLabels re-places, for each pair of cells whose labels run together,
// in cell order, one of the two labels: first that of the part with more
// pins (a transformer's name set against a tank capacitor's plates: the
// capacitor's label beside its own body is the one the reader expects
// there), else the other's.
func (ly *state) apartLabels() {
	for i, a := range ly.cells {
		if len(a.label.Lines) == 0 || a.conn {
			continue
		}
		for _, b := range ly.cells[i+1:] {
			if len(b.label.Lines) == 0 || b.conn || !ly.labelsRun(a.label.Box, b.label.Box) {
				continue
			}
			first, then := b, a
			if len(a.shape.Pins) > len(b.shape.Pins) {
				first, then = a, b
			}
			if !ly.relabel(first) {
				ly.relabel(then)
			}
		}
	}
}

// labelsRun says whether two label boxes share a text line with less than
// labelRoom of empty room between them, narrow cells between not counted.
func (ly *state) labelsRun(a, b geom.Rect) bool {
	y0, y1 := math.Max(a.Y0, b.Y0), math.Min(a.Y1, b.Y1)
	if y1-y0 <= geom.Eps {
		return false
	}
	if a.X0 > b.X0 {
		a, b = b, a
	}
	lo, hi := a.X1, b.X0
	if hi-lo < labelRoom {
		return true
	}
	room := hi - lo
	for _, cl := range ly.cells {
		r := cl.shape.Box
		if r.W() > narrowCell || r.Y1 <= y0 || r.Y0 >= y1 || r.X1 <= lo || r.X0 >= hi {
			continue
		}
		room -= math.Min(r.X1, hi) - math.Max(r.X0, lo)
	}
	return room < labelRoom
}

// relabel moves cl's label to the first place round its part, sides in
// the order labelPrefs gives and a step further out each round, clear of
// its own symbol, corridors and locals, of every other cell's symbol,
// label, locals and pin corridors, and running together with no other label;
// false, the label unmoved, when there is no such place.
func (ly *state) relabel(cl *cell) bool {
	obs := labelObstacles(ly.c, cl)
	w, h := labelSize(cl)
	for gap := 0.4; gap < 3; gap += 1 {
		for _, d := range labelPrefs(cl) {
			r := labelAt(cl.shape.Box, d, gap, w, h)
			if r == cl.label.Box || obs.hits(r.Inset(0.2), nil) || !ly.labelFree(cl, r) {
				continue
			}
			cl.label.Box = r
			return true
		}
	}
	return false
}

// labelFree says whether label box r of cell cl is clear of every other
// cell and runs together with none of their labels.
func (ly *state) labelFree(cl *cell, r geom.Rect) bool {
	in := r.Inset(0.2)
	for _, o := range ly.cells {
		if o == cl {
			continue
		}
		if o.shape.Box.Overlaps(in) || len(o.label.Lines) > 0 && (o.label.Box.Overlaps(in) || ly.labelsRun(r, o.label.Box)) {
			return false
		}
		for _, l := range o.locals {
			if l.Box.Overlaps(in) {
				return false
			}
		}
		for _, p := range o.shape.Pins {
			if !ly.c.RoleOf(p.Net).IsACGround() && corridor(p).Overlaps(in) {
				return false // where the pin's wire leaves
			}
		}
	}
	return true
}
