package layout

import (
	"math"
	"strings"

	"pare/graph"
	"pare/render/geom"
	"pare/render/symbol"
)

// Pin figures: the DC voltage printed small beside each electrode pin of a
// valve or transistor on the full and faded sheets, the way a service sheet
// marks its test points. Placement reserves a line of the part's label for
// all of them ("DC a 229 g2 104 k 1.9 V", dcLine), so the routed sheet is
// the same with or without room at the pins; after routing each figure goes
// to the free spot nearest its pin's tip that clears every symbol, local,
// label, wire, link and frame edge and lies nearer its own pin than any
// other pin of the part (so it cannot be read as another electrode's). The
// figures placed leave the label's line, which keeps only the pins that
// found no room.

// pinFigStep is the spacing of the candidate positions and pinFigReach how
// far from the tip a figure may go, in grid units.
const (
	pinFigStep  = 0.25
	pinFigReach = 3.0
)

// dcLine is the label line with every figure of the part, in pin order.
func dcLine(p *graph.Part, figs map[string]string) string {
	var items []string
	for _, pin := range p.Pins {
		if t := figs[pin.Name]; t != "" {
			items = append(items, pin.Name+" "+t)
		}
	}
	if len(items) == 0 {
		return ""
	}
	return "DC " + strings.Join(items, " ") + " V"
}

// placePinFigures adds the pin figures to the finished sheet g and trims
// each part's DC line to the pins left without one.
func placePinFigures(ly *state, g *geom.Sheet) {
	if len(ly.o.PinVolts) == 0 {
		return
	}
	var figs []geom.Label
	segs := geom.NetSegs(g)
	for _, cl := range ly.cells {
		want := ly.o.PinVolts[cl.ref]
		if len(want) == 0 || cl.part == nil {
			continue
		}
		var left []string
		for _, p := range cl.part.Pins { // netlist order: deterministic
			v := want[p.Name]
			pin, drawn := shapePin(cl, p.Name)
			if v == "" {
				continue
			}
			text := v + " V"
			r, ok := geom.Rect{}, false
			if drawn {
				r, ok = pinFigSpot(cl, pin, p.Net, text, g, figs, segs)
			}
			if !ok {
				left = append(left, p.Name+" "+v)
				continue
			}
			figs = append(figs, geom.Label{Owner: cl.ref + "." + p.Name, Lines: []string{text}, Box: r, Faded: cl.faded || cl.fadedPins[p.Name], Small: true})
		}
		trimDCLine(g, cl.ref, left)
	}
	g.Labels = append(g.Labels, figs...)
}

func shapePin(cl *cell, name string) (geom.Pin, bool) {
	for _, p := range cl.shape.Pins {
		if p.Name == name {
			return p, true
		}
	}
	return geom.Pin{}, false
}

// trimDCLine rewrites the DC line of ref's label to the pins in left, or
// drops it; the label's box only shrinks, so it stays clear.
func trimDCLine(g *geom.Sheet, ref string, left []string) {
	for i := range g.Labels {
		l := &g.Labels[i]
		if l.Owner != ref || len(l.Lines) < 2 || !strings.HasPrefix(l.Lines[len(l.Lines)-1], "DC ") {
			continue
		}
		if len(left) > 0 {
			l.Lines[len(l.Lines)-1] = "DC " + strings.Join(left, " ") + " V"
			return
		}
		l.Lines = l.Lines[:len(l.Lines)-1]
		l.Box.Y1 -= symbol.LineH
		return
	}
}

