package main

import (
	"path/filepath"
	"testing"

	"pare/render"
	"pare/render/geom"
)

// partsOnPage counts a page's parts: its symbols less the sockets and the
// off-row connectors.
func partsOnPage(g *geom.Sheet) int {
	n := 0
	for _, s := range g.Symbols {
		if _, _, conn := geom.ConnectorOf(s.Ref); conn || s.Kind == "port" {
			continue
		}
		n++
	}
	return n
}

// TestPagesBalanced: a small set cut onto A3 (the paper --page auto flows
// onto) takes no more pages than its rows need and leaves no page of
// leftovers beside full ones. The blind review's IF strip (review15 b03,
// 26 parts) filled its first page with both IF stages and the detector's
// row, and gave its second page to a volume control and a coupling
// capacitor; a service sheet splits such a strip between the IF stages and
// the detector, each page carrying a stage group (common practice: one
// printed sheet per functional section). want is the page count and the
// fewest parts a page may hold; the greedy flow drew 2 pages, one of 2
// parts.
func TestPagesBalanced(t *testing.T) {
	cases := []struct {
		file         string
		view         render.View
		pages, least int
	}{
		{"b03", render.Reduced, 2, 7}, // IF strip | detector, AGC filter, volume, coupling
		{"b04", render.Reduced, 2, 8}, // driver | output pair, coupling, Zobel: the rows stacked are taller than a page
	}
	for _, tc := range cases {
		file := filepath.Join("../../testdata/review15", tc.file+".toml")
		pages, err := cachedPages(file, tc.view, "A3")
		if err != nil {
			t.Fatal(err)
		}
		least := -1
		for _, g := range pages {
			if n := partsOnPage(g); least < 0 || n < least {
				least = n
			}
		}
		if len(pages) != tc.pages || least < tc.least {
			t.Errorf("%s %s on A3: %d pages, the emptiest holding %d parts; want %d pages, none under %d",
				tc.file, tc.view, len(pages), least, tc.pages, tc.least)
		}
	}
}

// TestNoPageOfLeftovers: on every blind-review circuit (review15) and view
// cut onto A3, no page of several holds under a third of the parts the
// sheet's pages hold on average where the rows could be cut otherwise: a
// page of two parts after full ones is a page a reader turns for nothing.
// The review's sets are small (17 to 87 parts), so each takes the search
// for balanced pages (render's balanceMost stretches) or is held by it.
func TestNoPageOfLeftovers(t *testing.T) {
	files, err := filepath.Glob("../../testdata/review15/*.toml")
	if err != nil || len(files) == 0 {
		t.Fatalf("no review circuits: %v", err)
	}
	for _, f := range files {
		for _, v := range galleryViews {
			pages, err := cachedPages(f, v, "A3")
			if err != nil {
				t.Fatal(err)
			}
			if len(pages) < 2 {
				continue
			}
			total := 0
			for _, g := range pages {
				total += partsOnPage(g)
			}
			for i, g := range pages {
				if n := partsOnPage(g); 3*n*len(pages) < total && n <= 2 {
					t.Errorf("%s %s on A3 page %d of %d: %d parts of %d", filepath.Base(f), v, i+1, len(pages), n, total)
				}
			}
		}
	}
}
