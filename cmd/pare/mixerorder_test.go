package main

import (
	"fmt"
	"path/filepath"
	"strings"
	"testing"

	"pare/render"
	"pare/render/check"
	"pare/render/geom"
)

// mixerSheets are the frequency changers: the examples that hold one, the
// oscillator fixtures' mixers (self-oscillating valve and transistor
// converters, heptode with reaction), the stage fixtures' converters and
// the first sheets review's triode-heptode with a separate oscillator
// (c03) and five-valve superhet (c10), and the second review's sets with a
// frequency changer (testdata/review13).
func mixerSheets(t *testing.T) []string {
	t.Helper()
	files := []string{
		"../../examples/club-receiver.toml",
		"../../examples/frequency-changer.toml",
		"../../examples/transistor-front-end.toml",
		"../../testdata/review12/c03.toml",
		"../../testdata/review12/c10.toml",
		"../../testdata/review13/a01.toml", "../../testdata/review13/a02.toml", "../../testdata/review13/b02.toml", "../../testdata/review13/b05.toml",
	}
	for _, g := range []string{"../../testdata/osc/mixer-*.toml", "../../rules/stages/testdata/converter-*.toml"} {
		more, err := filepath.Glob(g)
		if err != nil || len(more) == 0 {
			t.Fatalf("no fixtures %s: %v", g, err)
		}
		files = append(files, more...)
	}
	return files
}

// TestMixerFramesInOrder: a frequency changer reads as the trade draws it
// (common practice, ../shared/DRAWING-NOTES.md): the mixer in the middle,
// the IF transformer on its right, the oscillator coil below it
// (render/check's MixerOrder). The reduced sheets, where the stage
// templates place the stage, must have no finding and no more crossings
// inside their mixer frames than mixerCrossCeiling; the faded ones (the
// generic placement of the whole circuit) are logged.
func TestMixerFramesInOrder(t *testing.T) {
	files := mixerSheets(t)
	warmSheets(files, "A3")
	var found, crossings, reduced int
	for _, f := range files {
		for _, v := range []render.View{render.Reduced, render.Faded} {
			// the whole sheet in both symbol styles and its A3 pages
			// (IEC), as `pare FILE -o DIR` cuts a sheet too big for one
			var sheets []*geom.Sheet
			var names []string
			for _, st := range bothStyles {
				sheets = append(sheets, cachedSheet(t, f, v, st).g)
				names = append(names, st.String())
			}
			pages, err := cachedPages(f, v, "A3")
			if err != nil {
				t.Fatal(err)
			}
			for i, g := range pages {
				sheets = append(sheets, g)
				names = append(names, fmt.Sprintf("A3 page %d", i+1))
			}
			for i, g := range sheets {
				r := measured(g)
				where := fmt.Sprintf("%s %s %s", filepath.Base(f), v, names[i])
				for _, p := range r.MixerOrder {
					if v == render.Reduced {
						t.Errorf("%s: %s", where, p)
					} else {
						t.Logf("%s: %s", where, p)
					}
					found++
				}
				n := mixerCrossings(t, where, g, r)
				crossings += n
				if v == render.Reduced {
					reduced += n
				}
			}
		}
	}
	t.Logf("mixers out of order: %d; crossings inside mixer frames: %d, %d of them on the reduced views (ceiling %d)", found, crossings, reduced, mixerCrossCeiling)
	if reduced > mixerCrossCeiling {
		t.Errorf("%d crossings inside the mixer frames of the reduced views, more than %d; the log lists them", reduced, mixerCrossCeiling)
	}
}

// mixerCrossCeiling bounds the crossings inside the mixer frames of the
// mixer sheets' reduced views (whole sheets in both symbol styles and
// their A3 pages): a ratchet, lowered as the drawing improves, never
// raised.
const mixerCrossCeiling = 23 // 25 → 23 with rail tags beside their bars kept a grid line clear

// mixerCrossings logs and counts the crossings inside g's mixer frames.
func mixerCrossings(t *testing.T, where string, g *geom.Sheet, r *check.Report) int {
	n := 0
	for i, c := range r.FrameCrossings {
		title := g.Frames[i].Title.Lines
		if len(title) > 0 && strings.Contains(strings.ToLower(title[0]), "mixer") && c > 0 {
			t.Logf("%s: %d crossing(s) in %q", where, c, title[0])
			n += c
		}
	}
	return n
}
