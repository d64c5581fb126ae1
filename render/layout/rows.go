package layout

import (
	"pare/graph"
	"pare/render/geom"
	"pare/render/symbol"
)

// A sheet too wide for its page is cut into rows (render/pages.go): each row
// is laid out on its own, as a small sheet, and a net that runs on in another
// row ends at an off-row connector at the row's edge: on the left where it
// comes from an earlier row, on the right where it goes on to a later one.
// The connector is a cell like the input and output flags, so placement and
// routing treat it as any terminal.

// Continuation is a net that runs on in another row.
type Continuation struct {
	Net   string
	Label string // the text on the connector; partners carry the same text
	In    bool   // comes from an earlier row (left edge), else goes to a later one
}

// connectorCells are the off-row connectors of a row, after the input and
// output flags: always drawn, even on a net that carries a port or a flag
// already, because the reader looks for the partner by its label.
func connectorCells(o Options) []*cell {
	var out []*cell
	for _, k := range o.Continues {
		ref, edge := geom.ConnectorTo+k.Net, 1
		if k.In {
			ref, edge = geom.ConnectorFrom+k.Net, -1
		}
		p := &graph.Part{Ref: ref, Kind: graph.Port, Label: k.Label, Pins: []graph.Pin{{Name: "1", Net: k.Net}}}
		out = append(out, &cell{part: p, ref: ref, edge: edge, conn: true})
	}
	return out
}

// connectorShape is the symbol of an off-row connector cell.
func connectorShape(cl *cell) symbol.Shape {
	s := symbol.Connector(cl.part.Label, cl.edge < 0)
	for i := range s.Pins {
		s.Pins[i].Net = cl.part.Pins[0].Net
	}
	return s
}

// Extents places a circuit without routing it and returns each part's
// footprint: enough to decide where a sheet may be
// cut into rows, at a small part of the cost of a layout.
func Extents(c *graph.Circuit, o Options) map[string]geom.Rect {
	out, _ := ExtentsPlaced(c, o)
	return out
}

// ExtentsPlaced is Extents and the placement it made (Options.Placed).
func ExtentsPlaced(c *graph.Circuit, o Options) (map[string]geom.Rect, *Placement) {
	ly := place(c, o, nil, false)
	out := make(map[string]geom.Rect, len(ly.cells))
	for _, cl := range ly.cells {
		out[cl.ref] = cl.footprint()
	}
	return out, &Placement{ly: ly}
}

// LeastBounds is a box that Layout's Bounds for the same circuit and
// options is never smaller than, found by placing without routing, and
// whether there is one. Without the untangle search a layout keeps its
// plain placement, and routing only adds to it: the symbols and their
// local ground and rail marks stay where they were placed, and frames
// only grow (growFrames). A label (a frame's title too) can lose its line of DC figures to the
// figures placed at the pins (trimDCLine), so labels are left out. The
// untangle search may take another placement, so there is no such box.
func LeastBounds(c *graph.Circuit, o Options) (geom.Rect, bool) {
	r, ok, _ := LeastBoundsPlaced(c, o)
	return r, ok
}

// LeastBoundsPlaced is LeastBounds and the placement it made
// (Options.Placed), nil when there is no least box.
func LeastBoundsPlaced(c *graph.Circuit, o Options) (geom.Rect, bool, *Placement) {
	if o.Untangle || c == nil {
		return geom.Rect{}, false, nil
	}
	ly := place(c, o, nil, false)
	b := geom.Rect{}
	for _, cl := range ly.cells {
		b = b.Union(cl.shape.Box)
		for _, l := range cl.locals {
			b = b.Union(l.Box)
		}
	}
	for _, f := range ly.frames {
		b = b.Union(f.Box)
	}
	return b, true, &Placement{ly: ly}
}

// Moved is the result shifted by d: rows are laid out at the origin and
// stacked on a page.
func (r *Result) Moved(d geom.Pt) *Result {
	out := &Result{Geom: r.Geom.Moved(d)}
	for _, p := range r.Placed {
		p.Shape = p.Shape.Moved(d)
		out.Placed = append(out.Placed, p)
	}
	return out
}

// Add puts another result (a row moved into place) on this one.
func (r *Result) Add(o *Result) {
	r.Placed = append(r.Placed, o.Placed...)
	g, h := &r.Geom, &o.Geom
	g.Symbols = append(g.Symbols, h.Symbols...)
	g.Locals = append(g.Locals, h.Locals...)
	g.Labels = append(g.Labels, h.Labels...)
	g.Wires = append(g.Wires, h.Wires...)
	g.Dots = append(g.Dots, h.Dots...)
	g.Frames = append(g.Frames, h.Frames...)
	g.Links = append(g.Links, h.Links...)
	g.Failed = append(g.Failed, h.Failed...)
	g.Bounds = g.Bounds.Union(h.Bounds)
}
