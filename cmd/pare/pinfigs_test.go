package main

import (
	"path/filepath"
	"strings"
	"testing"

	"pare/render"
	"pare/render/geom"
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

// dotPairCeiling is how many pairs of junction dots of unrelated nets
// stand less than two grid steps apart on one line (render/check's
// DotPairs: they read as one joint, review20 a04's HT dot over the grid
// line's), over the A3 pages of the full and faded views of every example,
// gallery fixture and blind-review circuit, and over the whole sheets of
// every view and both styles of the examples and gallery, as measured when
// the checker learned them: 2 and 0, the one review20 a04 pair on its full
// and faded page 2 (R13's foot on the HT2 line stacked a step above C5's
// top on the long-tailed pair's grid line). A change may lower these, never
// raise them. nearDotPages counts, over the same pages, the crossings
// under two grid steps from a junction dot of either net (render/check's
// NearDots, which TestSheetsReadAsDrawn holds on whole sheets only; review20
// b05's faded page 4, T7's centre-tap wire across the collector's lead a
// step from its dot, read as +9 V tied to the collector), as measured when
// it was first counted on pages: 69. Pages 2 → 0 once the long-tailed
// pair was recognised with its grid leaks to the tail (review20 a04's two
// halves in one frame, drawn by the pair's template).
// nearDotPages 69 → 54 with the router's undot pass re-wiring a net beside a junction dot from its far end as well (render/layout/undot.go, farFirst).
// 52 with a stretch too big for its page cut from the unframed parts riding on it (render/riders.go; review16 b05's mixer at 2.5 mm).
// 48 re-measured with a loop through two devices drawn as one oscillator.
var dotPairCeiling = struct{ pages, sheets, nearDotPages int }{0, 0, 48}

// TestJunctionDotsApart holds dotPairCeiling.
func TestJunctionDotsApart(t *testing.T) {
	files := append(append(readSheets(t), reviewCircuits(t)...), reviewCircuitsFrom(t, "review13", "review18", "review19", "review20")...)
	warmSheets(files, "A3")
	pages, sheets, nearDots := 0, 0, 0
	for _, f := range files {
		for _, v := range drawViews {
			pgs, err := cachedPages(f, v, "A3")
			if err != nil {
				t.Fatal(err)
			}
			for i, pg := range pgs {
				r := measured(pg)
				pages += len(r.DotPairs)
				nearDots += len(r.NearDots)
				for _, p := range append(append([]string{}, r.DotPairs...), r.NearDots...) {
					t.Logf("%s: %s", pageName(f, v, i), p)
				}
			}
		}
	}
	for _, f := range readSheets(t) {
		for _, v := range drawViews {
			for _, st := range []render.Style{render.IEC, render.IEEE} {
				for _, p := range cachedSheet(t, f, v, st).report.DotPairs {
					sheets++
					t.Logf("%s %s %s: %s", filepath.Base(f), v, st, p)
				}
			}
		}
	}
	t.Logf("junction dots of unrelated nets a step apart: %d on pages (ceiling %d), %d on whole sheets (ceiling %d)", pages, dotPairCeiling.pages, sheets, dotPairCeiling.sheets)
	t.Logf("crossings near a junction dot on pages: %d (ceiling %d)", nearDots, dotPairCeiling.nearDotPages)
	if nearDots > dotPairCeiling.nearDotPages {
		t.Errorf("more crossings near a junction dot on pages (%d, ceiling %d); the log lists them", nearDots, dotPairCeiling.nearDotPages)
	}
	if pages > dotPairCeiling.pages || sheets > dotPairCeiling.sheets {
		t.Errorf("more junction dots of unrelated nets a step apart: %d on pages (ceiling %d), %d on whole sheets (ceiling %d); the log lists them",
			pages, dotPairCeiling.pages, sheets, dotPairCeiling.sheets)
	}
}

// TestCentreTapClearOfCollectorDot: review20 b05's faded output page drew
// T7's centre-tap wire (+9 V) across Q6's collector lead a step from the
// collector's junction dot, and the reviewer read the supply as tied to
// the collector. The page's crossings must all stand two grid steps or
// more from a junction dot of either net (render/check's NearDots). The
// router's undot pass now re-wires such a net with its own new junction
// beside its own crossing priced, and with the tree grown from either end
// (render/layout/undot.go); before it, this page held one such crossing.
func TestCentreTapClearOfCollectorDot(t *testing.T) {
	f := "../../testdata/review20/b05.toml"
	pages, err := cachedPages(f, render.Faded, "A3")
	if err != nil {
		t.Fatal(err)
	}
	pushPull := 0
	for i, pg := range pages {
		if !hasFrameTitled(pg, "Push-pull") {
			continue
		}
		pushPull++
		for _, p := range measured(pg).NearDots {
			t.Errorf("%s: %s", pageName(f, render.Faded, i), p)
		}
	}
	if pushPull == 0 {
		t.Fatal("no page of review20 b05's faded view holds the push-pull output stage's frame")
	}
}

// hasFrameTitled says whether a page holds a stage frame whose title
// contains s.
func hasFrameTitled(g *geom.Sheet, s string) bool {
	for _, fr := range g.Frames {
		if strings.Contains(strings.Join(fr.Title.Lines, " "), s) {
			return true
		}
	}
	return false
}
