package layout

import (
	"math"
	"sort"

	"pare/render/geom"
)

// linkReach is the longest mechanical link drawn, in grid steps along its
// path: a longer one, run round the drawing, closed with the sections'
// own lines into a dashed loop that read as a stage frame (review18 b02).
// Sections further apart are joined by their labels alone ("gang tune"
// beside each, cells.go), as the trade marks ganged sections drawn apart.
const linkReach = 20.0

// links joins ganged sections by a short dashed line, straight or with one
// bend, between the sections' centres, where one can be drawn clear of
// every symbol, label and local symbol; the gang is named in the labels in
// any case.
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
	var out []geom.Link
	for _, name := range names {
		cs := byGang[name]
		for i := 0; i+1 < len(cs); i++ {
			a, b := cs[i], cs[i+1]
			if path := ly.linkPath(g, a, b); path != nil {
				out = append(out, geom.Link{Name: name, Path: path})
			}
		}
	}
	return out
}

// linkPaths are the ways a link may run between two sections: straight
// across from centre to centre (an L when they are not level), across
// first or down first; none when the way is longer than linkReach.
func linkPaths(ba, bb geom.Rect) [][]geom.Pt {
	pa, pb := center(ba), center(bb)
	if math.Abs(pa.X-pb.X)+math.Abs(pa.Y-pb.Y) > linkReach+geom.Eps {
		return nil
	}
	return [][]geom.Pt{
		{pa, {X: pb.X, Y: pa.Y}, pb},
		{pa, {X: pa.X, Y: pb.Y}, pb},
	}
}

// linkPath is the first way clear of every symbol, label and local symbol
// that also runs along no wire (a dashed line on a wire would read as part
// of it); failing that, the first clear one.
func (ly *state) linkPath(g *geom.Sheet, a, b *cell) []geom.Pt {
	var clear []geom.Pt
	for _, path := range linkPaths(a.shape.Box, b.shape.Box) {
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
