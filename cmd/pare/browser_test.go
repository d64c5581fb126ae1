package main

import (
	"bytes"
	"context"
	"encoding/base64"
	"encoding/json"
	"encoding/xml"
	"errors"
	"fmt"
	"html"
	"image"
	"image/png"
	"io"
	"math"
	"net/url"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
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
// checks the browser shows the drawing: a browser is what a reader opens
// the sheets and the note in, and it rejects SVG that a lenient converter
// would still draw (a missing namespace shows as an XML tree, or nothing).
// One browser run measures every sheet (a browser start costs about a CPU
// second); each sheet is still judged on its own.
func TestSheetsInBrowser(t *testing.T) {
	t.Parallel() // files and runs of its own only (sheetcache_test.go)
	browser := findChromium(t)
	type exampleSheets struct {
		name   string
		sheets []string
		shots  []browserSheet
	}
	var all []*exampleSheets
	var shots []browserSheet
	for _, ex := range examples(t) {
		e := &exampleSheets{name: strings.TrimSuffix(filepath.Base(ex), ".toml")}
		r := cachedJob(t, ex)
		if r.code == exitBad {
			t.Fatalf("%s: main job failed: %s", e.name, r.stderr)
		}
		for _, sheet := range packFiles(t, r.dir) {
			if !strings.HasSuffix(sheet, ".svg") {
				continue // a view on pages is every page of it
			}
			svgPath, err := filepath.Abs(filepath.Join(r.dir, sheet))
			if err != nil {
				t.Fatal(err)
			}
			e.sheets = append(e.sheets, sheet)
			e.shots = append(e.shots, browserSheet{svg: svgPath, ref: svgPath})
		}
		all = append(all, e)
		shots = append(shots, e.shots...)
	}
	problems := judgeInBrowser(t, browser, shots)
	for _, e := range all {
		mine := problems[:len(e.shots)]
		problems = problems[len(e.shots):]
		t.Run(e.name, func(t *testing.T) {
			for i, sheet := range e.sheets {
				for _, p := range mine[i] {
					t.Errorf("%s: %s", sheet, p)
				}
			}
		})
	}
}

// browserSheet is one sheet to show in the browser: the SVG at svg
// (absolute), judged against librsvg's rendering of ref (the sheet as meant).
type browserSheet struct{ svg, ref string }

// The least ink and dark fractions of a sheet that shows a drawing, read
// from librsvg's rendering at the sheet's own size (common practice for
// "something is drawn"; the examples' pages give 0.87–4.6 % ink, the least
// on the frequency changer's last faded page, a short row of two grey parts,
// a socket and a connector under the footer, and 0.15–1.6 % dark pixels,
// the least on the flagship's faded rectifier page, where every part is
// grey by design and only the title block, caution and frame title are
// black). The dark floor catches a sheet with nothing black on it at all; a
// page with its title block but no drawing is caught by the ink floor: that
// black text, all such a page would hold, is 0.15 % of this page.
const (
	minInk  = 0.005
	minDark = 0.001
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

// judgeInBrowser shows every sheet in one browser run, the way the note
// embeds it, and returns what is wrong with each, judged against librsvg's
// rendering of its ref at the same pixel size: the reference must show a
// drawing, and the browser must show about as much of it.
func judgeInBrowser(t *testing.T, browser string, sheets []browserSheet) [][]string {
	t.Helper()
	work := t.TempDir()
	rsvg := reftool.Find(t, reftool.Rsvg)
	sizes := make([]browserSize, len(sheets))
	for i, s := range sheets {
		w, h := checkWellFormed(t, s.ref)
		scale := math.Min(1, maxShot/math.Max(w, h))
		sizes[i] = browserSize{w, h, int(math.Ceil(w * scale)), int(math.Ceil(h * scale))}
	}
	refs := make([][2]float64, len(sheets))
	errs := make([]error, len(sheets))
	eachAtOnce(len(sheets), func(i int) { // librsvg runs while the browser does
		ref := filepath.Join(work, fmt.Sprintf("ref-%d.png", i))
		if errs[i] = rsvgPNG(rsvg, sheets[i].ref, ref, sizes[i].pw); errs[i] == nil {
			refs[i][0], refs[i][1], errs[i] = inkOfFile(ref)
		}
	})
	shots := browserShots(t, browser, work, sheets, sizes)
	out := make([][]string, len(sheets))
	for i, s := range sheets {
		if errs[i] != nil {
			t.Fatal(errs[i])
		}
		ink, dark := countInk(shots[i])
		refInk, refDark := refs[i][0], refs[i][1]
		t.Logf("%s: %.0f×%.0f shown at %d×%d: %.2f%% ink, %.2f%% dark (librsvg %.2f%%, %.2f%%)",
			filepath.Base(s.svg), sizes[i].w, sizes[i].h, sizes[i].pw, sizes[i].ph, 100*ink, 100*dark, 100*refInk, 100*refDark)
		if refInk < minInk || refDark < minDark {
			out[i] = append(out[i], fmt.Sprintf("the sheet draws only %.2f%% ink, %.2f%% dark pixels: blank sheet?", 100*refInk, 100*refDark))
		}
		if ink < minOfReference*refInk || dark < minOfReference*refDark {
			out[i] = append(out[i], fmt.Sprintf("the browser shows %.2f%% ink, %.2f%% dark pixels of the sheet's %.2f%%, %.2f%%: not drawn as an image?",
				100*ink, 100*dark, 100*refInk, 100*refDark))
		}
	}
	return out
}

// browserSize is a sheet's own size and the pixel size it is shown at.
type browserSize struct {
	w, h   float64
	pw, ph int
}

// rsvgPNG renders the SVG with librsvg, width px wide on white, into png.
func rsvgPNG(rsvg, svg, png string, width int) error {
	out, err := exec.Command(rsvg, "-b", "white", "-w", strconv.Itoa(width), "-a", "-o", png, svg).CombinedOutput()
	if err != nil {
		return fmt.Errorf("rsvg-convert %s: %v\n%s", svg, err, out)
	}
	return nil
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
	good, err := filepath.Abs(filepath.Join(r.dir, packFiles(t, r.dir)[1])) // the reduced sheet, or its first page
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
	var sheets []browserSheet
	for _, tc := range tests {
		path := filepath.Join(t.TempDir(), "sheet.svg")
		if err := os.WriteFile(path, []byte(tc.svg), 0o644); err != nil {
			t.Fatal(err)
		}
		ref := path
		if tc.againstGood {
			ref = good
		}
		sheets = append(sheets, browserSheet{svg: path, ref: ref})
	}
	problems := judgeInBrowser(t, browser, sheets)
	for i, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			if p := problems[i]; len(p) == 0 {
				t.Errorf("the %s sheet passed the check", tc.name)
			} else {
				t.Logf("caught: %s", p)
			}
		})
	}
}

