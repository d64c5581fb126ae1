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
	// a link between far-apart sections runs above everything drawn
	top := math.Inf(1)
	for _, s := range g.Symbols {
		top = math.Min(top, s.Box.Y0)
	}
	for _, l := range g.Labels {
		top = math.Min(top, l.Box.Y0)
	}
	for _, f := range g.Frames {
		top = math.Min(top, f.Box.Y0)
	}
	for _, w := range g.Wires {
		for _, s := range w.Segs {
			top = math.Min(top, s.Box().Y0)
		}
	}
	over := math.Floor(top) - 1.5
	var out []geom.Link
	for _, name := range names {
		cs := byGang[name]
		for i := 0; i+1 < len(cs); i++ {
			a, b := cs[i], cs[i+1]
			pa := center(a.shape.Box)
			pb := center(b.shape.Box)
			for _, path := range [][]geom.Pt{
				{pa, {X: pb.X, Y: pa.Y}, pb},
				{pa, {X: pa.X, Y: pb.Y}, pb},
				{pa, {X: pa.X, Y: over}, {X: pb.X, Y: over}, pb},
			} {
				if ly.linkClear(g, path, a.ref, b.ref) {
					out = append(out, geom.Link{Name: name, Path: path})
					break
				}
			}
		}
	}
	return out
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
