package main

import (
	"path/filepath"
	"slices"
	"testing"
)

// TestTanksBesideWindings: a tuned circuit's L and C stand side by side
// (common practice; ../shared/DRAWING-NOTES.md): render/check's FarTanks
// lists each capacitor across a winding drawn more than eight grid steps
// from it. Every view of every example must have none; the fixtures'
// (the gallery's and the sheets review's circuits, testdata/review12) are
// logged, so a class the placement does not yet stand together shows.
func TestTanksBesideWindings(t *testing.T) {
	review, err := filepath.Glob("../../testdata/review12/*.toml")
	if err != nil || len(review) == 0 {
		t.Fatalf("no review circuits: %v", err)
	}
	examples := exampleFiles(t)
	files := append(readSheets(t), review...)
	warmSheets(files, "")
	far := 0
	for _, f := range files {
		for _, v := range drawViews {
			for _, st := range bothStyles {
				r := cachedSheet(t, f, v, st).report
				for _, p := range r.FarTanks {
					if slices.Contains(examples, f) {
						t.Errorf("%s %s %s: %s", filepath.Base(f), v, st, p)
					} else {
						t.Logf("%s %s %s: %s", filepath.Base(f), v, st, p)
					}
				}
				far += len(r.FarTanks)
			}
		}
	}
	t.Logf("capacitors across a winding drawn away from it: %d", far)
}
