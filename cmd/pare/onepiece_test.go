package main

import (
	"path/filepath"
	"testing"

	"pare/cmd/internal/pipeline"
	"pare/graph"
	"pare/render"
	"pare/rules"
)

// reviewFile is a circuit of a blind review by its name ("a01" is
// testdata/review13/a01.toml, "c03" testdata/review12/c03.toml).
func reviewFile(name string) string {
	dir := "review13"
	if name[0] == 'c' {
		dir = "review12"
	}
	return filepath.Join("../../testdata", dir, name+".toml")
}

// TestSmallSetsInOnePiece: a circuit that can be drawn on one A3 page at
// 2.5 mm text (IEC 61082-1) comes out of the default (--page auto) as one
// sheet, in one piece, not as rows joined by off-row connectors; and the
// larger ones take no more pages than listed. The blind review (issue 12)
// had the Colpitts VFO (a01, 20 parts) and the RF stage (b02, 18 parts)
// faded on two rows: their supply sockets stood in a first column of
// their own, beside the input, and made the one sheet a tenth wider than
// the page. The six-transistor set's reduced view (b05) took four pages,
// the last holding an AGC decoupler and the output stage's emitter
// network cut off from the stages they serve. Common practice on a
// printed service sheet: a small circuit is drawn whole.
func TestSmallSetsInOnePiece(t *testing.T) {
	a3, _ := render.ParsePaper("A3")
	cases := []struct {
		file            string
		reduced, faded  int // most pages; 0: one sheet, in one piece
		whyReduced, why string
	}{
		{"a01", 0, 0, "20 parts", "20 parts"},
		{"b02", 0, 0, "18 parts", "18 parts"},
		{"c01", 0, 0, "15 parts", "15 parts"},
		{"c02", 0, 0, "17 parts", "17 parts"},
		{"c06", 0, 0, "12 parts", "12 parts"},
		{"b05", 4, 5, "83 parts: the driver and the push-pull pair framed as stages of their own need a page each", "83 parts"},
	}
	for _, tc := range cases {
		res, err := pipeline.Run(pipeline.Options{Path: reviewFile(tc.file), Level: rules.LevelSignal,
			Views: galleryViews, Fit: a3})
		if err != nil {
			t.Fatal(err)
		}
		for _, v := range galleryViews {
			want, why := tc.reduced, tc.whyReduced
			if v == render.Faded {
				want, why = tc.faded, tc.why
			}
			sh := res.SheetFor(v)
			switch {
			case want == 0 && sh.Paper != nil:
				t.Errorf("%s %s (%s): %d page(s) of rows on A3, want one sheet in one piece", tc.file, v, why, len(sh.Pages))
			case want > 0 && len(sh.Pages) > want:
				t.Errorf("%s %s (%s): %d pages on A3, want at most %d", tc.file, v, why, len(sh.Pages), want)
			}
		}
	}
}

// TestRailSocketsAtTheFoot: on every review circuit's faded view, drawn as
// one sheet, a socket none of whose pins is wired (a supply, heater or AGC
// line brought in, drawn with its rail's tag) stands under the parts of
// the first stages, none of them under it, not in a column of its own
// beside the input: there it was as wide as its name and pushed small
// sets past a page's width.
func TestRailSocketsAtTheFoot(t *testing.T) {
	var files []string
	for _, dir := range []string{"review13", "review12"} {
		fs, err := filepath.Glob(filepath.Join("../../testdata", dir, "*.toml"))
		if err != nil || len(fs) == 0 {
			t.Fatalf("no %s circuits: %v", dir, err)
		}
		files = append(files, fs...)
	}
	seen := 0
	for _, f := range files {
		res := cachedResult(t, f)
		sockets := map[string]bool{}
		for _, p := range res.Circuit.Parts {
			if p.Kind == graph.Port && railOnly(res.Circuit, p) {
				sockets[p.Ref] = true
			}
		}
		s, err := laidOut(f, render.Faded, render.IEC)
		if err != nil {
			t.Fatal(err)
		}
		for _, sym := range s.g.Symbols {
			if !sockets[sym.Ref] {
				continue
			}
			seen++
			above, below := 0, []string{}
			for _, o := range s.g.Symbols {
				if sockets[o.Ref] || o.Box.X1 <= sym.Box.X0 || o.Box.X0 >= sym.Box.X1 {
					continue
				}
				if o.Box.Y1 <= sym.Box.Y0 {
					above++
				} else {
					below = append(below, o.Ref)
				}
			}
			if above == 0 || len(below) > 0 {
				t.Errorf("%s faded: rail socket %s has %d part(s) above it and %v beside or under it, want it under the first stages", filepath.Base(f), sym.Ref, above, below)
			}
		}
	}
	if seen == 0 {
		t.Fatal("no rail socket drawn on any review circuit: the test checks nothing")
	}
}

// railOnly says whether every pin of a part is on a rail or chassis.
func railOnly(c *graph.Circuit, p *graph.Part) bool {
	for _, pn := range p.Pins {
		if !c.RoleOf(pn.Net).IsACGround() {
			return false
		}
	}
	return len(p.Pins) > 0
}

// TestBranchesOnTheirStagesPage: cut onto A3, a network hung on a stage's
// nets and on nothing after it stands on the same page as the parts it
// serves, not after every later stage with a connector back. The blind
// review found the Zobel network (R13, C6) on another sheet from the
// loudspeaker it is across (b04), and the AGC decoupler C9 on the set's
// last page fed by a connector from the first (b05); an anode load and an
// RC ladder stay with their valve or transistor (a03, b01). Common
// practice: a part is drawn with the stage it serves.
func TestBranchesOnTheirStagesPage(t *testing.T) {
	cases := []struct {
		file string
		view render.View
		refs []string
		why  string
	}{
		{"b04", render.Reduced, []string{"LS1", "R13", "C6"}, "Zobel across the loudspeaker"},
		{"b04", render.Reduced, []string{"C4", "R9", "R8", "C2"}, "bootstrapped load and its feed"},
		{"b05", render.Reduced, []string{"R6", "C9"}, "AGC feed (R5 ∥ R6, named by R6, the member carrying more current) and its decoupler"},
		{"b05", render.Reduced, []string{"Q4", "R17", "C19"}, "driver and its emitter network"},
		{"a03", render.Reduced, []string{"V2b", "R10"}, "triode and its anode load"},
		{"b01", render.Faded, []string{"Q1", "C1", "C2", "C3", "R7", "R8"}, "oscillator and its RC ladder"},
	}
	for _, tc := range cases {
		onOnePage(t, tc.file, tc.view, tc.refs, tc.why)
	}
}

// onOnePage fails unless every one of refs stands on the same A3 page as
// the first, in the review circuit's view.
func onOnePage(t *testing.T, file string, view render.View, refs []string, why string) {
	t.Helper()
	pages, err := cachedPages(reviewFile(file), view, "A3")
	if err != nil {
		t.Fatal(err)
	}
	pageOf := map[string]int{}
	for i, g := range pages {
		for _, s := range g.Symbols {
			pageOf[s.Ref] = i + 1
		}
	}
	first := refs[0]
	for _, r := range refs {
		switch {
		case pageOf[r] == 0:
			t.Errorf("%s %s: %s is on no page", file, view, r)
		case pageOf[r] != pageOf[first]:
			t.Errorf("%s %s (%s): %s on page %d, %s on page %d of %d", file, view, why, r, pageOf[r], first, pageOf[first], len(pages))
		}
	}
}
