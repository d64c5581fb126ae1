package main

import (
	"path/filepath"
	"testing"
)

// reviewPageProblems bounds TestReviewPagesHold: the checker's fatal
// findings (render/check's Problems: overlaps, wires through symbols, label
// overlaps, broken junctions, text under 2.5 mm on paper) over the A3 pages
// of the blind reviews' circuits, which the gallery does not hold and so
// no other test held to them. Measured when the test was written: 22 on
// three views; a rectifier's two heater tags and cathode tag drawn over
// each other (review20 a05 faded page 5, the six findings of its pins a
// step apart) then took their text beside their bars: 16. Review16 b05's
// faded mixer, drawn at 2.31 mm on a page of its own with the base bias
// network riding on its stretch, was cut from that network (riderPieces):
// 5. Left: review17 b01's faded decoupler (R11, C8, C9) packed over its
// own net's flags (its capacitors' tips a step under its resistor's).
// Review21's circuits joined the set at 19 (+14): a05's reduced page 2
// at 2.39 mm (four labels) and b05's faded page 2, its self-oscillating
// mixer at 2.31 mm (nine labels) with a chassis joint undotted. A
// too-big row's empty columns taken back and its riders freed
// (render/closegaps.go, riders.go): 5. Review22's circuits joined at 5
// (+0). Both
// stretches then fit at 2.5 mm: a05's mixer took back the columns its
// template had emptied right of the valve (closegaps.go, 142 units wide
// → under 136), b05's cut off the base bias network it carried for the
// aerial rod's winding, tied to it only by the decoupled supply line
// (riders.go, 147 → under 136): 5.
const reviewPageProblems = 5

// TestReviewPagesHold: every page of every review circuit is checked as a
// sheet of its own; each finding is logged and their count held under
// reviewPageProblems (a ratchet: lowered as the drawing improves).
func TestReviewPagesHold(t *testing.T) {
	files := reviewCircuitsFrom(t, "review13", "review14", "review15", "review16", "review17", "review18", "review19", "review20", "review21", "review22")
	warmSheets(files, "A3")
	n := 0
	for _, f := range files {
		name := filepath.Join(filepath.Base(filepath.Dir(f)), filepath.Base(f))
		for _, v := range galleryViews {
			pages, err := cachedPages(f, v, "A3")
			if err != nil {
				t.Fatal(err)
			}
			for i, g := range pages {
				for _, p := range measured(g).Problems() {
					n++
					t.Logf("%s %s page %d: %s", name, v, i+1, p)
				}
			}
		}
	}
	t.Logf("findings on the review circuits' A3 pages: %d (ceiling %d)", n, reviewPageProblems)
	if n > reviewPageProblems {
		t.Errorf("%d findings on the review circuits' A3 pages, ceiling %d: the log lists them", n, reviewPageProblems)
	}
}
