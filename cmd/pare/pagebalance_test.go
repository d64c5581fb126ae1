package main

import (
	"path/filepath"
	"strings"
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
		// IF strip, then detector, AGC filter, volume and coupling on one
		// page with its footer in the corner (render/footcorner.go): 2 pages,
		// none under 7 parts, before
		{"b03", render.Reduced, 1, 19},
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

// A small set that goes on one page at the paper's scale (text at
// MinTextMM) is one page, and a supply chain cut into rows stays on one
// page where it fits one (common practice: a service sheet prints a small
// set whole, and the supply from rectifier to smoothing together). The
// blind review's phase-shift oscillator (review16 b01, 25 parts) took two
// half-empty faded pages, its oscillator's decoupler standing with the
// follower on the second; its mains supply (a05) had the bridge on page 1
// and the smoothing filter on page 2. together are refs that must share a
// page.
func TestSmallSetsWhole(t *testing.T) {
	cases := []struct {
		file     string
		view     render.View
		pages    int
		together []string
	}{
		{"review16/b01.toml", render.Faded, 1, nil},
		{"review16/b01.toml", render.Reduced, 1, nil},
		{"review16/a05.toml", render.Faded, 2, []string{"D1", "C5", "R1", "C6"}},
	}
	for _, tc := range cases {
		pages, err := cachedPages(filepath.Join("../../testdata", tc.file), tc.view, "A3")
		if err != nil {
			t.Fatal(err)
		}
		if len(pages) != tc.pages {
			t.Errorf("%s %s on A3: %d pages, want %d", tc.file, tc.view, len(pages), tc.pages)
		}
		page := map[string]int{}
		for i, g := range pages {
			for _, s := range g.Symbols {
				page[s.Ref] = i + 1
			}
		}
		for _, r := range tc.together {
			if page[r] == 0 || page[r] != page[tc.together[0]] {
				t.Errorf("%s %s: %s on page %d, %s on page %d: the supply chain split across pages",
					tc.file, tc.view, tc.together[0], page[tc.together[0]], r, page[r])
			}
		}
	}
}

// A decoupler (a resistor from the supply and its bypass) whose line feeds
// several stages is drawn with the first of them in signal order, the
// stage it was put in for: review16 b01's oscillator decoupler R12, C9
// stood in the follower's frame (common practice: a decoupler goes with
// the stage it feeds). Both must lie inside the oscillator's frame.
func TestDecouplerWithItsStage(t *testing.T) {
	pages, err := cachedPages("../../testdata/review16/b01.toml", render.Faded, "A3")
	if err != nil {
		t.Fatal(err)
	}
	for _, r := range []string{"R12", "C9"} {
		in := ""
		for _, g := range pages {
			for _, s := range g.Symbols {
				if s.Ref != r {
					continue
				}
				for _, f := range g.Frames {
					if f.Box.Contains(geom.Pt{X: (s.Box.X0 + s.Box.X1) / 2, Y: (s.Box.Y0 + s.Box.Y1) / 2}) {
						in = strings.Join(f.Parts, " ")
					}
				}
			}
		}
		if !strings.Contains(" "+in+" ", " Q1 ") {
			t.Errorf("review16 b01 faded: decoupler %s in the frame of [%s], want the oscillator Q1's", r, in)
		}
	}
}
