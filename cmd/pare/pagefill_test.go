package main

import (
	"path/filepath"
	"testing"

	"pare/render/geom"
)

// pageFillSources are the circuits the page-filling checks run on: the
// sources of TestPagedSheetsCheck (whose A3 pages they share through the
// cache) and the blind review's circuits (testdata/review12).
func pageFillSources(t *testing.T) []string {
	t.Helper()
	review, err := filepath.Glob("../../testdata/review12/*.toml")
	if err != nil || len(review) == 0 {
		t.Fatalf("no review circuits: %v", err)
	}
	return append(pagedSources(t), review...)
}

// TestPagesHoldAStageAndSocketsTheirParts: every page of every view cut
// onto A3 (the paper --page auto flows onto) holds at least one stage, and
// every socket stands on a page with a part wired to it. A page with no
// stage is a page of leftovers (the flagship's faded view gave its third
// A3 page to one wavechange wafer, a trimmer and a decoupler, behind five
// connectors, because heater bypasses and dial lamps the whole sheet had
// parked under the RF valve rode on its row and made it a third taller);
// a socket alone with off-row connectors was held to the stretch before it
// by x (the pick-up and extension speaker sockets stood after the
// smoothing filter, their leads through its frame to connectors back to
// the audio stages). Common practice on a printed service sheet: a sheet
// carries a stage, and a socket is drawn at the part it feeds.
func TestPagesHoldAStageAndSocketsTheirParts(t *testing.T) {
	files := pageFillSources(t)
	warmSheets(files, "A3")
	for _, f := range files {
		for _, v := range galleryViews {
			pages, err := cachedPages(f, v, "A3")
			if err != nil {
				t.Fatal(err)
			}
			if len(pages) < 2 {
				continue // one page holds what the sheet has, stage or not
			}
			for i, g := range pages {
				if len(g.Frames) == 0 {
					t.Errorf("%s %s on A3 page %d of %d: no stage on it", filepath.Base(f), v, i+1, len(pages))
				}
				for _, s := range strandedSockets(g) {
					t.Errorf("%s %s on A3 page %d: socket %s has no part wired to it on the page", filepath.Base(f), v, i+1, s)
				}
			}
		}
	}
}

// strandedSockets are the sockets (port symbols, not off-row connectors)
// of a page none of whose nets reaches a part on the page: only other
// sockets and off-row connectors share them. A socket on a rail (a supply
// or heater input) is drawn with the rail's tag, as every pin on that rail
// is: it stands wherever the sheet puts it.
func strandedSockets(g *geom.Sheet) []string {
	parts := map[string]bool{} // nets with a part's pin on them, or drawn as a rail
	for _, l := range g.Locals {
		if l.Kind == geom.LocalRail || l.Kind == geom.LocalGround {
			parts[l.Net] = true
		}
	}
	for _, s := range g.Symbols {
		if _, _, conn := geom.ConnectorOf(s.Ref); conn || s.Kind == "port" {
			continue
		}
		for _, p := range s.Pins {
			parts[p.Net] = true
		}
	}
	var out []string
	for _, s := range g.Symbols {
		if _, _, conn := geom.ConnectorOf(s.Ref); conn || s.Kind != "port" {
			continue
		}
		wired := false
		for _, p := range s.Pins {
			wired = wired || parts[p.Net]
		}
		if !wired {
			out = append(out, s.Ref)
		}
	}
	return out
}