// pinFigSpot searches the candidate boxes round the pin's tip, nearest
// first (ties by scan order), for one that clears the sheet and reads as
// the pin's own (geom.FigureAstray, over segs: the sheet's wires and stubs).
func pinFigSpot(cl *cell, p geom.Pin, net, text string, g *geom.Sheet, figs []geom.Label, segs []geom.NetSeg) (geom.Rect, bool) {
	w := symbol.TextWidth(text)*symbol.SmallScale + 0.2
	h := symbol.LineH * symbol.SmallScale
	area := geom.Rect{X0: p.At.X - pinFigReach - w, Y0: p.At.Y - pinFigReach - h,
		X1: p.At.X + pinFigReach + w, Y1: p.At.Y + pinFigReach + h}
	obs := nearObstacles(g, figs, area)
	near := nearNetSegs(segs, area)
	best, bestD := geom.Rect{}, math.Inf(1)
	n := int(math.Ceil((pinFigReach + w) / pinFigStep))
	m := int(math.Ceil((pinFigReach + h) / pinFigStep))
	for i := -m; i <= m; i++ {
		for j := -n; j <= n; j++ {
			x0, y0 := p.At.X+float64(j)*pinFigStep, p.At.Y+float64(i)*pinFigStep
			r := geom.Rect{X0: x0, Y0: y0, X1: x0 + w, Y1: y0 + h}
			d := rectDist(r, p.At)
			if d >= bestD || d > pinFigReach || !nearestPin(cl, p, r, d) || obs.hits(r.Inset(0.15), nil) ||
				geom.FigureAstray(r, p.At, net, near) != "" {
				continue
			}
			best, bestD = r, d
		}
	}
	return best, !math.IsInf(bestD, 1)
}

// nearNetSegs keeps the segments that could run in line with, or between
// a pin and, a figure in area.
func nearNetSegs(segs []geom.NetSeg, area geom.Rect) []geom.NetSeg {
	var out []geom.NetSeg
	reach := area.Inset(3)
	for _, s := range segs {
		if s.Touches(reach) {
			out = append(out, s)
		}
	}
	return out
}

// nearObstacles collects what a figure in area must keep clear of.
func nearObstacles(g *geom.Sheet, figs []geom.Label, area geom.Rect) *obstacles {
	obs := &obstacles{}
	box := func(r geom.Rect) {
		if r != (geom.Rect{}) && r.Overlaps(area) {
			obs.boxes = append(obs.boxes, r)
		}
	}
	seg := func(s geom.Seg) {
		if s.Box().Inset(1).Overlaps(area) {
			obs.segs = append(obs.segs, s)
		}
	}
	for _, s := range g.Symbols {
		box(s.Box)
	}
	for _, l := range g.Locals {
		box(l.Box)
		box(l.TextBox)
		for _, s := range l.Stub {
			seg(s)
		}
	}
	for _, l := range g.Labels {
		box(l.Box)
	}
	for _, l := range figs {
		box(l.Box)
	}
	for _, w := range g.Wires {
		for _, s := range w.Segs {
			seg(s)
		}
	}
	for _, f := range g.Frames {
		box(f.Title.Box)
		for _, e := range edges(f.Box) {
			seg(e)
		}
	}
	for _, lk := range g.Links {
		for i := 1; i < len(lk.Path); i++ {
			seg(geom.Seg{A: lk.Path[i-1], B: lk.Path[i]})
		}
	}
	return obs
}

// edges are a box's four sides.
func edges(b geom.Rect) []geom.Seg {
	a, c := geom.Pt{X: b.X0, Y: b.Y0}, geom.Pt{X: b.X1, Y: b.Y1}
	return []geom.Seg{{A: a, B: geom.Pt{X: c.X, Y: a.Y}}, {A: geom.Pt{X: a.X, Y: c.Y}, B: c},
		{A: a, B: geom.Pt{X: a.X, Y: c.Y}}, {A: geom.Pt{X: c.X, Y: a.Y}, B: c}}
}

// nearestPin reports whether no other pin of the cell lies as near r as p.
func nearestPin(cl *cell, p geom.Pin, r geom.Rect, d float64) bool {
	for _, q := range cl.shape.Pins {
		if q.Name != p.Name && q.At != p.At && rectDist(r, q.At) <= d+0.25 {
			return false
		}
	}
	return true
}

// rectDist is the distance from pt to the nearest point of r (0 inside).
func rectDist(r geom.Rect, pt geom.Pt) float64 {
	dx := math.Max(math.Max(r.X0-pt.X, 0), pt.X-r.X1)
	dy := math.Max(math.Max(r.Y0-pt.Y, 0), pt.Y-r.Y1)
	return math.Hypot(dx, dy)
}
