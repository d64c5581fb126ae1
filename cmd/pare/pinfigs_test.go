package main

import (
	"path/filepath"
	"testing"

	"pare/render"
)

// TestPinFiguresReadAsTheirPins: no electrode's DC figure on the full and
// faded views (whole sheets in both symbol styles, and their A3 pages,
// every example, gallery fixture and blind-review circuit) is set where a
// reader takes it for another wire's (render/check's FiguresAstray: in
// line just past another net's wire end, or with a wire between it and
// its pin). Review20 b01's faded page put Q1's base volts in the gap
// between the emitter's off-row connector and the base wire, on their
// line: it read as the emitter fed to the base. Measured on main before
// the layout refused such spots (render/layout/pinfigs.go): 24 (20 on the
// A3 pages, 4 on whole sheets; a figure by a wire that only bends there
// is not counted: the eye follows the bend).
// The layout now refuses every spot the checker counts, so none is left.
func TestPinFiguresReadAsTheirPins(t *testing.T) {
	files := append(append(readSheets(t), reviewCircuits(t)...), reviewCircuitsFrom(t, "review13", "review18", "review19", "review20")...)
	warmSheets(files, "A3")
	astray := 0
	for _, f := range files {
		for _, v := range []render.View{render.Full, render.Faded} {
			pages, err := cachedPages(f, v, "A3")
			if err != nil {
				t.Fatal(err)
			}
			for i, pg := range pages {
				for _, p := range measured(pg).FiguresAstray {
					astray++
					t.Errorf("%s: %s", pageName(f, v, i), p)
				}
			}
		}
	}
	for _, f := range readSheets(t) {
		for _, v := range []render.View{render.Full, render.Faded} {
			for _, st := range []render.Style{render.IEC, render.IEEE} {
				for _, p := range cachedSheet(t, f, v, st).report.FiguresAstray {
					astray++
					t.Errorf("%s %s %s: %s", filepath.Base(f), v, st, p)
				}
			}
		}
	}
	t.Logf("pin figures that read as another wire's: %d", astray)
}