// measurePage writes a page into dir that shows each sheet as an image
// (a browser draws an SVG image only when it is a proper SVG document,
// namespace and size, where loading the file directly would still show an
// XML tree) and, once all are loaded, draws each onto a white canvas at its
// pixel size and lists the canvases as PNG data URLs, in order, in the
// element #shots, where --dump-dom prints them. A sheet the browser cannot
// show as an image leaves its canvas white, with the error beside it.
func measurePage(t *testing.T, dir string, sheets []browserSheet, sizes []browserSize) string {
	t.Helper()
	var b strings.Builder
	b.WriteString(`<!DOCTYPE html><html><body style="margin:0;background:#fff">` + "\n")
	for i, s := range sheets {
		fmt.Fprintf(&b, `<img style="display:block" width="%d" height="%d" src="%s">`+"\n",
			sizes[i].pw, sizes[i].ph, html.EscapeString((&url.URL{Scheme: "file", Path: s.svg}).String()))
	}
	b.WriteString(`<pre id="shots"></pre><script>
window.addEventListener("load", function () {
  var out = [];
  document.querySelectorAll("img").forEach(function (im) {
    var c = document.createElement("canvas"), g = c.getContext("2d"), r = {};
    c.width = +im.getAttribute("width"); c.height = +im.getAttribute("height");
    g.fillStyle = "#fff"; g.fillRect(0, 0, c.width, c.height);
    try { g.drawImage(im, 0, 0, c.width, c.height); } catch (e) { r.error = String(e); }
    r.png = c.toDataURL("image/png");
    out.push(r);
  });
  document.getElementById("shots").textContent = JSON.stringify(out);
});
</script></body></html>
`)
	page := filepath.Join(dir, "page.html")
	if err := os.WriteFile(page, []byte(b.String()), 0o644); err != nil {
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

// browserShots shows the sheets in one headless Chromium run (flags as in
// docs/references.md §15, with file pages allowed to read the sheets' pixels)
// with a fresh profile, removed afterwards, and a time limit so a hung
// browser cannot hang the test run; it returns each sheet as the browser
// drew it.
func browserShots(t *testing.T, browser, dir string, sheets []browserSheet, sizes []browserSize) []image.Image {
	t.Helper()
	page := measurePage(t, dir, sheets, sizes)
	profile, err := os.MkdirTemp("", "pare-chromium-")
	if err != nil {
		t.Fatal(err)
	}
	defer os.RemoveAll(profile)
	ctx, cancel := context.WithTimeout(context.Background(), 120*time.Second)
	defer cancel()
	cmd := exec.CommandContext(ctx, browser,
		"--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
		"--disable-background-networking", "--disable-component-update", "--disable-sync",
		"--log-level=3", "--allow-file-access-from-files",
		"--user-data-dir="+profile, "--dump-dom", "file://"+page)
	cmd.WaitDelay = 5 * time.Second // the browser's helpers may hold the pipes open
	var stderr strings.Builder
	cmd.Stderr = &stderr
	out, err := cmd.Output()
	if ctx.Err() != nil {
		t.Fatalf("chromium did not finish within the time limit on %s", page)
	}
	if err != nil {
		t.Fatalf("chromium failed on %s: %v\n%s", page, err, stderr.String())
	}
	// A page that fails to load still exits 0: the list must be there, whole.
	m := regexp.MustCompile(`<pre id="shots">([^<]*)</pre>`).FindSubmatch(out)
	if m == nil {
		t.Fatalf("chromium showed no measurements of %s:\n%.2000s", page, stderr.String())
	}
	var shots []struct{ PNG, Error string }
	if err := json.Unmarshal([]byte(html.UnescapeString(string(m[1]))), &shots); err != nil || len(shots) != len(sheets) {
		t.Fatalf("chromium's list of %d sheets: %d entries, %v", len(sheets), len(shots), err)
	}
	imgs := make([]image.Image, len(shots))
	for i, s := range shots {
		if s.Error != "" {
			t.Logf("%s: the browser did not draw it: %s", filepath.Base(sheets[i].svg), s.Error)
		}
		data, err := base64.StdEncoding.DecodeString(strings.TrimPrefix(s.PNG, "data:image/png;base64,"))
		if err != nil {
			t.Fatalf("%s: the browser's picture: %v", sheets[i].svg, err)
		}
		if imgs[i], err = png.Decode(bytes.NewReader(data)); err != nil {
			t.Fatalf("%s: the browser's picture: %v", sheets[i].svg, err)
		}
		if b := imgs[i].Bounds(); b.Dx() != sizes[i].pw || b.Dy() != sizes[i].ph {
			t.Fatalf("%s: the browser drew %v, want %d×%d", sheets[i].svg, b.Size(), sizes[i].pw, sizes[i].ph)
		}
	}
	return imgs
}

// inkOfFile returns the fractions of a PNG's pixels that are not white
// and that are dark (countInk).
func inkOfFile(path string) (float64, float64, error) {
	f, err := os.Open(path)
	if err != nil {
		return 0, 0, err
	}
	defer f.Close()
	img, err := png.Decode(f)
	if err != nil {
		return 0, 0, fmt.Errorf("%s: %v", path, err)
	}
	ink, dark := countInk(img)
	return ink, dark, nil
}

// countInk returns the fractions of pixels that are not white and that are
// dark (all channels below 40 % of full scale).
func countInk(img image.Image) (float64, float64) {
	b := img.Bounds()
	ink, dark := 0, 0
	// At boxes every pixel in an interface; RGBA64At gives the same
	// values without, on the image types png.Decode returns.
	at := func(x, y int) (r, g, b, a uint32) { return img.At(x, y).RGBA() }
	if i64, ok := img.(image.RGBA64Image); ok {
		at = func(x, y int) (r, g, b, a uint32) { return i64.RGBA64At(x, y).RGBA() }
	}
	for y := b.Min.Y; y < b.Max.Y; y++ {
		for x := b.Min.X; x < b.Max.X; x++ {
			r, g, bl, _ := at(x, y)
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
