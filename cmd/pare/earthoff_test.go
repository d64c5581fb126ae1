package main

import (
	"path/filepath"
	"testing"

	"pare/render"
)

// TestEarthOffMains: on a set with a mains transformer no earth, rail tag
// or flag sits on another net's wire, pin or junction dot (render/check's
// LocalsOn), in any view, either symbol style, or on A3 pages. The heater
// winding's earth once hung half a step over the live primary's junction
// (testdata/review14/a05.toml; the flagship's T9 the same), so the live
// primary read as tied to chassis; a protective-earth mark never touches a
// mains conductor on a drawing (common practice).
func TestEarthOffMains(t *testing.T) {
	for _, f := range []string{"../../testdata/review14/a05.toml", "../../examples/club-receiver.toml"} {
		for _, v := range drawViews {
			for _, st := range bothStyles {
				s, err := laidOut(f, v, st)
				if err != nil {
					t.Fatal(err)
				}
				for _, p := range s.report.LocalsOn {
					t.Errorf("%s %s %s: %s", filepath.Base(f), v, st, p)
				}
			}
		}
		pages, err := cachedPages(f, render.Faded, "A3")
		if err != nil {
			t.Fatal(err)
		}
		for i, g := range pages {
			for _, p := range measured(g).LocalsOn {
				t.Errorf("%s faded A3 page %d: %s", filepath.Base(f), i+1, p)
			}
		}
	}
}
