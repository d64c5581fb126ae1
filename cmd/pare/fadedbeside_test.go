package main

import (
	"math"
	"path/filepath"
	"slices"
	"testing"

	"pare/render"
	"pare/render/geom"
)

// TestFadedPartsBesideTheirDevice: on the faded view cut onto A3 (what
// --page auto prints), a part wired to a transistor's base, directly or
// through the coupling winding that feeds it (a base bias network at the
// winding's cold end, the transformer itself), is drawn on the
// transistor's page and near it, not in another stage's frame a page
// away. The blind review (review15) found b03's first IF transformer in
// the AGC filter's frame a sheet from Q1, and b02's greyed bias network in
// the aerial frame on another page than its RF transistor. Common practice
// on a service sheet: a bias network is drawn at the electrode it biases.
// The part's centre must lie inside the frame of the device's stage, or
// within near grid units of the device (a stage's width on an A3 row).
func TestFadedPartsBesideTheirDevice(t *testing.T) {
	const near = 40.0
	cases := []struct {
		file, device string
		parts        []string
	}{
		{"b02", "Q1", []string{"R1", "R2", "C2", "R3"}}, // base bias at T1's secondary's cold end
		{"b03", "Q1", []string{"T1", "C1"}},             // the IF transformer into Q1's base and its tank capacitor
		{"b05", "Q1", []string{"C2", "R2"}},             // the set's mixer: base bias at the aerial winding's cold end
	}
	for _, tc := range cases {
		file := filepath.Join("../../testdata/review15", tc.file+".toml")
		pages, err := cachedPages(file, render.Faded, "A3")
		if err != nil {
			t.Fatal(err)
		}
		dp, dbox := symbolOn(pages, tc.device)
		if dp < 0 {
			t.Fatalf("%s faded: no %s on any page", tc.file, tc.device)
		}
		for _, ref := range tc.parts {
			pp, box := symbolOn(pages, ref)
			switch {
			case pp < 0:
				t.Errorf("%s faded: no %s on any page", tc.file, ref)
			case pp != dp:
				t.Errorf("%s faded: %s on page %d, its device %s on page %d", tc.file, ref, pp+1, tc.device, dp+1)
			case centreGap(box, dbox) > near && !inFrameOf(pages[pp], box, tc.device):
				t.Errorf("%s faded page %d: %s stands %.0f from %s outside its frame, want at most %g", tc.file, pp+1, ref, centreGap(box, dbox), tc.device, near)
			}
		}
	}
}

// symbolOn is the page (from 0, -1 for none) and box of the symbol ref.
func symbolOn(pages []*geom.Sheet, ref string) (int, geom.Rect) {
	for i, g := range pages {
		for _, s := range g.Symbols {
			if s.Ref == ref {
				return i, s.Box
			}
		}
	}
	return -1, geom.Rect{}
}

// inFrameOf says whether box's centre lies inside the frame holding ref.
func inFrameOf(g *geom.Sheet, box geom.Rect, ref string) bool {
	c := geom.Pt{X: (box.X0 + box.X1) / 2, Y: (box.Y0 + box.Y1) / 2}
	for _, f := range g.Frames {
		if slices.Contains(f.Parts, ref) && f.Box.Contains(c) {
			return true
		}
	}
	return false
}

// centreGap is the distance between two boxes' centres.
func centreGap(a, b geom.Rect) float64 {
	return math.Hypot((a.X0+a.X1-b.X0-b.X1)/2, (a.Y0+a.Y1-b.Y0-b.Y1)/2)
}
