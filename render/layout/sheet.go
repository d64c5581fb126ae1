package layout

import (
	"strconv"
	"strings"

	"pare/graph"
	"pare/render/geom"
)

// place puts the circuit's symbols, locals, labels and frames in place,
// with some orientations fixed (index into each symbol's Turns).
// A stage template's part that keeps its generic place is laid out again
// without the template's say in its orientation (template.go).
func place(c *graph.Circuit, o Options, turns map[string]int, free bool) *state {
	ly := placeOnce(c, o, turns, free, nil)
	if off := ly.templateMisses(); len(off) > 0 {
		ly = placeOnce(c, o, turns, free, off)
	}
	return ly
}

// placeOnce is one placement; off are refs whose templates do not orient them.
func placeOnce(c *graph.Circuit, o Options, turns map[string]int, free bool, off map[string]bool) *state {
	cells := makeCells(c, o)
	ly := &state{c: c, o: o, cells: cells, turns: turns, crossing: map[string]bool{}, free: free, tplOff: off}
	if len(cells) == 0 {
		return ly
	}
	ly.returns = o.Returns
	if ly.returns == nil {
		ly.returns = BiasReturns(c)
	}
	ly.rank()
	ly.orient()
	for _, cl := range ly.cells {
		buildLocals(c, cl)
		placeLabel(c, cl, labelPrefs(cl))
	}
	ly.place()
	return ly
}

// key is everything the router sees of a placement: two placements with
// the same key route the same way.
func (ly *state) key() string {
	b := []byte{'n'}
	if ly.shortFirst {
		b[0] = 's'
	}
	num := func(v float64) { b = strconv.AppendFloat(append(b, ' '), v, 'g', -1, 64) }
	rect := func(r geom.Rect) { num(r.X0); num(r.Y0); num(r.X1); num(r.Y1) }
	for _, cl := range ly.cells {
		b = append(append(b, '|'), cl.ref...)
		b = strconv.AppendInt(b, int64(cl.edge), 10)
		rect(cl.shape.Box)
		for _, p := range cl.shape.Pins {
			b = append(append(append(b, ' '), p.Name...), p.Net...)
			num(p.At.X)
			num(p.At.Y)
			b = strconv.AppendInt(b, int64(p.Dir), 10)
		}
		for _, l := range cl.locals {
			rect(l.Box)
			for _, s := range l.Stub {
				rect(s.Box())
			}
		}
		rect(cl.label.Box)
		if s, ok := ly.stageOf[cl.ref]; ok {
			b = strconv.AppendInt(append(b, 's'), int64(s), 10)
		}
	}
	for _, f := range ly.frames {
		rect(f.Box)
		rect(f.Title.Box)
		b = append(b, strings.Join(f.Title.Lines, "\n")...)
	}
	return string(b)
}

// wiring is what routing adds to a placed sheet.
type wiring struct {
	wires  []geom.Wire
	dots   []geom.Pt
	failed []string
	flags  []geom.Local // net-name flags of nets that could not be wired
	frames []geom.Frame // grown to hold their stages' wires
	// crossings counts the points where two nets cross; crossing marks the
	// refs on nets that cross
	crossings int
	crossing  map[string]bool
	pops      int // the router's work, in states taken off its queue
}

// route wires a placed sheet: every net, then rip-up and reroute of
// crossings (and, with unline, of ends in line) and net-name flags for nets
// that could not be wired.
func route(ly *state, sc *scratch, unline bool) *wiring {
	w := &wiring{crossing: map[string]bool{}}
	if len(ly.cells) == 0 {
		return w
	}
	rt := newRouter(ly, sc)
	rt.routeNets()
	rt.finish(unline)
	var g geom.Sheet
	rt.emit(&g)
	w.frames = ly.growFrames(&g)
	w.wires, w.dots, w.failed, w.flags = g.Wires, g.Dots, g.Failed, g.Locals
	w.pops = rt.pops
	for i := range rt.g {
		if o := rt.g[i].own; o[1] != 0 {
			w.crossings++
			for _, id := range o {
				for _, p := range rt.nets[id-1].pins {
					w.crossing[p.ref] = true
				}
			}
		}
	}
	return w
}

// assemble is the finished sheet: the placed symbols, locals and labels,
// and the wiring.
func assemble(ly *state, w *wiring) *Result {
	res := &Result{}
	if len(ly.cells) == 0 {
		return res
	}
	g := &res.Geom
	for _, cl := range ly.cells {
		res.Placed = append(res.Placed, Placed{Ref: cl.ref, Part: realPart(cl), Shape: cl.shape, Faded: cl.faded})
		sym := geom.Symbol{Ref: cl.ref, Box: cl.shape.Box, Pins: cl.shape.Pins, Faded: cl.faded}
		if p := realPart(cl); p != nil && !cl.conn {
			sym.Kind, sym.Type, sym.Windings = string(p.Kind), p.Type, WindingEnds(p)
		}
		g.Symbols = append(g.Symbols, sym)
		g.Locals = append(g.Locals, cl.locals...)
		if len(cl.label.Lines) > 0 {
			g.Labels = append(g.Labels, cl.label)
		}
	}
	for _, f := range w.frames {
		g.Labels = append(g.Labels, f.Title) // where the wiring left it (liftTitles)
	}
	g.Wires, g.Dots, g.Failed = w.wires, w.dots, w.failed
	g.Locals = append(g.Locals, w.flags...)
	g.Frames = append([]geom.Frame(nil), w.frames...)
	if ly.o.Links {
		g.Links = ly.links(g)
	}
	placePinFigures(ly, g)
	apartLabels(g) // after routing: the wires stay the router's (labelnudge.go)
	if ly.o.Plain {
		plain(ly, res)
	}
	g.Bounds = bounds(g)
	return res
}

// bounds is the box round everything drawn.
func bounds(g *geom.Sheet) geom.Rect {
	b := geom.Rect{}
	for _, s := range g.Symbols {
		b = b.Union(s.Box)
	}
	for _, l := range g.Locals {
		b = b.Union(l.Box)
	}
	for _, l := range g.Labels {
		b = b.Union(l.Box)
	}
	for _, w := range g.Wires {
		for _, s := range w.Segs {
			b = b.Union(s.Box())
		}
	}
	for _, f := range g.Frames {
		b = b.Union(f.Box)
	}
	for _, l := range g.Links {
		for k := 0; k+1 < len(l.Path); k++ {
			b = b.Union(geom.Seg{A: l.Path[k], B: l.Path[k+1]}.Box())
		}
	}
	return b
}
