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

	"pare/render"
	"pare/render/check"
	"pare/render/geom"
)

// pagedSources are the circuits every paged check runs on: the examples and
// the gallery's fixtures.
func pagedSources(t *testing.T) []string { return readSheets(t) }

// TestPagedSheetsCheck cuts every example and fixture onto A4 and checks
// every page as a sheet of its own (no overlap, wire through a symbol,
// label overlap, frame cut or broken net) and every view's off-row
// connectors as pairs. A fixture whose one long sheet has findings already
// (some faded views of the fixtures; TestDrawExamplesCheck holds only the
// examples to none) has its pages' findings logged, not failed: cutting
// cannot be blamed for them.
func TestPagedSheetsCheck(t *testing.T) {
	warmSheets(pagedSources(t), "A4")
	for _, f := range pagedSources(t) {
		for _, v := range galleryViews {
			report := t.Errorf
			if n := len(cachedSheet(t, f, v, render.IEC).report.Problems()); n > 0 {
				report = t.Logf
			}
			pages, err := cachedPages(f, v, "A4")
			if err != nil {
				t.Fatal(err)
			}
			for i, g := range pages {
				for _, p := range check.Measure(g).Problems() {
					report("%s %s page %d: %s", filepath.Base(f), v, i+1, p)
				}
			}
			for _, p := range check.Connectors(pages) {
				t.Errorf("%s %s: %s", filepath.Base(f), v, p)
			}
		}
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
		// 2,600 units wide reduced (examples/*.reduced.svg): 260 grid
		// units, an A4 page holds 94 (277 mm at 2.94 mm a unit)
		{"A4", "../../examples/frequency-changer.toml", render.Reduced, true},
		{"A3", "../../examples/if-detector-audio.toml", render.Faded, true},
		{"letter", "../../examples/transistor-front-end.toml", render.Reduced, true},
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
				t.Logf("%s page %d: text %.2f mm (a row wider than the page)", tc.file, i+1, mm)
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
