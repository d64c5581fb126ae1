package main

import (
	"context"
	"encoding/xml"
	"errors"
	"fmt"
	"image"
	"image/png"
	"io"
	"math"
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
	"time"

	"pare/internal/reftool"
)

// findChromium returns the browser (Debian package chromium), or skips
// (fails when the tools are required, as in CI).
func findChromium(t *testing.T) string {
	t.Helper()
	return reftool.Find(t, reftool.Chromium)
}

// TestSheetsInBrowser draws every example's sheets in headless Chromium and
// checks the screenshot shows the drawing: a browser is what a reader opens
// the sheets and the note in, and it rejects SVG that a lenient converter
// would still draw (a missing namespace shows as an XML tree, or nothing).
func TestSheetsInBrowser(t *testing.T) {
	t.Parallel() // files and runs of its own only (sheetcache_test.go)
	browser := findChromium(t)
	for _, ex := range examples(t) {
		name := strings.TrimSuffix(filepath.Base(ex), ".toml")
		t.Run(name, func(t *testing.T) {
			r := cachedJob(t, ex)
			if r.code == exitBad {
				t.Fatalf("main job failed: %s", r.stderr)
			}
			for _, sheet := range packFiles(t, r.dir) {
				if !strings.HasSuffix(sheet, ".svg") {
					continue // a view on pages is every page of it
				}
				svgPath, err := filepath.Abs(filepath.Join(r.dir, sheet))
				if err != nil {
					t.Fatal(err)
				}
				for _, p := range judgeInBrowser(t, browser, svgPath, svgPath) {
					t.Errorf("%s: %s", sheet, p)
				}
			}
		})
	}
}

// The least ink and dark fractions of a sheet that shows a drawing, read
// from librsvg's rendering at the sheet's own size (common practice for
// "something is drawn"; the examples' sheets give 1.8–3.4 % ink and
// 0.5–1.7 % dark pixels, the least on the whole set's faded sheet, whose
// parts off the signal path are grey by design).
const (
	minInk  = 0.010
	minDark = 0.0025
)

// The least share of librsvg's ink and dark pixels the browser's
// screenshot must show: the two antialias differently (measured 0.97–1.07 on
// the examples), and a sheet the browser does not draw gives none.
const minOfReference = 0.5

// maxShot is the widest screenshot taken: up to it a sheet is shot at its
// own size, where its thinnest strokes (1.5 units) stay wider than a pixel
// and dark; scaled further down they turn grey or vanish, and the dark
// fraction would judge the scaling, not the sheet. Chromium shoots the
// 9420-unit faded sheet of the whole set in one piece.
const maxShot = 12000

// judgeInBrowser shoots the SVG at svgPath (absolute) in the browser, the
// way the note embeds it, and returns what is wrong with the screenshot,
// judged against librsvg's rendering of refPath (the sheet as meant) at the
// same pixel size: the reference must show a drawing, and the browser must
// show about as much of it.
func judgeInBrowser(t *testing.T, browser, svgPath, refPath string) []string {
	t.Helper()
	w, h := checkWellFormed(t, refPath)
	scale := math.Min(1, maxShot/math.Max(w, h))
	pw, ph := int(math.Ceil(w*scale)), int(math.Ceil(h*scale))
	work := t.TempDir()
	// The sheet goes into the page as an image: a browser draws an SVG
	// image only when it is a proper SVG document (namespace, size), where
	// loading the file directly would still show an XML tree.
	page := imagePage(t, work, svgPath)
	shot := filepath.Join(work, "shot.png")
	screenshot(t, browser, page, shot, pw, ph)
	ref := filepath.Join(work, "ref.png")
	rsvgPNG(t, refPath, ref, pw)
	ink, dark := inkOf(t, shot)
	refInk, refDark := inkOf(t, ref)
	t.Logf("%s: %.0f×%.0f shot at %d×%d: %.2f%% ink, %.2f%% dark (librsvg %.2f%%, %.2f%%)",
		filepath.Base(svgPath), w, h, pw, ph, 100*ink, 100*dark, 100*refInk, 100*refDark)
	var problems []string
	if refInk < minInk || refDark < minDark {
		problems = append(problems, fmt.Sprintf("the sheet draws only %.2f%% ink, %.2f%% dark pixels: blank sheet?", 100*refInk, 100*refDark))
	}
	if ink < minOfReference*refInk || dark < minOfReference*refDark {
		problems = append(problems, fmt.Sprintf("the browser shows %.2f%% ink, %.2f%% dark pixels of the sheet's %.2f%%, %.2f%%: not drawn as an image?",
			100*ink, 100*dark, 100*refInk, 100*refDark))
	}
	return problems
}

