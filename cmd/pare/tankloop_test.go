package main

import (
	"path/filepath"
	"testing"

	"pare/graph"
	"pare/render"
	"pare/render/geom"
)

// TestTanksWiredAsLoop: a tuned circuit whose coil has neither end at
// chassis (a Colpitts or Clapp tank across a divider whose centre is at
// chassis, a tank reaching both electrodes through capacitors) is drawn as
// one wired loop, coil and capacitors joined by wires (common practice;
// ../shared/DRAWING-NOTES.md: "a tuned circuit's L and C stand side by
// side ... joined at top and bottom"), never as net-name flags, and no
// flag on any of its sheets overlaps a symbol, another flag or an earth.
// The review circuit testdata/review14/a01.toml was drawn with seven
// overlapping "tank g"/"tank a" flags; review15's a01 still drew its tank
// as flags, one on the grid leak's lead, when its coil was written anode
// end first (the template's grid capacitor then stood in the leak's
// column); the fixtures of testdata/tanks are the class (Clapp, FET
// Colpitts, a tank between base and collector, a choke-fed collector with
// its coil written collector end first, the divider's centre on the
// cathode).
// tankReviews are the blind reviews' tank circuits the tank tests read
// beside testdata/tanks.
var tankReviews = []string{"../../testdata/review14/a01.toml", "../../testdata/review15/a01.toml"}

// tankFiles are testdata/tanks and tankReviews, their sheets drawn ahead
// (warmSheets) for the tank tests that read them.
func tankFiles(t *testing.T) []string {
	t.Helper()
	files, err := filepath.Glob("../../testdata/tanks/*.toml")
	if err != nil || len(files) == 0 {
		t.Fatalf("no tank fixtures: %v", err)
	}
	files = append(files, tankReviews...)
	warmSheets(files, "")
	return files
}

func TestTanksWiredAsLoop(t *testing.T) {
	files := tankFiles(t)
	for _, f := range files {
		c, err := graph.LoadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		coilNets := map[string]bool{}
		for _, p := range c.Parts {
			if p.Kind != graph.Inductor {
				continue
			}
			for _, pn := range p.Pins {
				if !c.RoleOf(pn.Net).IsACGround() {
					coilNets[pn.Net] = true
				}
			}
		}
		for _, v := range drawViews {
			s := cachedSheet(t, f, v, render.IEC)
			for _, l := range s.g.Locals {
				if l.Kind == geom.LocalFlag && coilNets[l.Net] {
					t.Errorf("%s %s: %s drawn as a flag at %s.%s", filepath.Base(f), v, l.Net, l.Owner, l.Pin)
				}
			}
			for _, p := range s.report.FarTanks {
				t.Errorf("%s %s: %s", filepath.Base(f), v, p)
			}
			for _, p := range s.report.SymbolOverlaps {
				t.Errorf("%s %s: %s", filepath.Base(f), v, p)
			}
		}
	}
}
