package main

import (
	"slices"
	"testing"

	"pare/render"
)

// TestDetectorOnItsCansRow: a detector diode is drawn right after the IF
// can whose secondary feeds it, before the delayed-AGC diode and the AGC
// filter that hang off the strip, and on the can's row where they fit one
// (common practice, ../shared/DRAWING-NOTES.md: "an IF transformer is a
// pair of tuned windings in a can between two stages"). The blind review
// rejected review19 a03's faded A3 pages: the AGC diode's stretch and the
// detector's IF filter stood between can and detector in the cut order,
// and a row and page break cut the detector from its can.
func TestDetectorOnItsCansRow(t *testing.T) {
	a3, _ := render.ParsePaper("A3")
	for _, c := range []struct {
		file          string
		view          render.View
		can, det, agc string // the can, the detector it feeds, a part of the AGC branch
		sameRow       bool   // the can's row holds the detector
	}{
		{"review19/a03.toml", render.Faded, "T2", "V2a", "C11", true},
		{"review19/a03.toml", render.Reduced, "T2", "V2a", "C11", false}, // S1, S2 and the detector are a grid step too wide for one row
	} {
		rows, err := render.Config{Page: a3}.Rows(cachedResult(t, "../../testdata/"+c.file).Sheet(c.view))
		if err != nil {
			t.Fatal(err)
		}
		rowOf, order := map[string]int{}, []string{}
		for i, r := range rows {
			for _, ref := range r {
				rowOf[ref] = i
				order = append(order, ref)
			}
		}
		if slices.Index(order, c.det) > slices.Index(order, c.agc) {
			t.Errorf("%s %s: %s comes after %s in the cut order %v; the detector goes right after its can", c.file, c.view, c.det, c.agc, rows)
		}
		if same := rowOf[c.can] == rowOf[c.det]; c.sameRow && !same {
			t.Errorf("%s %s: can %s on row %d, its detector %s on row %d: %v", c.file, c.view, c.can, rowOf[c.can], c.det, rowOf[c.det], rows)
		}
	}
}