// rsvgPNG renders the SVG with librsvg, width px wide on white, into png.
func rsvgPNG(t *testing.T, svg, png string, width int) {
	t.Helper()
	rsvg := reftool.Find(t, reftool.Rsvg)
	out, err := exec.Command(rsvg, "-b", "white", "-w", strconv.Itoa(width), "-a", "-o", png, svg).CombinedOutput()
	if err != nil {
		t.Fatalf("rsvg-convert %s: %v\n%s", svg, err, out)
	}
}

// TestBrowserCheckCatchesBrokenSheet shows the browser check can fail: the
// same sheet without its SVG namespace is not drawn as an image at all, and
// a sheet with nothing drawn on it shows nothing to either renderer.
func TestBrowserCheckCatchesBrokenSheet(t *testing.T) {
	t.Parallel() // files and runs of its own only (sheetcache_test.go)
	browser := findChromium(t)
	r := cachedJob(t, redExample)
	if r.code == exitBad {
		t.Fatalf("main job failed: %s", r.stderr)
	}
	good, err := filepath.Abs(filepath.Join(r.dir, fileReducedSheet))
	if err != nil {
		t.Fatal(err)
	}
	svg := readString(t, good)
	broken := strings.Replace(svg, ` xmlns="http://www.w3.org/2000/svg"`, "", 1)
	if broken == svg {
		t.Fatal("the sheet has no SVG namespace to take away")
	}
	w, h := checkWellFormed(t, good)
	blank := fmt.Sprintf(`<svg xmlns="http://www.w3.org/2000/svg" width="%.2f" height="%.2f">`+
		`<rect width="100%%" height="100%%" fill="#fff"/></svg>`, w, h)
	tests := []struct {
		name, svg   string
		againstGood bool // judged against the good sheet's rendering
	}{
		{"no namespace", broken, true},
		{"blank", blank, false},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			path := filepath.Join(t.TempDir(), "sheet.svg")
			if err := os.WriteFile(path, []byte(tc.svg), 0o644); err != nil {
				t.Fatal(err)
			}
			ref := path
			if tc.againstGood {
				ref = good
			}
			if p := judgeInBrowser(t, browser, path, ref); len(p) == 0 {
				t.Errorf("the %s sheet passed the check", tc.name)
			} else {
				t.Logf("caught: %s", p)
			}
		})
	}
}

// imagePage writes a page into dir that shows the SVG at svgPath (absolute)
// as an image across the window's width, and returns the page's path.
func imagePage(t *testing.T, dir, svgPath string) string {
	t.Helper()
	page := filepath.Join(dir, "page.html")
	html := `<!DOCTYPE html><html><body style="margin:0;background:#fff">` +
		`<img style="display:block;width:100vw" src="file://` + svgPath + `"></body></html>`
	if err := os.WriteFile(page, []byte(html), 0o644); err != nil {
		t.Fatal(err)
	}
	return page
}

// checkWellFormed parses the sheet as XML with an svg root in the SVG
// namespace, so a failure here says what is wrong before the browser does,
// and returns the sheet's size from the root's width and height.
func checkWellFormed(t *testing.T, path string) (w, h float64) {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	d := xml.NewDecoder(f)
	root := true
	for {
		tok, err := d.Token()
		if errors.Is(err, io.EOF) {
			break
		}
		if err != nil {
			t.Fatalf("%s is not well-formed XML: %v", path, err)
		}
		if se, ok := tok.(xml.StartElement); ok && root {
			root = false
			if se.Name.Local != "svg" || se.Name.Space != "http://www.w3.org/2000/svg" {
				t.Fatalf("%s: root element is {%s}%s, want an svg element in the SVG namespace", path, se.Name.Space, se.Name.Local)
			}
			for _, a := range se.Attr {
				v, err := strconv.ParseFloat(strings.TrimSuffix(strings.TrimSuffix(a.Value, "px"), "mm"), 64)
				if strings.HasSuffix(a.Value, "mm") {
					v *= 96 / 25.4 // a page on paper: CSS pixels, 96 to the inch (CSS Values and Units)
				}
				switch {
				case a.Name.Local == "width" && err == nil:
					w = v
				case a.Name.Local == "height" && err == nil:
					h = v
				}
			}
		}
	}
	if root {
		t.Fatalf("%s has no root element", path)
	}
	if w <= 0 || h <= 0 {
		t.Fatalf("%s: the svg root has no usable width and height (%v × %v): a browser would pick a size of its own", path, w, h)
	}
	return w, h
}

