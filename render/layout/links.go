package layout

import (
	"math"
	"sort"

	"pare/render/geom"
)

// links joins ganged sections by a dashed line where one can be drawn clear
// of every symbol, label and local symbol; the gang is named in the labels
// in any case.
func (ly *state) links(g *geom.Sheet) []geom.Link {
	byGang := map[string][]*cell{}
	var names []string
	for _, cl := range ly.cells {
		if p := realPart(cl); p != nil && p.Gang != "" {
			if _, ok := byGang[p.Gang]; !ok {
				names = append(names, p.Gang)
			}
			byGang[p.Gang] = append(byGang[p.Gang], cl)
		}
	}
	sort.Strings(names)
	// a link between far-apart sections runs above or below everything drawn
	ext := bounds(g)
	over, under := math.Floor(ext.Y0)-1.5, math.Ceil(ext.Y1)+1.5
	var out []geom.Link
	for _, name := range names {
		cs := byGang[name]
		for i := 0; i+1 < len(cs); i++ {
			a, b := cs[i], cs[i+1]
			if path := ly.linkPath(g, a, b, over, under); path != nil {
				out = append(out, geom.Link{Name: name, Path: path})
			}
		}
	}
	return out
}

// linkPaths are the ways a link may run between two sections, shortest
// first: straight across from centre to centre (an L), then out of a side
// of each symbol (the trade draws the link from the sections' sides) and
// round above or below the whole drawing.
func linkPaths(ba, bb geom.Rect, over, under float64) [][]geom.Pt {
	pa, pb := center(ba), center(bb)
	out := [][]geom.Pt{
		{pa, {X: pb.X, Y: pa.Y}, pb},
		{pa, {X: pa.X, Y: pb.Y}, pb},
		{pa, {X: pa.X, Y: over}, {X: pb.X, Y: over}, pb},
	}
	// out of a side, one to three steps clear of it, so the link can keep
	// off a wire leaving the symbol there
	side := func(r geom.Rect, left bool, d float64) (edge, out geom.Pt) {
		c := center(r)
		if left {
			return geom.Pt{X: r.X0, Y: c.Y}, geom.Pt{X: r.X0 - d, Y: c.Y}
		}
		return geom.Pt{X: r.X1, Y: c.Y}, geom.Pt{X: r.X1 + d, Y: c.Y}
	}
	for _, via := range []float64{over, under} {
		for _, leftA := range []bool{true, false} {
			for _, leftB := range []bool{true, false} {
				for _, da := range []float64{1, 2, 3} {
					for _, db := range []float64{1, 2, 3} {
						ea, oa := side(ba, leftA, da)
						eb, ob := side(bb, leftB, db)
						out = append(out, []geom.Pt{ea, oa, {X: oa.X, Y: via}, {X: ob.X, Y: via}, ob, eb})
					}
				}
			}
		}
	}
	return out
}

// linkPath is the first way clear of every symbol, label and local symbol
// that also runs along no wire (a dashed line on a wire would read as part
// of it); failing that, the first clear one.
func (ly *state) linkPath(g *geom.Sheet, a, b *cell, over, under float64) []geom.Pt {
	var clear []geom.Pt
	for _, path := range linkPaths(a.shape.Box, b.shape.Box, over, under) {
		if !ly.linkClear(g, path, a.ref, b.ref) {
			continue
		}
		if !alongWire(g, path) {
			return path
		}
		if clear == nil {
			clear = path
		}
	}
	return clear
}

// alongWire says whether a segment of the path runs on or beside a wire,
// less than a grid step from it and overlapping it.
func alongWire(g *geom.Sheet, path []geom.Pt) bool {
	for k := 0; k+1 < len(path); k++ {
		r := geom.Seg{A: path[k], B: path[k+1]}.Box()
		r = geom.Rect{X0: r.X0 - 0.9, Y0: r.Y0 - 0.9, X1: r.X1 + 0.9, Y1: r.Y1 + 0.9}
		h := math.Abs(path[k].Y-path[k+1].Y) < geom.Eps
		for _, w := range g.Wires {
			for _, s := range w.Segs {
				if s.Horizontal() == h && s.Touches(r) {
					return true
				}
			}
		}
	}
	return false
}

func center(r geom.Rect) geom.Pt { return geom.Pt{X: (r.X0 + r.X1) / 2, Y: (r.Y0 + r.Y1) / 2} }

func (ly *state) linkClear(g *geom.Sheet, path []geom.Pt, a, b string) bool {
	for k := 0; k+1 < len(path); k++ {
		s := geom.Seg{A: path[k], B: path[k+1]}
		for _, sym := range g.Symbols {
			if sym.Ref != a && sym.Ref != b && s.Touches(sym.Box) {
				return false
			}
		}
		for _, l := range g.Labels {
			if s.Touches(l.Box) {
				return false
			}
		}
		for _, l := range g.Locals {
			if s.Touches(l.Box) {
				return false
			}
		}
	}
	return true
}
