package main

import (
	"testing"
)

// stagelessPagesCeiling is how many pages of a sheet cut onto several A3
// pages hold no stage frame at all (only loose parts: dial lamps, heater
// bypasses), over the gallery, the examples and the blind-review circuits
// of testdata/review13 to review18, every view. Measured 1 before the
// loose parts learned to take free room among a page's stages
// (render/loosespot.go; review18 a01's faded page 2, a lamp and a heater
// bypass), 0 after. A change may lower it, never raise it.
var stagelessPagesCeiling = 0

// TestNoPageOfLooseParts: the loose parts (on rails and chassis only) never
// make a page of their own; they join a page that holds stages, under its
// rows or in its free room. Every such page is logged.
func TestNoPageOfLooseParts(t *testing.T) {
	files := sheetFixtures(t)
	warmSheets(files, "A3")
	n := 0
	for _, f := range files {
		for _, v := range drawViews {
			pages, err := cachedPages(f, v, "A3")
			if err != nil {
				t.Fatal(err)
			}
			if len(pages) < 2 {
				continue // one page holds what the sheet has, stage or not
			}
			for i, g := range pages {
				if len(g.Frames) == 0 {
					n++
					t.Logf("%s of %d: no stage on it (%d parts)", pageName(f, v, i), len(pages), len(g.Symbols))
				}
			}
		}
	}
	t.Logf("pages with no stage: %d (ceiling %d)", n, stagelessPagesCeiling)
	if n > stagelessPagesCeiling {
		t.Errorf("%d pages hold no stage (ceiling %d); the log lists them", n, stagelessPagesCeiling)
	}
}
