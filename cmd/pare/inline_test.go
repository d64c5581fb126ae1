package main

import (
	"path/filepath"
	"testing"

	"pare/render"
)

// TestReviewSheetsNotInLine: the faded sheets the fourth blind review
// rejected for leads of different nets drawn on one line with a gap between
// them (a reader joins them: the driver's cathode and anode leads on a04,
// the decoupled and the reservoir HT on a05), as the main job puts them on
// A3, have no wire ending in line with another net's (render/check's InLine
// and EndsInLine; the layout's unline pass). The whole gallery's counts are
// misreadCeiling's.
func TestReviewSheetsNotInLine(t *testing.T) {
	cases := []struct{ file, why string }{
		{"a04.toml", "cathode and anode leads collinear"},
		{"a05.toml", "ht_dec and ht_res leads collinear"},
	}
	for _, c := range cases {
		f := filepath.Join("../../testdata/review15", c.file)
		pages, err := cachedPages(f, render.Faded, "A3")
		if err != nil {
			t.Fatal(err)
		}
		for i, g := range pages {
			r := measured(g)
			for _, p := range append(append([]string(nil), r.InLine...), r.EndsInLine...) {
				t.Errorf("%s (%s): %s", pageName(f, render.Faded, i), c.why, p)
			}
		}
	}
}
