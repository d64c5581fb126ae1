package main

import (
	"path/filepath"
	"testing"

	"pare/render"
)

// TestFixtureSheetsCheck lays out every gallery fixture in every view and
// both symbol styles (the IEEE 315 set changes shapes, and the reduced view
// adds static grid stubs and gang links) and measures it with the sheet
// checker: overlaps, wires through symbols, broken nets, bad junctions.
// A reduced sheet must have none; on the full and faded views (one layout,
// render/layout/fade.go, which some fixtures still fail in either style: they are logged)
// the IEEE style must add no problem the IEC one does not have, and the
// IEC ones are logged. TestDrawExamplesCheck does this for the examples.
func TestFixtureSheetsCheck(t *testing.T) {
	files := galleryFixtures(t)
	type finding struct{ file, what string }
	found := make([][]finding, len(files))
	logged := make([][]finding, len(files))
	eachAtOnce(len(files), func(i int) {
		f := files[i]
		for _, v := range drawViews {
			iec := map[string]bool{}
			for _, st := range bothStyles {
				s, err := laidOut(f, v, st) // shared with the other layout checks (sheetcache_test.go)
				if err != nil {
					found[i] = append(found[i], finding{f, err.Error()})
					continue
				}
				for _, p := range s.report.Problems() {
					switch {
					case st == render.IEC && v != render.Reduced:
						iec[p] = true
						logged[i] = append(logged[i], finding{f, v.String() + ": " + p})
					case st == render.IEEE && iec[p]:
					default:
						found[i] = append(found[i], finding{f, v.String() + " " + st.String() + ": " + p})
					}
				}
			}
		}
	})
	for _, fs := range logged {
		for _, x := range fs {
			t.Logf("%s: %s", filepath.Base(x.file), x.what)
		}
	}
	for _, fs := range found {
		for _, x := range fs {
			t.Errorf("%s: %s", filepath.Base(x.file), x.what)
		}
	}
}
