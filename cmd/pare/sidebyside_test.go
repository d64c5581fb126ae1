package main

import (
	"path/filepath"
	"testing"

	"pare/render"
)

// TestRowsSideBySide: a page holds two short rows side by side, in signal
// order, where stacking them took a page more (render/sidebyside.go). The
// page counts before were measured on the flow that only stacked rows;
// each page drawn is checked as a sheet of its own, and may not hold more
// of the checker's fatal findings than the pages drawn before did (none).
func TestRowsSideBySide(t *testing.T) {
	cases := []struct {
		file         string
		view         render.View
		paper        string
		before, want int
	}{
		// the overall feedback resistor's row beside the output pair's
		{"review15/b04.toml", render.Reduced, "letter", 4, 3},
		// a short row beside the row before it on one of the pages
		// (7 since rows are laid out compact where that saves a page:
		// render/compactrows.go)
		{"review17/b05.toml", render.Reduced, "A4", 9, 7},
	}
	for _, tc := range cases {
		f := filepath.Join("../../testdata", tc.file)
		pages, err := cachedPages(f, tc.view, tc.paper)
		if err != nil {
			t.Fatal(err)
		}
		if len(pages) != tc.want {
			t.Errorf("%s %s on %s: %d pages, want %d (%d stacked)", tc.file, tc.view, tc.paper, len(pages), tc.want, tc.before)
		}
		for i, g := range pages {
			for _, p := range measured(g).Problems() {
				t.Errorf("%s: %s", pageName(f, tc.view, i), p)
			}
		}
	}
}

// TestLooseKeepPlannedPages: the loose parts (a dial lamp and heater
// bypasses wired to no stage) ride on a row only where that row still
// shares its page as planned: review19 b05's faded view took a sixth A3
// page for its rectifier and smoothing filter once the AGC filter's row
// grew with them (page counts measured before the change).
func TestLooseKeepPlannedPages(t *testing.T) {
	cases := []struct {
		file         string
		view         render.View
		before, want int
	}{
		{"review19/b05.toml", render.Faded, 6, 5},
	}
	for _, tc := range cases {
		f := filepath.Join("../../testdata", tc.file)
		pages, err := cachedPages(f, tc.view, "A3")
		if err != nil {
			t.Fatal(err)
		}
		if len(pages) != tc.want {
			t.Errorf("%s %s on A3: %d pages, want %d (%d before)", tc.file, tc.view, len(pages), tc.want, tc.before)
		}
	}
}
