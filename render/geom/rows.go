package geom

import "strings"

// Moved is the sheet shifted by d: a row laid out on its own is stacked
// under the others on its page.
func (g Sheet) Moved(d Pt) Sheet {
	mv := func(r Rect) Rect { return r.Move(d) }
	seg := func(s Seg) Seg { return Seg{s.A.Add(d), s.B.Add(d)} }
	out := Sheet{Bounds: mv(g.Bounds), Failed: append([]string(nil), g.Failed...)}
	for _, s := range g.Symbols {
		s.Box = mv(s.Box)
		pins := make([]Pin, len(s.Pins))
		for i, p := range s.Pins {
			p.At = p.At.Add(d)
			pins[i] = p
		}
		s.Pins = pins
		out.Symbols = append(out.Symbols, s)
	}
	for _, l := range g.Locals {
		stub := make([]Seg, len(l.Stub))
		for i, s := range l.Stub {
			stub[i] = seg(s)
		}
		l.Stub, l.At, l.Box, l.TextBox = stub, l.At.Add(d), mv(l.Box), mv(l.TextBox)
		out.Locals = append(out.Locals, l)
	}
	for _, l := range g.Labels {
		l.Box = mv(l.Box)
		out.Labels = append(out.Labels, l)
	}
	for _, w := range g.Wires {
		segs := make([]Seg, len(w.Segs))
		for i, s := range w.Segs {
			segs[i] = seg(s)
		}
		w.Segs = segs
		out.Wires = append(out.Wires, w)
	}
	for _, p := range g.Dots {
		out.Dots = append(out.Dots, p.Add(d))
	}
	for _, f := range g.Frames {
		f.Box, f.Title.Box = mv(f.Box), mv(f.Title.Box)
		out.Frames = append(out.Frames, f)
	}
	for _, k := range g.Links {
		path := make([]Pt, len(k.Path))
		for i, p := range k.Path {
			path[i] = p.Add(d)
		}
		k.Path = path
		out.Links = append(out.Links, k)
	}
	return out
}

// Off-row connector refs (a sheet cut into rows ends a net that runs on in
// another row at a connector): the '@' cannot occur in a netlist ref.
const (
	ConnectorFrom = "@from:" // the incoming end, at a row's left edge
	ConnectorTo   = "@to:"   // the outgoing end, at a row's right edge
)

// ConnectorOf reads a symbol's ref: whether it is an off-row connector, the
// net (its label), and whether it is the incoming end.
func ConnectorOf(ref string) (net string, in, ok bool) {
	if n, found := strings.CutPrefix(ref, ConnectorFrom); found {
		return n, true, true
	}
	if n, found := strings.CutPrefix(ref, ConnectorTo); found {
		return n, false, true
	}
	return "", false, false
}
