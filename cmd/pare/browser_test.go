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
// checks the screenshot shows a drawing: a browser is what a reader opens
// the sheets and the note in, and it rejects SVG that a lenient converter
// would still draw (a missing namespace shows as an XML tree, or nothing).
func TestSheetsInBrowser(t *testing.T) {
	browser := findChromium(t)
	for _, ex := range examples(t) {
		name := strings.TrimSuffix(filepath.Base(ex), ".toml")
		t.Run(name, func(t *testing.T) {
			r := cachedJob(t, ex)
			if r.code == exitBad {
				t.Fatalf("main job failed: %s", r.stderr)
			}
			dir := r.dir
			for _, sheet := range []string{fileReducedSheet, fileFadedSheet} {
				svgPath, err := filepath.Abs(filepath.Join(dir, sheet))
				if err != nil {
					t.Fatal(err)
				}
				w, h := checkWellFormed(t, svgPath)
				// The sheet goes into the page the way the note embeds it, as
				// an image: a browser draws an SVG image only when it is a
				// proper SVG document (namespace, size), where loading the
				// file directly would still show an XML tree.
				work := t.TempDir()
				page := imagePage(t, work, svgPath)
				shot := filepath.Join(work, "shot.png")
				screenshot(t, browser, page, shot, w, h)
				ink, dark := inkOf(t, shot)
				// Thresholds are common practice for "something is drawn",
				// with the window the size of the sheet: a schematic with its
				// frames and labels inks a few percent of it, and its lines
				// and text are dark. The examples' sheets give 2.3–3.3 % ink
				// and 1.0–1.5 % dark pixels.
				if ink < minInk {
					t.Errorf("%s: only %.2f%% of the screenshot is not white: blank sheet?", sheet, 100*ink)
				}
				if dark < minDark {
					t.Errorf("%s: %.2f%% dark pixels: no lines or text visible", sheet, 100*dark)
				}
				t.Logf("%s: %.0f×%.0f, %.1f%% ink, %.1f%% dark", sheet, w, h, 100*ink, 100*dark)
			}
		})
	}
}

// The least ink and dark fractions of a screenshot that shows a drawing.
const (
	minInk  = 0.015
	minDark = 0.005
)

// TestBrowserCheckCatchesBrokenSheet shows the browser check can fail: the
// same sheet without its SVG namespace is not drawn as an image at all.
func TestBrowserCheckCatchesBrokenSheet(t *testing.T) {
	browser := findChromium(t)
	exs := examples(t)
	r := cachedJob(t, exs[0])
	if r.code == exitBad {
		t.Fatalf("main job failed: %s", r.stderr)
	}
	svg := readString(t, filepath.Join(r.dir, fileReducedSheet))
	broken := strings.Replace(svg, ` xmlns="http://www.w3.org/2000/svg"`, "", 1)
	if broken == svg {
		t.Fatal("the sheet has no SVG namespace to take away")
	}
	work := t.TempDir()
	svgPath := filepath.Join(work, "broken.svg")
	if err := os.WriteFile(svgPath, []byte(broken), 0o644); err != nil {
		t.Fatal(err)
	}
	page := imagePage(t, work, svgPath)
	shot := filepath.Join(work, "shot.png")
	screenshot(t, browser, page, shot, 1200, 600)
	if ink, dark := inkOf(t, shot); ink >= minInk || dark >= minDark {
		t.Errorf("a sheet without its namespace passed the check: %.2f%% ink, %.2f%% dark", 100*ink, 100*dark)
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
				v, err := strconv.ParseFloat(strings.TrimSuffix(a.Value, "px"), 64)
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
func screenshot(t *testing.T, browser, page, png string, w, h float64) {
	t.Helper()
	abs, err := filepath.Abs(page)
	if err != nil {
		t.Fatal(err)
	}
	// The window is the sheet's size, within what a screenshot can hold.
	clamp := func(v float64) int { return int(math.Ceil(math.Min(math.Max(v, 200), 4000))) }
	scale := math.Min(1, 4000/math.Max(w, h))
	size := fmt.Sprintf("--window-size=%d,%d", clamp(w*scale), clamp(h*scale))
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
