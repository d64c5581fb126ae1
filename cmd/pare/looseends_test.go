package main

import (
	"testing"

	"pare/render/geom"
)

// looseEndsCeiling bounds TestNoLooseEnds: pins alone on their net with
// nothing drawn at them (render/check's LooseEnds) and parts drawn twice on
// one page, over the A3 pages of the reduced and faded views of every
// example, gallery fixture and blind-review circuit (review13 … review21).
// Measured when the checker learned them: 3 loose ends, review21 b05's
// oscillator coil T2 on the reduced view (its LW extension winding's end on
// the band switch's open contact) and the mains primary of
// rules/stages/testdata/supply-filters (captured with no mains entry: its
// two ends go nowhere in the netlist too), and no part drawn twice; with a
// transformer's idle winding (one end open, no current) left off the
// reduced sheet (cmd/internal/pipeline/idlewinding.go): 2 and 0.
//
// facing counts earth symbols whose bars face another net's wire less than
// a grid step on (render/check's EarthsFacing: the wire reads as chassis;
// review21 b05's earth over the aerial tank's hot junction), on the same
// pages: measured when the checker learned it, 36. With an earth kept from
// facing the lane out of a pin whose net has a capacitor to chassis
// (render/layout/earthlane.go: review21 b05's ferrite rod earth off the
// aerial tank's hot junction on the reduced page, and S1c's earth off C7's
// wire on the faded page 2): 34.
var looseEndsCeiling = struct{ loose, twice, facing int }{2, 0, 34}

// TestNoLooseEnds: a lead that ends in the air reads as a wire left off the
// drawing, an earth in front of a wire earths it to the eye, and one part drawn as two symbols on a page (a transformer's
// windings apart with no mark saying so) as two parts: a repair note's
// sheet has neither (common practice). Every finding is logged.
func TestNoLooseEnds(t *testing.T) {
	files := append(readSheets(t), reviewCircuitsFrom(t, "review13", "review14", "review15", "review16", "review17", "review18", "review19", "review20", "review21")...)
	warmSheets(files, "A3")
	loose, twice, facing := 0, 0, 0
	for _, f := range files {
		for _, v := range galleryViews {
			pages, err := cachedPages(f, v, "A3")
			if err != nil {
				t.Fatal(err)
			}
			for i, g := range pages {
				for _, p := range measured(g).LooseEnds {
					loose++
					t.Logf("%s: %s", pageName(f, v, i), p)
				}
				for _, p := range measured(g).EarthsFacing {
					facing++
					t.Logf("%s: %s", pageName(f, v, i), p)
				}
				for _, ref := range drawnTwice(g) {
					twice++
					t.Logf("%s: %s drawn twice", pageName(f, v, i), ref)
				}
			}
		}
	}
	t.Logf("loose ends: %d (ceiling %d); parts drawn twice on a page: %d (ceiling %d)", loose, looseEndsCeiling.loose, twice, looseEndsCeiling.twice)
	t.Logf("earth symbols facing another net's wire: %d (ceiling %d)", facing, looseEndsCeiling.facing)
	if facing > looseEndsCeiling.facing {
		t.Errorf("more earth symbols facing another net's wire (%d, ceiling %d); the log lists them", facing, looseEndsCeiling.facing)
	}
	if loose > looseEndsCeiling.loose || twice > looseEndsCeiling.twice {
		t.Errorf("more loose ends (%d, ceiling %d) or parts drawn twice (%d, ceiling %d); the log lists them",
			loose, looseEndsCeiling.loose, twice, looseEndsCeiling.twice)
	}
}

// drawnTwice lists the parts with more than one symbol on the sheet (the
// sheet's own flags and connectors have no part kind and may repeat).
func drawnTwice(g *geom.Sheet) []string {
	seen := map[string]int{}
	var out []string
	for _, s := range g.Symbols {
		if s.Kind == "" {
			continue
		}
		if seen[s.Ref]++; seen[s.Ref] == 2 {
			out = append(out, s.Ref)
		}
	}
	return out
}
