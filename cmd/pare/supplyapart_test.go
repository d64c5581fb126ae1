package main

import (
	"path/filepath"
	"slices"
	"testing"

	"pare/render"
	"pare/render/geom"
)

// TestSupplyFiltersApart: on a reduced sheet a supply filter the reduction
// kept (a smoothing resistor into its capacitor and bleeder, a decoupler)
// stands apart from the signal path, as the trade draws the supply (common
// practice: at the end of the sheet or along its top, joined to the stages
// by labelled rail marks, never in the signal line). Review17 a05's
// smoothing filter stood in the output stage's row between the loudspeaker
// and its output socket, wired into it. On A3, as the main job cuts it:
// a row holding a supply filter's parts holds no part of a signal stage's
// frame (so no supply frame stands between two signal stages), and on each
// page no wire into a supply filter's frame carries a net that reaches a
// signal stage's part there (the stages are joined by off-row
// connectors). Each case also says how many frames its reduced sheet draws
// apart: a screen feed hung on a smoothing filter's line goes with it
// (review16 a05), a screen bypass at its valve stays there (the battery
// set's, whose dropper is in the valve's frame). Every review circuit is
// held to the same two rules.
func TestSupplyFiltersApart(t *testing.T) {
	cases := []struct {
		file  string
		apart int // supply frames drawn apart on the reduced sheet
	}{
		{"review17/a05.toml", 1}, // smoothing filter on the output pentode's screen
		{"review16/a05.toml", 2}, // smoothing filter and the screen feed on its line
		{"review14/a05.toml", 2}, // smoothing filter and a decoupler whose line leaves by a port
		{"review14/a04.toml", 1}, // a decoupler on the output screens
		{"review16/b05.toml", 2}, // a transistor set's decouplers and smoothing
		{"review17/b05.toml", 2}, // smoothing and a screen feed merged with the HT bundle
		{"good/review17-battery.toml", 0},
	}
	seen := map[string]bool{}
	for _, tc := range cases {
		f := filepath.Join("../../testdata", tc.file)
		seen[filepath.Clean(f)] = true
		if got := supplyApart(t, f); got != tc.apart {
			t.Errorf("%s: %d supply frames drawn apart on the reduced sheet, want %d", tc.file, got, tc.apart)
		}
	}
	for _, f := range reviewCircuits(t) {
		if !seen[filepath.Clean(f)] {
			supplyApart(t, f)
		}
	}
}

// supplyApart checks a circuit's reduced sheet on A3 against the two rules
// of TestSupplyFiltersApart and returns how many frames it draws apart.
func supplyApart(t *testing.T, file string) int {
	t.Helper()
	name := filepath.Base(filepath.Dir(file)) + "/" + filepath.Base(file)
	a3, _ := render.ParsePaper("A3")
	s := cachedResult(t, file).Sheet(render.Reduced)
	apart, signal := map[string]bool{}, map[string]bool{}
	n := 0
	for _, f := range s.Frames {
		if f.Apart {
			n++
		}
		for _, r := range f.Parts {
			switch {
			case f.Apart:
				apart[r] = true
			case !f.Supply:
				signal[r] = true
			}
		}
	}
	if n == 0 {
		return 0
	}
	cfg := render.Config{Page: a3}
	rows, err := cfg.Rows(s)
	if err != nil {
		t.Fatal(err)
	}
	for i, row := range rows {
		if slices.ContainsFunc(row, func(r string) bool { return apart[r] }) {
			if k := slices.IndexFunc(row, func(r string) bool { return signal[r] }); k >= 0 {
				t.Errorf("%s: row %d holds a supply filter and %s of a signal stage", name, i+1, row[k])
			}
		}
	}
	pages, err := cfg.Geometries(s)
	if err != nil {
		t.Fatal(err)
	}
	for p, g := range pages {
		for _, w := range wiresIntoApart(g, apart, signal) {
			t.Errorf("%s page %d: net %s runs from a signal stage into a supply filter's frame", name, p+1, w)
		}
	}
	return n
}

// wiresIntoApart are the nets of the wires on a page that touch a supply
// filter's frame (apart) and end at a pin of a signal stage's part: each
// row's wiring of a net is a wire of its own, so a net drawn on a signal
// row and again, from its off-row connector, on the supply's row is no
// finding.
func wiresIntoApart(g *geom.Sheet, apart, signal map[string]bool) []string {
	var boxes []geom.Rect
	for _, f := range g.Frames {
		if len(f.Parts) > 0 && apart[f.Parts[0]] {
			boxes = append(boxes, f.Box)
		}
	}
	pins := map[string][]geom.Pt{} // net → the signal stages' pins on it
	for _, sym := range g.Symbols {
		if signal[sym.Ref] {
			for _, pn := range sym.Pins {
				pins[pn.Net] = append(pins[pn.Net], pn.At)
			}
		}
	}
	var out []string
	for _, w := range g.Wires {
		if len(pins[w.Net]) == 0 || slices.Contains(out, w.Net) {
			continue
		}
		into, fromSignal := false, false
		for _, sg := range w.Segs {
			into = into || slices.ContainsFunc(boxes, func(b geom.Rect) bool { return sg.Box().Overlaps(b) || b.Contains(sg.A) })
			fromSignal = fromSignal || slices.ContainsFunc(pins[w.Net], sg.Box().Contains)
		}
		if into && fromSignal {
			out = append(out, w.Net)
		}
	}
	return out
}
