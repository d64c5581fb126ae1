package main

import (
	"bytes"
	"fmt"
	"os"
	"path/filepath"
	"runtime"
	"strings"
	"sync"
	"testing"

	"pare/cmd/internal/pipeline"
	"pare/internal/esc"
	"pare/internal/golden"
	"pare/render"
	"pare/rules"
)

// The gallery (docs/gallery.md) shows every sheet pare draws for the
// examples and for the fixtures written as circuits to read, so that a
// review of a change sees every drawing it changes. The examples' sheets are
// the committed ones under examples/ (TestDrawExampleSheets keeps them
// current); the fixtures' are drawn here into docs/gallery/.
const (
	galleryDoc   = "../../docs/gallery.md"
	galleryDir   = "../../docs/gallery"
	galleryRegen = "go test ./cmd/pare -run TestGallery -update"
)

// galleryFamilies are the fixture folders drawn, each under a short name
// for its files. Left out, as fixtures of a mechanism rather than circuits
// to read: graph/ac and graph/dc (solver and operating-point cases),
// testdata/warn (transcription warnings), testdata/fuzz (fuzzer seeds),
// rules/testdata, render/testdata and cmd/pare/testdata.
var galleryFamilies = []struct{ dir, short, head string }{
	{"../../testdata/good", "good", "Every part kind and the review circuits (testdata/good)"},
	{"../../testdata/osc", "osc", "Oscillators (testdata/osc)"},
	{"../../testdata/safety", "safety", "Sets for the caution (testdata/safety)"},
	{"../../rules/stages/testdata", "stages", "Stage fixtures (rules/stages/testdata)"},
}

var galleryViews = []render.View{render.Reduced, render.Faded}

// galleryItem is one circuit of the gallery and its sheets.
type galleryItem struct {
	src, name, title string
	files            []string // the sheets, relative to docs/
	svgs             [][]byte // drawn here (nil for the examples)
	err              error
}

// TestGallery draws every gallery sheet and compares it, and the gallery
// page, byte for byte with what is committed (regenerate with -update); a
// sheet file no circuit draws any more fails too, so the folder holds
// exactly the gallery.
func TestGallery(t *testing.T) {
	var items []*galleryItem
	for _, ex := range exampleFiles(t) {
		items = append(items, &galleryItem{src: ex})
	}
	for _, fam := range galleryFamilies {
		files, err := filepath.Glob(filepath.Join(fam.dir, "*.toml"))
		if err != nil || len(files) == 0 {
			t.Fatalf("no fixtures under %s", fam.dir)
		}
		for _, f := range files {
			items = append(items, &galleryItem{src: f, name: fam.short + "-" + strings.TrimSuffix(filepath.Base(f), ".toml")})
		}
	}
	drawGallery(items)
	want := map[string]bool{}
	for _, it := range items {
		if it.err != nil {
			t.Fatalf("%s: %v", it.src, it.err)
		}
		for i, svg := range it.svgs {
			checkXML(t, svg)
			path := filepath.Join("../../docs", it.files[i])
			want[filepath.Base(path)] = true
			golden.Check(t, path, svg, *updateSheets, "look at the PNG, then "+galleryRegen)
		}
	}
	golden.Check(t, galleryDoc, galleryPage(items), *updateSheets, galleryRegen)
	stale, _ := filepath.Glob(filepath.Join(galleryDir, "*"))
	for _, f := range stale {
		if want[filepath.Base(f)] {
			continue
		}
		if *updateSheets {
			os.Remove(f)
		} else {
			t.Errorf("%s is in no gallery entry: remove it (%s)", f, galleryRegen)
		}
	}
}

// drawGallery runs the pipeline on every item, as many at a time as there
// are cores, each to its sheets (the same bytes `pare draw` writes).
func drawGallery(items []*galleryItem) {
	var wg sync.WaitGroup
	slots := make(chan struct{}, runtime.GOMAXPROCS(0))
	for _, it := range items {
		wg.Add(1)
		go func() {
			defer wg.Done()
			slots <- struct{}{}
			defer func() { <-slots }()
			it.draw()
		}()
	}
	wg.Wait()
}

func (it *galleryItem) draw() {
	o := pipeline.Options{Path: it.src, Level: rules.LevelSignal, Style: render.IEC}
	if it.name != "" {
		o.Views = galleryViews
	} else {
		o.Until = pipeline.PhaseStages // an example: its title only; its sheets are committed
	}
	res, err := pipeline.Run(o)
	if err != nil {
		it.err = err
		return
	}
	it.title = res.Title
	for _, v := range galleryViews {
		if it.name == "" {
			it.files = append(it.files, "../examples/"+filepath.Base(sheetName(it.src, v)))
			continue
		}
		it.files = append(it.files, "gallery/"+it.name+"."+v.String()+".svg")
		it.svgs = append(it.svgs, res.SheetFor(v).SVG)
	}
}

// galleryPage is docs/gallery.md: a heading per family, a heading per
// circuit with its file, its sheets as images.
func galleryPage(items []*galleryItem) []byte {
	var b bytes.Buffer
	b.WriteString("# Gallery\n\n")
	b.WriteString("Every sheet pare draws for the examples and the fixtures, reduced and faded, so that a review of a change\n")
	b.WriteString("sees every drawing it changes. IEC 60617 symbols only (`--symbols ieee` draws the same layout with the\n")
	b.WriteString("IEEE 315 symbols). Fixtures of a mechanism rather than circuits to read are left out: the solver's and the\n")
	b.WriteString("DC point's (graph/ac, graph/dc), transcription warnings (testdata/warn), fuzzer seeds (testdata/fuzz),\n")
	b.WriteString("rules/testdata, render/testdata and cmd/pare/testdata.\n\n")
	fmt.Fprintf(&b, "Regenerated by `%s` (look at the changed sheets first); `go test ./cmd/pare`\nfails when a sheet here differs from what pare draws.\n\n", galleryRegen)
	head := ""
	for _, it := range items {
		h := "Examples (examples/)"
		for _, fam := range galleryFamilies {
			if strings.HasPrefix(it.name, fam.short+"-") {
				h = fam.head
			}
		}
		if h != head {
			head = h
			fmt.Fprintf(&b, "## %s\n\n", esc.Markdown(h))
		}
		src := strings.TrimPrefix(filepath.ToSlash(it.src), "../../")
		fmt.Fprintf(&b, "### %s\n\n`%s`\n\n", esc.Markdown(it.title), esc.MarkdownCode(src))
		for i, f := range it.files {
			fmt.Fprintf(&b, "![%s, %s view](%s)\n\n", esc.Markdown(it.title), galleryViews[i], f)
		}
	}
	return b.Bytes()
}
