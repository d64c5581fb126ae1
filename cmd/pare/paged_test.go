package main

import (
	"fmt"
	"os"
	"path/filepath"
	"regexp"
	"sort"
	"strconv"
	"strings"
	"testing"

	"pare/cmd/internal/pipeline"
	"pare/render"
	"pare/render/check"
	"pare/render/geom"
	"pare/rules"
)

// pagedSources are the circuits every paged check runs on: the examples and
// the gallery's fixtures.
func pagedSources(t *testing.T) []string { return readSheets(t) }

// TestPagedSheetsCheck cuts every example and fixture onto A3 (the paper
// --page auto flows a sheet onto) and A4 and checks every page as a sheet
// of its own (no overlap, wire through a symbol, label overlap, frame cut,
// broken net, or text printing under 2.5 mm at the page's scale, IEC
// 61082-1) and every view's off-row connectors as pairs. A fixture whose
// one long sheet has findings already (some faded views of the fixtures;
// TestDrawExamplesCheck holds only the examples to none) has its pages'
// other findings logged, not failed: cutting cannot be blamed for them.
// On A4 small text is logged: a stage frame wider or taller than A4 holds
// at 2.5 mm (a whole frequency changer, a supply with its mains switch) is
// never cut through, so its page is drawn smaller; A3 holds every stage of
// the examples and fixtures.
func TestPagedSheetsCheck(t *testing.T) {
	warmSheets(pagedSources(t), "A3")
	warmSheets(pagedSources(t), "A4")
	for _, paper := range []string{"A3", "A4"} {
		for _, f := range pagedSources(t) {
			for _, v := range galleryViews {
				checkPages(t, f, v, paper)
			}
		}
	}
}

// checkPages is TestPagedSheetsCheck on one view of one file on one paper.
func checkPages(t *testing.T, f string, v render.View, paper string) {
	t.Helper()
	report, small := t.Errorf, t.Errorf
	if n := len(cachedSheet(t, f, v, render.IEC).report.Problems()); n > 0 {
		report = t.Logf
	}
	if paper != "A3" {
		small = t.Logf
	}
	pages, err := cachedPages(f, v, paper)
	if err != nil {
		t.Fatal(err)
	}
	for i, g := range pages {
		r := *measured(g) // a copy: the cached report is shared
		for _, p := range r.SmallText {
			small("%s %s on %s page %d: %s", filepath.Base(f), v, paper, i+1, p)
		}
		r.SmallText = nil
		for _, p := range r.Problems() {
			report("%s %s on %s page %d: %s", filepath.Base(f), v, paper, i+1, p)
		}
	}
	for _, p := range check.Connectors(pages) {
		t.Errorf("%s %s on %s: %s", filepath.Base(f), v, paper, p)
	}
}

var (
	svgSize  = regexp.MustCompile(`<svg width="([0-9.]+)mm" height="([0-9.]+)mm"\s+viewBox="0 0 ([0-9.]+) ([0-9.]+)"`)
	smallPx  = regexp.MustCompile(`\.sm\{font-size:([0-9.]+)px\}`)
	sheetNOf = regexp.MustCompile(`sheet (\d+) of (\d+)`)
)

// smallTextMM is the height on paper of a paged SVG's smallest text: the
// small class's font size times the page's millimetres per SVG unit.
func smallTextMM(t *testing.T, svg []byte) float64 {
	t.Helper()
	m, s := svgSize.FindSubmatch(svg), smallPx.FindSubmatch(svg)
	if m == nil || s == nil {
		t.Fatalf("no page size or small text size in\n%.600s", svg)
	}
	wmm, _ := strconv.ParseFloat(string(m[1]), 64)
	vw, _ := strconv.ParseFloat(string(m[3]), 64)
	px, _ := strconv.ParseFloat(string(s[1]), 64)
	return px * wmm / vw
}

