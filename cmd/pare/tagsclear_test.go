package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"pare/render"
)

// tagsOnPartsCeiling is how many rail tags stand closer than half a grid
// step to a part's body or pins (render/check's TagsOnParts), over the
// gallery, the examples and the blind-review circuits of testdata/review13
// to review18, whole sheets (every view, IEC) and A3 pages (every view).
// A change may lower it, never raise it.
var tagsOnPartsCeiling = 0

// sheetFixtures are the circuits the sheet-furniture counts run over: the
// gallery, the examples and the blind-review circuits of testdata/review13
// to review18. PARE_SHEETS_ONLY keeps those whose path holds it (a quick
// look at one family while working; the ceilings hold for the whole set).
func sheetFixtures(t *testing.T) []string {
	t.Helper()
	files := append(readSheets(t), reviewCircuitsFrom(t, "review13", "review14", "review15", "review16", "review17", "review18")...)
	if only := os.Getenv("PARE_SHEETS_ONLY"); only != "" {
		var keep []string
		for _, f := range files {
			if strings.Contains(f, only) {
				keep = append(keep, f)
			}
		}
		files = keep
	}
	return files
}

// reviewCircuitsFrom lists the circuits of the named review folders; a
// folder with none fails the test.
func reviewCircuitsFrom(t *testing.T, dirs ...string) []string {
	t.Helper()
	var out []string
	for _, dir := range dirs {
		files, err := filepath.Glob(filepath.Join("../../testdata", dir, "*.toml"))
		if err != nil || len(files) == 0 {
			t.Fatalf("no review circuits in testdata/%s: %v", dir, err)
		}
		out = append(out, files...)
	}
	return out
}

// TestRailTagsClearOfParts: a supply tag ("+HT", "+9 V line via R4") set
// against a capacitor's plate or another part reads as that part's label
// or as the part tied to the rail (review18 a04's C8, b05's C20). Every
// finding is logged; the count stays under tagsOnPartsCeiling.
func TestRailTagsClearOfParts(t *testing.T) {
	files := sheetFixtures(t)
	warmSheets(files, "A3")
	n := 0
	for _, f := range files {
		for _, v := range drawViews {
			for _, p := range cachedSheet(t, f, v, render.IEC).report.TagsOnParts {
				n++
				t.Logf("%s %v: %s", filepath.Base(f), v, p)
			}
			pages, err := cachedPages(f, v, "A3")
			if err != nil {
				t.Fatal(err)
			}
			for i, pg := range pages {
				for _, p := range measured(pg).TagsOnParts {
					n++
					t.Logf("%s: %s", pageName(f, v, i), p)
				}
			}
		}
	}
	t.Logf("rail tags on parts: %d (ceiling %d)", n, tagsOnPartsCeiling)
	if n > tagsOnPartsCeiling {
		t.Errorf("%d rail tags closer than half a grid step to a part (ceiling %d); the log lists them", n, tagsOnPartsCeiling)
	}
}
