package main

import (
	"context"
	"encoding/xml"
	"errors"
	"image"
	"image/png"
	"io"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
	"time"
)

// chromiumPaths are where Debian's chromium package puts the browser; the
// binary under /usr/lib is the one that takes the headless flags directly.
var chromiumPaths = []string{"/usr/lib/chromium/chromium", "/usr/bin/chromium"}

// findChromium returns the browser, or skips (fails when the tools are
// required, as in CI).
func findChromium(t *testing.T) string {
	t.Helper()
	for _, p := range chromiumPaths {
		if st, err := os.Stat(p); err == nil && !st.IsDir() {
			return p
		}
	}
	if p, err := exec.LookPath("chromium"); err == nil {
		return p
	}
	msg := "chromium not found (" + strings.Join(chromiumPaths, ", ") + "); install it with: apt-get install -y --no-install-recommends chromium"
	if os.Getenv("PARE_REQUIRE_TOOLS") == "1" {
		t.Fatal(msg)
	}
	t.Skip(msg + "; skipping the browser check")
	return ""
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
				svgPath := filepath.Join(dir, sheet)
				checkWellFormed(t, svgPath)
				shot := filepath.Join(t.TempDir(), strings.TrimSuffix(sheet, ".svg")+".png")
				screenshot(t, browser, svgPath, shot)
				ink, dark := inkOf(t, shot)
				// Thresholds are common practice for "something is drawn": a
				// schematic with a frame and labels covers a few percent of the
				// window, and its lines and text are dark.
				if ink < 0.01 {
					t.Errorf("%s: only %.2f%% of the screenshot is not white: blank sheet?", sheet, 100*ink)
				}
				if dark < 200 {
					t.Errorf("%s: %d dark pixels: no lines or text visible", sheet, dark)
				}
				t.Logf("%s: %.1f%% ink, %d dark pixels", sheet, 100*ink, dark)
			}
		})
	}
}

// checkWellFormed parses the sheet as XML with an svg root in the SVG
// namespace, so a failure here says what is wrong before the browser does.
func checkWellFormed(t *testing.T, path string) {
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
			return
		}
		if err != nil {
			t.Fatalf("%s is not well-formed XML: %v", path, err)
		}
		if se, ok := tok.(xml.StartElement); ok && root {
			root = false
			if se.Name.Local != "svg" || se.Name.Space != "http://www.w3.org/2000/svg" {
				t.Fatalf("%s: root element is {%s}%s, want an svg element in the SVG namespace", path, se.Name.Space, se.Name.Local)
			}
		}
	}
}

// screenshot loads a page in headless Chromium (flags from the project's
// reference-tools notes) with a fresh profile, removed afterwards, and a
// time limit so a hung browser cannot hang the test run.
func screenshot(t *testing.T, browser, page, png string) {
	t.Helper()
	abs, err := filepath.Abs(page)
	if err != nil {
		t.Fatal(err)
	}
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
		"--user-data-dir="+profile, "--window-size=1600,1200",
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

// inkOf returns the fraction of pixels that are not white and the number of
// dark pixels (all channels below 40 % of full scale).
func inkOf(t *testing.T, path string) (float64, int) {
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

func countInk(img image.Image) (float64, int) {
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
	return float64(ink) / float64(total), dark
}

// countInk itself, on images whose answer is known by construction.
func TestCountInk(t *testing.T) {
	white := image.NewGray(image.Rect(0, 0, 10, 10))
	for i := range white.Pix {
		white.Pix[i] = 0xff
	}
	if ink, dark := countInk(white); ink != 0 || dark != 0 {
		t.Errorf("white image: ink %v, dark %d; want 0, 0", ink, dark)
	}
	// A 5×2 black bar on a 10×10 white image: 10 of 100 pixels.
	for y := 0; y < 2; y++ {
		for x := 0; x < 5; x++ {
			white.Pix[y*white.Stride+x] = 0
		}
	}
	// One light grey pixel counts as ink but not as dark.
	white.Pix[9*white.Stride+9] = 0xc0
	if ink, dark := countInk(white); ink != 0.11 || dark != 10 {
		t.Errorf("bar image: ink %v, dark %d; want 0.11, 10", ink, dark)
	}
}
