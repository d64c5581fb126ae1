package main

import (
	"path/filepath"
	"reflect"
	"testing"

	"pare/cmd/internal/pipeline"
	"pare/graph"
	"pare/render"
	"pare/render/geom"
)

// TestFadedIsFullLayout: the faded view is the full view's layout greyed
// where the reduction took parts away, the way a technician greys a copy of
// the original by hand, so for every example and fixture the two views have
// the same symbols at the same places and orientations (pins included), the
// same wires, locals, frames and label boxes, on one sheet and on A4 pages;
// only the style and the merge marks in the labels differ. And what the
// reduction dropped is greyed: every removed part's symbol, and the heater
// mark of a valve it kept whose reduced form has no heater left (the
// reduction drops a heater on a rail, which carries no signal: common
// practice).
func TestFadedIsFullLayout(t *testing.T) {
	files := readSheets(t)
	warmSheets(files, "A4") // the sheets, shared with the layout and paging checks
	errs := make([][]string, len(files))
	eachAtOnce(len(files), func(i int) { errs[i] = fadedAgainstFull(files[i], "A4") })
	for i, es := range errs {
		for _, e := range es {
			t.Errorf("%s: %s", filepath.Base(files[i]), e)
		}
	}
}

// fadedAgainstFull lists how the faded view of one file departs from its
// full view, on one sheet and on paper. The file's entry in the sheet cache
// is locked while it reads them (sheetcache_test.go).
func fadedAgainstFull(f string, paper string) []string {
	fs := fileEntry(f)
	fs.Lock()
	defer fs.Unlock()
	res, err := fs.result(f)
	if err != nil {
		return []string{err.Error()}
	}
	var out []string
	for _, onPaper := range []bool{false, true} {
		full, err1 := fs.geometries(f, render.Full, onPaper, paper)
		faded, err2 := fs.geometries(f, render.Faded, onPaper, paper)
		if err1 != nil || err2 != nil {
			return append(out, "not drawn: "+errString(err1, err2))
		}
		if len(full) != len(faded) {
			out = append(out, "the views differ in their number of pages")
			continue
		}
		for k := range full {
			where := "sheet"
			if onPaper {
				where = paper + " page " + string(rune('1'+k))
			}
			out = append(out, sameGeometry(where, full[k], faded[k])...)
			out = append(out, fadedAsDropped(where, res, faded[k])...)
		}
	}
	return out
}

func errString(errs ...error) string {
	for _, e := range errs {
		if e != nil {
			return e.Error()
		}
	}
	return ""
}

// sameGeometry compares two sheets with the style (Faded) and the label
// text taken off: what is left is where everything is drawn.
func sameGeometry(where string, a, b *geom.Sheet) []string {
	na, nb := unstyled(a), unstyled(b)
	var out []string
	for _, c := range []struct {
		what string
		x, y any
	}{
		{"symbols (places, orientations, pins)", na.Symbols, nb.Symbols},
		{"wire polylines", na.Wires, nb.Wires},
		{"junction dots", na.Dots, nb.Dots},
		{"ground and rail marks", na.Locals, nb.Locals},
		{"label boxes", na.Labels, nb.Labels},
		{"frames", na.Frames, nb.Frames},
		{"gang links", na.Links, nb.Links},
		{"bounds", na.Bounds, nb.Bounds},
	} {
		if !reflect.DeepEqual(c.x, c.y) {
			out = append(out, where+": the faded view's "+c.what+" differ from the full view's")
		}
	}
	return out
}

// unstyled is a copy of a sheet without its style and label text.
func unstyled(g *geom.Sheet) geom.Sheet {
	n := *g
	n.Symbols = append([]geom.Symbol(nil), g.Symbols...)
	for i := range n.Symbols {
		n.Symbols[i].Faded = false
	}
	n.Locals = append([]geom.Local(nil), g.Locals...)
	for i := range n.Locals {
		n.Locals[i].Faded = false
	}
	n.Labels = append([]geom.Label(nil), g.Labels...)
	for i := range n.Labels {
		n.Labels[i].Faded, n.Labels[i].Lines = false, nil
	}
	n.Wires = append([]geom.Wire(nil), g.Wires...)
	for i := range n.Wires {
		n.Wires[i].Faded = nil
	}
	return n
}

// fadedAsDropped checks the greying against the reduction: a removed
// part's symbol and a heater's rail mark are faded.
func fadedAsDropped(where string, res *pipeline.Result, g *geom.Sheet) []string {
	removed, _ := pipeline.FadedAndMerged(res.Circuit, res.Reduced)
	var out []string
	for _, s := range g.Symbols {
		if removed[s.Ref] && !s.Faded {
			out = append(out, where+": "+s.Ref+" was removed but is drawn black")
		}
	}
	for _, l := range g.Locals {
		p, rp := res.Circuit.Part(l.Owner), res.Reduced.Part(l.Owner)
		if p == nil || rp == nil || graph.RoleOfPin(p.Kind, l.Pin) != graph.RoleHeater {
			continue
		}
		if net := rp.NetOf(l.Pin); (net == "" || net == graph.NotConnected) && !l.Faded {
			out = append(out, where+": the heater mark at "+l.Owner+"."+l.Pin+" is drawn black")
		}
	}
	return out
}
