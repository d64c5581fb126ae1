package layout

import (
	"math"

	"pare/graph"
	"pare/render/geom"
	"pare/render/symbol"
)

// labelPrefs orders the label candidates: beside vertical parts, above
// horizontal ones, and away from the side most pins leave on.
func labelPrefs(cl *cell) []geom.Dir {
	if cl.part != nil && cl.part.IsActive() {
		return []geom.Dir{geom.Up, geom.Down, geom.Right, geom.Left}
	}
	b := cl.shape.Box
	if b.H() > b.W() {
		return []geom.Dir{geom.Right, geom.Left, geom.Up, geom.Down}
	}
	return []geom.Dir{geom.Up, geom.Down, geom.Right, geom.Left}
}

// placeLabel puts the cell's label at the first candidate position that
// clears the symbol, its locals and its pins' wire corridors: a small
// version of candidate-position label placement (Christensen, Marks and
// Shieber 1995), with candidates ordered by the trade's habit (beside a
// vertical part, above a horizontal one).
func placeLabel(c *graph.Circuit, cl *cell, prefer []geom.Dir) {
	if len(cl.label.Lines) == 0 {
		return
	}
	obs := labelObstacles(c, cl)
	w, h := labelSize(cl)
	b := cl.shape.Box
	cy := (b.Y0 + b.Y1) / 2
	for gap := 0.4; gap < 12; gap += 1 {
		for _, d := range prefer {
			r := labelAt(b, d, gap, w, h)
			if !obs.hits(r.Inset(0.2), nil) {
				cl.label.Box = r
				return
			}
		}
		// active parts: try the corners above the symbol too
		if cl.part != nil && cl.part.IsActive() {
			for _, r := range []geom.Rect{
				{X0: b.X0 - gap - w, Y0: b.Y0, X1: b.X0 - gap, Y1: b.Y0 + h},
				{X0: b.X1 + gap, Y0: b.Y0, X1: b.X1 + gap + w, Y1: b.Y0 + h},
			} {
				if !obs.hits(r.Inset(0.2), nil) {
					cl.label.Box = r
					return
				}
			}
		}
	}
	cl.label.Box = geom.Rect{X0: b.X1 + 12, Y0: cy - h/2, X1: b.X1 + 12 + w, Y1: cy + h/2}
}

// labelObstacles are what a cell's label must keep clear of: its symbol,
// the corridors its signal pins' wires leave along, its local symbols.
func labelObstacles(c *graph.Circuit, cl *cell) *obstacles {
	obs := &obstacles{boxes: []geom.Rect{cl.shape.Box}}
	for _, p := range cl.shape.Pins {
		if !c.RoleOf(p.Net).IsACGround() {
			obs.boxes = append(obs.boxes, corridor(p))
		}
	}
	for _, l := range cl.locals {
		obs.boxes = append(obs.boxes, l.Box)
		obs.segs = append(obs.segs, l.Stub...)
	}
	return obs
}

// labelSize is the width and height of a cell's label, its lines after
// the first set small.
func labelSize(cl *cell) (w, h float64) {
	for i, line := range cl.label.Lines {
		lw := symbol.TextWidth(line)
		if i > 0 {
			lw *= symbol.SmallScale
		}
		w = math.Max(w, lw)
		h += symbol.LineH
	}
	return w, h
}

// labelAt is the label box of size w × h on side d of symbol box b, gap
// away: centred on the side.
func labelAt(b geom.Rect, d geom.Dir, gap, w, h float64) geom.Rect {
	cx, cy := (b.X0+b.X1)/2, (b.Y0+b.Y1)/2
	switch d {
	case geom.Right:
		return geom.Rect{X0: b.X1 + gap, Y0: cy - h/2, X1: b.X1 + gap + w, Y1: cy + h/2}
	case geom.Left:
		return geom.Rect{X0: b.X0 - gap - w, Y0: cy - h/2, X1: b.X0 - gap, Y1: cy + h/2}
	case geom.Up:
		return geom.Rect{X0: cx - w/2, Y0: b.Y0 - gap - h, X1: cx + w/2, Y1: b.Y0 - gap}
	}
	return geom.Rect{X0: cx - w/2, Y0: b.Y1 + gap, X1: cx + w/2, Y1: b.Y1 + gap + h}
}