// TestPagedWrapsWhenItMust: a sheet wider than the page at legible text
// flows into rows and pages, each page at the paper's size with its title
// block numbered n of m; a sheet that fits stays one page drawn exactly as
// without a page. Text on paper is at least 2.5 mm (IEC 61082-1 minimum
// character height for drawings).
func TestPagedWrapsWhenItMust(t *testing.T) {
	cases := []struct {
		paper, file string
		view        render.View
		manyPages   bool
	}{
		// 2,210 units wide faded (examples/*.faded.svg): 221 grid units,
		// an A3 page holds 136 (400 mm at 2.94 mm a unit), A4 94; every
		// stage of these fits the paper at 2.5 mm text (the frequency
		// changer's two rows share one A3 page since its loose parts left
		// the mixer's row, so the whole set stands for it); the review-12
		// preamplifier is one row 2,640 wide, each stage narrower than
		// letter's 88 units
		{"A3", "../../examples/club-receiver.toml", render.Faded, true},
		{"A3", "../../examples/if-detector-audio.toml", render.Faded, true},
		{"letter", "../../testdata/review12/c09.toml", render.Reduced, true},
		// a 43-unit-wide stage fixture (docs/gallery): far narrower than A4
		{"A4", "../../rules/stages/testdata/incircuit-pair.toml", render.Reduced, false},
	}
	for _, tc := range cases {
		paper, err := render.ParsePaper(tc.paper)
		if err != nil {
			t.Fatal(err)
		}
		res := cachedResult(t, tc.file) // one pipeline run per file and test binary (sheetcache_test.go)
		s := res.Sheet(tc.view)
		pages, err := render.Config{Page: paper}.FprintPages(s)
		if err != nil {
			t.Fatal(err)
		}
		if got := len(pages) > 1; got != tc.manyPages {
			t.Errorf("%s on %s: %d pages", tc.file, tc.paper, len(pages))
		}
		for i, svg := range pages {
			// ISO 216 and ANSI sizes, landscape (render.Papers)
			m := svgSize.FindSubmatch(svg)
			if want := fmt.Sprintf("%.2f %.2f", paper.W, paper.H); m == nil || string(m[1])+" "+string(m[2]) != want {
				t.Errorf("%s page %d: not %s mm", tc.file, i+1, want)
			}
			if mm := smallTextMM(t, svg); mm < render.MinTextMM-1e-9 {
				t.Errorf("%s page %d: text %.2f mm on %s, want at least %g", tc.file, i+1, mm, tc.paper, render.MinTextMM)
			}
			n := sheetNOf.FindSubmatch(svg)
			if n == nil || string(n[1]) != strconv.Itoa(i+1) || string(n[2]) != strconv.Itoa(len(pages)) {
				t.Errorf("%s page %d: title block says %q", tc.file, i+1, n)
			}
		}
		if tc.manyPages {
			continue
		}
		one, _ := render.Config{Page: paper}.Geometries(s)
		flat, _ := render.Config{}.Geometry(s)
		moved := flat.Moved(geom.Pt{X: -flat.Bounds.X0, Y: -flat.Bounds.Y0}) // a page puts the drawing at its corner
		if fmt.Sprint(one[0].Symbols) != fmt.Sprint(moved.Symbols) || fmt.Sprint(one[0].Wires) != fmt.Sprint(moved.Wires) {
			t.Errorf("%s: a sheet that fits the page is drawn differently on it", tc.file)
		}
		if mm := smallTextMM(t, pages[0]); mm < render.MinTextMM-1e-9 {
			t.Errorf("%s: text %.2f mm on paper, want at least %g", tc.file, mm, render.MinTextMM)
		}
	}
}

// TestMainJobOnPaper: with --page the main job writes each view as
// numbered sheets, the notes name and embed every one of them, a rerun
// writes the same bytes, and a rerun on other paper (or none) replaces the
// pack whole, leaving no page of the earlier run behind.
func TestMainJobOnPaper(t *testing.T) {
	ex := "../../examples/frequency-changer.toml"
	dir := filepath.Join(t.TempDir(), "fc.pare")
	job := func(page string) map[string][]byte {
		t.Helper()
		if code, _, errs := runJob(t, ex, "--no-verify", "--page", page, "-o", dir); code != exitOK {
			t.Fatalf("--page %s: exit %d: %s", page, code, errs)
		}
		files := map[string][]byte{}
		names, _ := filepath.Glob(filepath.Join(dir, "*"))
		for _, n := range names {
			files[filepath.Base(n)], _ = os.ReadFile(n)
		}
		return files
	}
	a4 := job("A4")
	if a4[fileReducedSheet] != nil || a4["reduced-1.svg"] == nil || a4["reduced-2.svg"] == nil || a4["faded-1.svg"] == nil {
		t.Fatalf("A4 pack holds %v", keys(a4))
	}
	md, page := string(a4[fileNote]), string(a4[fileNoteHTML])
	for name := range a4 {
		if !strings.HasSuffix(name, ".svg") {
			continue
		}
		if !strings.Contains(md, "]("+name+")") {
			t.Errorf("notes.md does not embed %s", name)
		}
	}
	if !strings.Contains(page, `id="n-reduced"`) || !strings.Contains(page, `id="n-reduced-p2"`) {
		t.Errorf("notes.html does not hold the reduced sheets as n-reduced, n-reduced-p2, ...")
	}
	again := job("A4")
	for name, data := range a4 {
		if string(again[name]) != string(data) {
			t.Errorf("%s differs on a rerun", name)
		}
	}
	a3 := job("A3")
	if len(a3) >= len(a4) {
		t.Errorf("A3 pack has %d files, A4 %d: a larger page should take fewer sheets", len(a3), len(a4))
	}
	flat := job("none")
	if got := keys(flat); strings.Join(got, " ") != strings.Join(sortedCopy(resultFiles), " ") {
		t.Errorf("--page none pack holds %v, want %v", got, sortedCopy(resultFiles))
	}
}

