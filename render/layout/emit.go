package layout

import (
	"math"
	"math/bits"
	"sort"

	"pare/render/geom"
	"pare/render/symbol"
)

// flagNet draws a net that could not be wired as a net-name flag at each of
// its pins, the trade's way of joining distant points.
func (rt *router) flagNet(id int) {
	nr := rt.nets[id]
	text := railText(rt.ly.c.Net(nr.name), nr.name)
	for _, wp := range nr.pins {
		var chosen *geom.Local
		for s := 1.0; s <= 8 && chosen == nil; s++ {
			for side := 0; side < 3 && chosen == nil; side++ {
				cand := rt.flagAt(wp, text, s, side)
				if rt.free(cand, id) {
					chosen = &cand
				}
			}
		}
		if chosen == nil {
			cand := rt.flagAt(wp, text, 1, 0)
			chosen = &cand
		}
		rt.block(chosen.Box)
		for _, s := range chosen.Stub {
			rt.block(s.Box())
		}
		rt.g[wp.cell].flags &^= fBlocked
		rt.flags = append(rt.flags, *chosen)
	}
}

func (rt *router) flagAt(wp wirePin, text string, s float64, side int) geom.Local {
	st := wp.pin.Dir.Step()
	end := geom.Pt{X: wp.pin.At.X + s*st.X, Y: wp.pin.At.Y + s*st.Y}
	w := symbol.TextWidth(text)*symbol.SmallScale + 0.6
	h := symbol.LineH * symbol.SmallScale
	l := geom.Local{Kind: geom.LocalFlag, Net: wp.pin.Net, Owner: wp.ref, Pin: wp.pin.Name,
		Stub: []geom.Seg{{A: wp.pin.At, B: end}}, At: end, Text: text, Side: wp.pin.Dir, Faded: wp.faded}
	// side 0: the flag continues the stub; 1 and 2: it sits beside the
	// stub's end, on one side or the other
	dir := wp.pin.Dir
	if side > 0 {
		dir = geom.Dir((int(dir) + 2*side - 1) % 4)
		if dir < 0 {
			dir += 4
		}
	}
	switch dir {
	case geom.Left:
		l.Box = geom.R(end.X-w, end.Y-h/2, end.X, end.Y+h/2)
	case geom.Right:
		l.Box = geom.R(end.X, end.Y-h/2, end.X+w, end.Y+h/2)
	case geom.Up:
		l.Box = geom.R(end.X-w/2, end.Y-h, end.X+w/2, end.Y)
	default:
		l.Box = geom.R(end.X-w/2, end.Y, end.X+w/2, end.Y+h)
		l.Down = true
	}
	l.TextBox = l.Box
	return l
}

// free says whether a flag's cells are all unused.
func (rt *router) free(l geom.Local, id int) bool {
	ok := true
	check := func(r geom.Rect, skip int) {
		x0, x1 := int(math.Floor(r.X0+geom.Eps))-rt.x0, int(math.Ceil(r.X1-geom.Eps))-rt.x0
		y0, y1 := int(math.Floor(r.Y0+geom.Eps))-rt.y0, int(math.Ceil(r.Y1-geom.Eps))-rt.y0
		for y := y0; y <= y1; y++ {
			for x := x0; x <= x1; x++ {
				if x < 0 || y < 0 || x >= rt.w || y >= rt.h {
					ok = false
					return
				}
				i := y*rt.w + x
				if i == skip {
					continue
				}
				g := &rt.g[i]
				if g.flags&(fBlocked|fPin) != 0 || g.own[0] != 0 || (g.resv != 0 && g.resv != int32(id+1)) {
					ok = false
				}
			}
		}
	}
	pinCell := rt.index(l.Stub[0].A)
	for _, st := range l.Stub { // a rail tag's stub may turn (tankretag.go)
		check(st.Box(), pinCell)
	}
	check(l.Box, pinCell)
	return ok
}

