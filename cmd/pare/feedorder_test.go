package main

import (
	"fmt"
	"path/filepath"
	"testing"

	"pare/render"
	"pare/render/geom"
)

// feedOrderCeiling bounds render/check's FeedOrder findings (a transformer
// drawn left of the device whose output feeds it) over the gallery: every
// example and gallery fixture and the blind reviews' circuits
// (testdata/review14 to review17, whose faded pages drew two IF cans left of their
// valves), every view, whole sheets in both symbol styles and the A3 pages
// `pare FILE -o DIR` cuts; reduced views (stage templates) apart from full
// and faded ones (the generic placement). A ratchet, as measured when the
// checker learned the rule (14, 52): lowered as the placement improves,
// never raised; {8, 28} once a page's rows were ranked from the nets they
// take from earlier rows (the rest are whole sheets' placements); {8, 24}
// with feedback told from the forward path; {8, 32} with the fourth blind
// review's circuits (testdata/review15) brought in with their own 8; {11, 60}
// with the fifth's (testdata/review16) and their own 3 and 28 (review16 b05's
// full views draw four IF cans left of their collectors); {8, 50} with
// review16 b04's and b05's output pairs named and their templates drawn;
// {8, 14} once the full and faded sheets' rank no longer crossed the nets
// the reduction tied to AC ground (a decoupled supply line reached every
// IF can on it before the transistors feeding them), a transformer an
// output feeds was entered from that output only, and an unframed can
// stood in the stage of the base it feeds (layout.Options.Quiet, fedNets,
// deviceStages).
var feedOrderCeiling = struct{ reduced, generic int }{8, 14}

// TestFeedOrder: signal flows left to right, so a transformer fed by a
// device's output (an IF can, an interstage or output transformer) stands
// right of that device (common practice, ../shared/DRAWING-NOTES.md). The
// findings are held under feedOrderCeiling and every one is logged.
func TestFeedOrder(t *testing.T) {
	files := readSheets(t)
	reviewed := reviewCircuits(t)
	files = append(files, reviewed...)
	warmSheets(files, "A3")
	reduced, generic := 0, 0
	for _, f := range files {
		for _, v := range drawViews {
			for i, g := range viewSheets(t, f, v) {
				for _, p := range measured(g).FeedOrder {
					t.Logf("%s %s %s: %s", filepath.Base(f), v, feedSheetName(i), p)
					if v == render.Reduced {
						reduced++
					} else {
						generic++
					}
				}
			}
		}
	}
	t.Logf("transformers left of the device feeding them: %d on the reduced views (ceiling %d), %d on the full and faded views (ceiling %d)",
		reduced, feedOrderCeiling.reduced, generic, feedOrderCeiling.generic)
	if reduced > feedOrderCeiling.reduced || generic > feedOrderCeiling.generic {
		t.Errorf("more transformers drawn left of the device feeding them than the ceiling %v: %d reduced, %d full and faded; the log lists them",
			feedOrderCeiling, reduced, generic)
	}
}

// viewSheets are one view of f as whole sheets in both symbol styles, then
// its A3 pages.
func viewSheets(t *testing.T, f string, v render.View) []*geom.Sheet {
	t.Helper()
	var sheets []*geom.Sheet
	for _, st := range bothStyles {
		sheets = append(sheets, cachedSheet(t, f, v, st).g)
	}
	pages, err := cachedPages(f, v, "A3")
	if err != nil {
		t.Fatal(err)
	}
	return append(sheets, pages...)
}

// feedSheetName names viewSheets' i-th sheet.
func feedSheetName(i int) string {
	if i < len(bothStyles) {
		return bothStyles[i].String()
	}
	return fmt.Sprintf("A3 page %d", i-len(bothStyles)+1)
}