// screenshot loads a page in headless Chromium (flags as in
// docs/references.md §15) with a fresh profile, removed afterwards, and a
// time limit so a hung browser cannot hang the test run.
func screenshot(t *testing.T, browser, page, png string, w, h int) {
	t.Helper()
	abs, err := filepath.Abs(page)
	if err != nil {
		t.Fatal(err)
	}
	size := fmt.Sprintf("--window-size=%d,%d", w, h)
	profile, err := os.MkdirTemp("", "pare-chromium-")
	if err != nil {
		t.Fatal(err)
	}
	defer os.RemoveAll(profile)
	ctx, cancel := context.WithTimeout(context.Background(), 60*time.Second)
	defer cancel()
	cmd := exec.CommandContext(ctx, browser,
		"--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
		"--disable-background-networking", "--disable-component-update", "--disable-sync",
		"--hide-scrollbars", "--log-level=3",
		"--user-data-dir="+profile, size,
		"--screenshot="+png, "file://"+abs)
	cmd.WaitDelay = 5 * time.Second // the browser's helpers may hold the pipes open
	out, err := cmd.CombinedOutput()
	if ctx.Err() != nil {
		t.Fatalf("chromium did not finish within the time limit on %s", page)
	}
	if err != nil {
		t.Fatalf("chromium failed on %s: %v\n%s", page, err, out)
	}
	// A page that fails to load still exits 0 and writes nothing.
	if _, err := os.Stat(png); err != nil {
		t.Fatalf("chromium wrote no screenshot of %s:\n%s", page, out)
	}
}

// inkOf returns the fractions of pixels that are not white and that are
// dark (all channels below 40 % of full scale).
func inkOf(t *testing.T, path string) (float64, float64) {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	img, err := png.Decode(f)
	if err != nil {
		t.Fatalf("%s: %v", path, err)
	}
	return countInk(img)
}

func countInk(img image.Image) (float64, float64) {
	b := img.Bounds()
	ink, dark := 0, 0
	for y := b.Min.Y; y < b.Max.Y; y++ {
		for x := b.Min.X; x < b.Max.X; x++ {
			r, g, bl, _ := img.At(x, y).RGBA()
			if r < 0xf000 || g < 0xf000 || bl < 0xf000 {
				ink++
			}
			if r < 0x6666 && g < 0x6666 && bl < 0x6666 {
				dark++
			}
		}
	}
	total := b.Dx() * b.Dy()
	if total == 0 {
		return 0, 0
	}
	return float64(ink) / float64(total), float64(dark) / float64(total)
}

// countInk itself, on images whose answer is known by construction.
func TestCountInk(t *testing.T) {
	white := image.NewGray(image.Rect(0, 0, 10, 10))
	for i := range white.Pix {
		white.Pix[i] = 0xff
	}
	if ink, dark := countInk(white); ink != 0 || dark != 0 {
		t.Errorf("white image: ink %v, dark %v; want 0, 0", ink, dark)
	}
	// A 5×2 black bar on a 10×10 white image: 10 of 100 pixels.
	for y := 0; y < 2; y++ {
		for x := 0; x < 5; x++ {
			white.Pix[y*white.Stride+x] = 0
		}
	}
	// One light grey pixel counts as ink but not as dark.
	white.Pix[9*white.Stride+9] = 0xc0
	if ink, dark := countInk(white); ink != 0.11 || dark != 0.10 {
		t.Errorf("bar image: ink %v, dark %v; want 0.11, 0.10", ink, dark)
	}
}