// emit writes the routed wires, dots and flags into the sheet geometry.
func (rt *router) emit(g *geom.Sheet) {
	for id, nr := range rt.nets {
		if !nr.ok || len(nr.cells) == 0 {
			continue
		}
		rt.fadeRuns(id)
		w, dots := rt.wire(id)
		g.Wires = append(g.Wires, w)
		g.Dots = append(g.Dots, dots...)
	}
	for _, nr := range rt.nets {
		if !nr.ok && len(nr.pins) >= 2 {
			g.Failed = append(g.Failed, nr.name)
		}
	}
	g.Locals = append(g.Locals, rt.flags...)
}

// wire is one net's wiring: unit steps merged into straight runs that break
// at bends, junctions, pins and where a run changes between live and faded;
// and a dot at every junction.
func (rt *router) wire(id int) (geom.Wire, []geom.Pt) {
	nr := rt.nets[id]
	net := int32(id + 1)
	cells := append([]int(nil), nr.cells...)
	sort.Ints(cells)
	cells = uniq(cells)
	w := geom.Wire{Net: nr.name}
	rt.runsAcross(net, cells, &w)
	rt.runsDown(net, cells, &w)
	var dots []geom.Pt
	for _, c := range cells {
		if bits.OnesCount8(rt.arms(c, net)) >= 3 {
			dots = append(dots, rt.point(c))
		}
	}
	return w, dots
}

// edgeE says whether the net steps from cell c to the cell east of it: a
// real step joins two cells that both carry it (a pin's lead into its body
// is an arm without a step).
func (rt *router) edgeE(c int, net int32) bool {
	return c >= 0 && c%rt.w < rt.w-1 && rt.arms(c, net)&armE != 0 && rt.arms(c+1, net)&armW != 0
}

// edgeS says whether the net steps from cell c to the cell south of it.
func (rt *router) edgeS(c int, net int32) bool {
	return c >= 0 && c+rt.w < len(rt.g) && rt.arms(c, net)&armS != 0 && rt.arms(c+rt.w, net)&armN != 0
}

// runsAcross adds the net's horizontal runs, row by row (cells are sorted by
// row, then column).
func (rt *router) runsAcross(net int32, cells []int, w *geom.Wire) {
	straight := func(c int) bool { return rt.arms(c, net) == armE|armW }
	for _, c := range cells {
		if !rt.edgeE(c, net) {
			continue
		}
		fe := rt.faded(c, fFadedE)
		if c%rt.w > 0 && rt.edgeE(c-1, net) && straight(c) && rt.faded(c-1, fFadedE) == fe {
			continue // inside a run started further left
		}
		end := c + 1
		for rt.edgeE(end, net) && straight(end) && rt.faded(end, fFadedE) == fe {
			end++
		}
		w.Segs = append(w.Segs, geom.Seg{A: rt.point(c), B: rt.point(end)})
		w.Faded = append(w.Faded, fe)
	}
}

// runsDown adds the net's vertical runs, column by column.
func (rt *router) runsDown(net int32, cells []int, w *geom.Wire) {
	straight := func(c int) bool { return rt.arms(c, net) == armN|armS }
	byCol := append([]int(nil), cells...)
	sort.Slice(byCol, func(a, b int) bool {
		xa, xb := byCol[a]%rt.w, byCol[b]%rt.w
		if xa != xb {
			return xa < xb
		}
		return byCol[a] < byCol[b]
	})
	for _, c := range byCol {
		if !rt.edgeS(c, net) {
			continue
		}
		fs := rt.faded(c, fFadedS)
		if rt.edgeS(c-rt.w, net) && straight(c) && rt.faded(c-rt.w, fFadedS) == fs {
			continue // inside a run started further up
		}
		end := c + rt.w
		for rt.edgeS(end, net) && straight(end) && rt.faded(end, fFadedS) == fs {
			end += rt.w
		}
		w.Segs = append(w.Segs, geom.Seg{A: rt.point(c), B: rt.point(end)})
		w.Faded = append(w.Faded, fs)
	}
}

func uniq(s []int) []int {
	out := s[:0]
	for i, v := range s {
		if i == 0 || v != s[i-1] {
			out = append(out, v)
		}
	}
	return out
}
