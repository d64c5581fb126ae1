package layout

import (
	"math"

	"pare/render/geom"
)

// Titles a wire boxes.
//
// A wire that runs up one side of a stage's title, over its top and down
// the other side draws a box round it, and the title reads as a part (the
// blind reviewers read an anode lead taken round a title that way). The
// router sees a title only as a place a wire may not go: where the way
// under the title is closed by the stage's parts and labels, the wire goes
// round it. So once the sheet is wired, a title boxed by a wire running
// over its top is lifted above that wire, clear of everything drawn, and
// the frame grows to hold it: the wire then runs under the title, as the
// stage's own line does.

// titleReach and titleCover are render/check's wire-box test: a wire within
// titleReach grid steps of a side, along at least titleCover of its length,
// runs along it.
const (
	titleReach = 3.5
	titleCover = 0.5
	// titleLift is the space between a lifted title and the wire under it
	titleLift = 1.5
)

// liftTitles lifts the title of each frame that a wire boxes over the top
// of it (frames are the grown frames of the sheet wired as g).
func (ly *state) liftTitles(frames []geom.Frame, g *geom.Sheet) {
	for k := range frames {
		t := frames[k].Title.Box
		if len(frames[k].Title.Lines) == 0 {
			continue
		}
		top := math.Inf(1) // the highest run over the title of a wire boxing it
		for _, w := range g.Wires {
			if boxedSides(w.Segs, t) < 3 {
				continue
			}
			for _, s := range w.Segs {
				if b := s.Box(); s.Horizontal() && b.Y0 <= t.Y0 && b.Y0 >= t.Y0-titleReach && geom.Overlap(b.X0, b.X1, t.X0, t.X1) > 0 {
					top = math.Min(top, b.Y0)
				}
			}
		}
		if math.IsInf(top, 1) {
			continue
		}
		lifted := t.Move(geom.Pt{Y: top - titleLift - t.Y1})
		if !ly.titleClear(lifted, frames, k, g) {
			continue
		}
		y0 := math.Min(frames[k].Box.Y0, halfGrid(lifted.Inset(framePad+0.5)).Y0)
		if !ly.bandClear(geom.Rect{X0: frames[k].Box.X0, Y0: y0, X1: frames[k].Box.X1, Y1: frames[k].Box.Y0}) {
			continue
		}
		frames[k].Title.Box = lifted
		frames[k].Box.Y0 = y0
	}
}

// titleClear says whether a title may stand at r: clear by half a step of
// every wire, symbol, label and local symbol, and of every other frame.
func (ly *state) titleClear(r geom.Rect, frames []geom.Frame, k int, g *geom.Sheet) bool {
	near := r.Inset(0.5)
	for _, w := range g.Wires {
		for _, s := range w.Segs {
			if s.Box().Overlaps(near) {
				return false
			}
		}
	}
	for _, l := range g.Locals {
		if l.Box.Overlaps(near) {
			return false
		}
	}
	for _, cl := range ly.cells {
		if cl.shape.Box.Overlaps(near) || (len(cl.label.Lines) > 0 && cl.label.Box.Overlaps(near)) {
			return false
		}
		for _, l := range cl.locals {
			if l.Box.Overlaps(near) {
				return false
			}
		}
	}
	for j, f := range frames {
		if j != k && (f.Box.Overlaps(near) || f.Title.Box.Overlaps(near)) {
			return false
		}
	}
	return true
}

// bandClear says whether the band a frame grows by holds no symbol (a
// frame grown over another stage's part would claim it).
func (ly *state) bandClear(band geom.Rect) bool {
	for _, cl := range ly.cells {
		if cl.shape.Box.Overlaps(band) {
			return false
		}
	}
	return true
}

// boxedSides counts the sides of b along which the segments run, outside b
// and within titleReach of it, over at least titleCover of the side's
// length (render/check's wire boxes).
func boxedSides(segs []geom.Seg, b geom.Rect) int {
	cover := geom.SideCover(segs, b, titleReach)
	lens := [4]float64{b.W(), b.H(), b.W(), b.H()}
	n := 0
	for i, c := range cover {
		if lens[i] > geom.Eps && c >= titleCover*lens[i] {
			n++
		}
	}
	return n
}