// TestPageBadInput: an unknown paper is a usage error (exit 2) naming the
// choices, before any work; pare draw on paper writes OUT-1.svg ... and
// refuses standard output for a drawing of several pages.
func TestPageBadInput(t *testing.T) {
	ex := "../../examples/frequency-changer.toml"
	code, _, errs := runJob(t, ex, "--page", "B5", "-o", filepath.Join(t.TempDir(), "x"))
	if code != exitBad || !strings.Contains(errs, "A4, A3, letter or none") {
		t.Errorf("run --page B5: exit %d, %q", code, errs)
	}
	code, _, errs = runJob(t, "draw", ex, "--page", "A4", "-o", "-")
	if code != exitBad || !strings.Contains(errs, "pages: give -o FILE.svg") {
		t.Errorf("draw --page A4 -o -: exit %d, %q", code, errs)
	}
	out := filepath.Join(t.TempDir(), "fc.svg")
	if code, _, errs = runJob(t, "draw", ex, "--page", "A4", "-o", out); code != exitOK {
		t.Fatalf("draw --page A4: exit %d: %s", code, errs)
	}
	got, _ := filepath.Glob(strings.TrimSuffix(out, ".svg") + "*")
	if len(got) < 2 || filepath.Base(got[0]) != "fc-1.svg" {
		t.Errorf("draw --page A4 wrote %v", got)
	}
}

func keys(m map[string][]byte) []string {
	var out []string
	for k := range m {
		out = append(out, k)
	}
	return sortedCopy(out)
}

func sortedCopy(s []string) []string {
	out := append([]string(nil), s...)
	sort.Strings(out)
	return out
}

// TestAutoPagesPrintLegibly: the sheets a blind review found printed as
// one row far wider than a page (review 12: a frequency changer 2,360
// units wide, an IF strip with detector and AGC, a transistor preamplifier
// with tone control) come out of the default (--page auto) as rows on A3
// pages, each page's smallest text at least 2.5 mm on paper (IEC 61082-1),
// with their stages whole. The transistor IF strip's (c04) reduced view
// is held too: its first stage was wider than A3 at that scale until its
// tank capacitors stood beside their windings.
func TestAutoPagesPrintLegibly(t *testing.T) {
	a3, _ := render.ParsePaper("A3")
	cases := []struct {
		file  string
		views []render.View
	}{
		{"c03", []render.View{render.Reduced, render.Faded}},
		{"c04", []render.View{render.Reduced, render.Faded}},
		{"c05", []render.View{render.Reduced, render.Faded}},
		{"c09", []render.View{render.Reduced, render.Faded}},
	}
	for _, tc := range cases {
		file := filepath.Join("../../testdata/review12", tc.file+".toml")
		res, err := pipeline.Run(pipeline.Options{Path: file, Level: rules.LevelSignal, Views: tc.views, Fit: a3})
		if err != nil {
			t.Fatal(err)
		}
		for _, v := range tc.views {
			sh := res.SheetFor(v)
			if sh.Paper == nil {
				t.Errorf("%s %s: one sheet, want rows on A3", tc.file, v)
				continue
			}
			for i, svg := range sh.Pages {
				if mm := smallTextMM(t, svg); mm < render.MinTextMM-1e-9 {
					t.Errorf("%s %s page %d: text %.2f mm, want at least %g", tc.file, v, i+1, mm, render.MinTextMM)
				}
			}
		}
	}
}

// TestSmallTextNote: a page drawn smaller than its paper's scale (the
// frequency changer's mixer frame, about 105 grid units wide, on A4's 94)
// is still written, on a page of its own, and pare says on standard error
// which page prints its text under 2.5 mm, and only that page: the aerial
// circuit's row beside it keeps its 2.5 mm on a page of its own. A sheet
// whose pages all print at 2.5 mm (the review's frequency changer on the
// default A3) draws without a word.
func TestSmallTextNote(t *testing.T) {
	cases := []struct {
		file, page string
		note       bool
	}{
		{"../../examples/frequency-changer.toml", "A4", true},
		{"../../testdata/review12/c03.toml", "auto", false},
	}
	for _, tc := range cases {
		out := filepath.Join(t.TempDir(), "s.svg")
		code, _, errs := runJob(t, "draw", tc.file, "--page", tc.page, "-o", out)
		if code != exitOK {
			t.Fatalf("%s on %s: exit %d: %s", tc.file, tc.page, code, errs)
		}
		if got := strings.Contains(errs, "prints its text"); got != tc.note {
			t.Errorf("%s on %s: note %v, want %v: %q", tc.file, tc.page, got, tc.note, errs)
		}
		pages, _ := filepath.Glob(strings.TrimSuffix(out, ".svg") + "-*.svg")
		small := 0
		for _, p := range pages {
			if smallTextMM(t, readBytes(t, p)) < render.MinTextMM-1e-9 {
				small++
			}
		}
		if len(pages) == 0 || small == len(pages) || small != strings.Count(errs, "prints its text") {
			t.Errorf("%s on %s: %d of %d pages under %g mm, note %q", tc.file, tc.page, small, len(pages), render.MinTextMM, errs)
		}
	}
}
