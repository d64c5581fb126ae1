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
	"regexp"
	"sort"
	"strings"
	"testing"
	"time"

	"pare/internal/reftool"
)

// checkHTMLText parses notes.html as XML (the writer keeps it well-formed,
// so a strict parser catches text that opened a tag) and checks it holds
// only the writer's two scripts and no event handler.
func checkHTMLText(t *testing.T, page string) {
	t.Helper()
	d := xml.NewDecoder(strings.NewReader(page))
	scripts := 0
	for {
		tok, err := d.Token()
		if errors.Is(err, io.EOF) {
			break
		}
		if err != nil {
			t.Fatalf("notes.html is not well-formed: %v", err)
		}
		se, ok := tok.(xml.StartElement)
		if !ok {
			continue
		}
		if se.Name.Local == "script" {
			scripts++
		}
		for _, a := range se.Attr {
			if strings.HasPrefix(strings.ToLower(a.Name.Local), "on") {
				t.Errorf("notes.html: event handler attribute %s on <%s>", a.Name.Local, se.Name.Local)
			}
		}
	}
	if scripts != 2 {
		t.Errorf("notes.html holds %d script elements, want the writer's 2", scripts)
	}
}

// sheetFigure is one inline sheet of notes.html, as the writer puts it.
var sheetFigure = regexp.MustCompile(`(?s)<figure class="n-sheet".*?</figure>\n`)

// TestNotePrintsOneSheetPerPage prints notes.html with headless Chromium and
// looks at every page (pdftoppm): there are as many pages as the text alone
// prints plus one per sheet; each sheet page holds one sheet whose box is
// complete and inside the page margins, with the sheet's own white border
// intact along all four sides, so no part of the drawing is cut off. The
// sheet boxes are outlined in pure red for the test (an outline takes no
// room, so the layout is the note's own; nothing else on the page is red).
func TestNotePrintsOneSheetPerPage(t *testing.T) {
	t.Parallel() // files and runs of its own only (sheetcache_test.go)
	browser := findChromium(t)
	pdftoppm := reftool.Find(t, reftool.Pdftoppm)
	r := cachedJob(t, redExample)
	if r.code == exitBad {
		t.Fatalf("main job failed: %s", r.stderr)
	}
	page := readString(t, filepath.Join(r.dir, fileNoteHTML))
	sheets := len(sheetFigure.FindAllString(page, -1))
	// the reduced and faded views, each one sheet or its A3 pages
	files, _ := filepath.Glob(filepath.Join(r.dir, "*.svg"))
	if sheets != len(files) || sheets < 2 {
		t.Fatalf("notes.html holds %d sheets, want the pack's %d (reduced and faded)", sheets, len(files))
	}
	work := t.TempDir()
	marked := strings.Replace(page, "</style>", ".n-sheet svg{outline:1mm solid #f00;outline-offset:-1mm}</style>", 1)
	pages := printPages(t, browser, pdftoppm, work, "full", marked)
	textPages := len(printPages(t, browser, pdftoppm, work, "text", sheetFigure.ReplaceAllString(page, "")))
	if len(pages) != textPages+sheets {
		t.Errorf("%d pages printed, want %d: %d of text and one per sheet", len(pages), textPages+sheets, textPages)
	}
	var onSheet []int
	for i, img := range pages {
		b := img.Bounds()
		if b.Dx() <= b.Dy() {
			t.Errorf("page %d is %d×%d, not landscape", i+1, b.Dx(), b.Dy())
		}
		box, ok := redBox(img)
		if !ok {
			continue
		}
		onSheet = append(onSheet, i+1)
		if msg := checkSheetPage(img, box); msg != "" {
			t.Errorf("page %d: %s", i+1, msg)
		}
	}
	// The caution and verdict open the note: page 1 is text; the sheets
	// follow on pages of their own, one after the other.
	if len(onSheet) != sheets || onSheet[0] == 1 || onSheet[len(onSheet)-1]-onSheet[0] != sheets-1 {
		t.Errorf("sheets on pages %v of %d, want %d consecutive pages after the first", onSheet, len(pages), sheets)
	}
}

// printPages prints the page to PDF and returns its pages as images at
// 50 dpi (an A4 landscape page is 585×413 pixels; 10 mm is 20 pixels).
func printPages(t *testing.T, browser, pdftoppm, dir, name, page string) []image.Image {
	t.Helper()
	htmlPath := filepath.Join(dir, name+".html")
	if err := os.WriteFile(htmlPath, []byte(page), 0o644); err != nil {
		t.Fatal(err)
	}
	pdf := filepath.Join(dir, name+".pdf")
	runBrowser(t, browser, "--no-pdf-header-footer", "--print-to-pdf="+pdf, "file://"+htmlPath)
	if _, err := os.Stat(pdf); err != nil {
		t.Fatalf("chromium printed no PDF of %s", name)
	}
	prefix := filepath.Join(dir, name)
	if out, err := exec.Command(pdftoppm, "-r", "50", "-png", pdf, prefix).CombinedOutput(); err != nil {
		t.Fatalf("pdftoppm: %v\n%s", err, out)
	}
	files, err := filepath.Glob(prefix + "-*.png")
	if err != nil || len(files) == 0 {
		t.Fatalf("pdftoppm wrote no pages for %s", name)
	}
	sort.Slice(files, func(i, j int) bool { // name-1, name-2 … name-10: by number
		return len(files[i]) < len(files[j]) || len(files[i]) == len(files[j]) && files[i] < files[j]
	})
	imgs := make([]image.Image, len(files))
	for i, f := range files {
		fh, err := os.Open(f)
		if err != nil {
			t.Fatal(err)
		}
		imgs[i], err = png.Decode(fh)
		fh.Close()
		if err != nil {
			t.Fatalf("%s: %v", f, err)
		}
	}
	return imgs
}

// runBrowser runs headless Chromium with the flags of docs/references.md
// §15, a fresh profile and a time limit.
func runBrowser(t *testing.T, browser string, args ...string) []byte {
	t.Helper()
	profile, err := os.MkdirTemp("", "pare-chromium-")
	if err != nil {
		t.Fatal(err)
	}
	defer os.RemoveAll(profile)
	ctx, cancel := context.WithTimeout(context.Background(), 60*time.Second)
	defer cancel()
	cmd := exec.CommandContext(ctx, browser, append([]string{"--headless", "--no-sandbox", "--disable-gpu",
		"--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update",
		"--disable-sync", "--log-level=3", "--user-data-dir=" + profile}, args...)...)
	cmd.WaitDelay = 5 * time.Second
	var stdout strings.Builder
	cmd.Stdout = &stdout
	if err := cmd.Run(); err != nil || ctx.Err() != nil {
		t.Fatalf("chromium %v: %v", args, err)
	}
	return []byte(stdout.String())
}

func isRed(r, g, b uint32) bool { return r > 0xc000 && g < 0x6000 && b < 0x6000 }

// redBox is the bounding box of the red pixels: the outlined sheet box.
func redBox(img image.Image) (image.Rectangle, bool) {
	b := img.Bounds()
	box, found := image.Rectangle{}, false
	for y := b.Min.Y; y < b.Max.Y; y++ {
		for x := b.Min.X; x < b.Max.X; x++ {
			r, g, bl, _ := img.At(x, y).RGBA()
			if !isRed(r, g, bl) {
				continue
			}
			p := image.Rect(x, y, x+1, y+1)
			if !found {
				box, found = p, true
			} else {
				box = box.Union(p)
			}
		}
	}
	return box, found
}

// checkSheetPage says what is wrong with a sheet page, or "": the red box
// must lie inside the page's 10 mm margins (a box cut by the page edge
// would touch it) with all four of its sides drawn, and the band just
// inside it must be free of ink, since every sheet has a white border round
// its drawing. A drawing cut by its box would run into that band.
func checkSheetPage(img image.Image, box image.Rectangle) string {
	const margin = 15 // pixels at 50 dpi: 7.6 mm, inside the 10 mm page margin
	b := img.Bounds()
	if box.Min.X < margin || box.Min.Y < margin || box.Max.X > b.Max.X-margin || box.Max.Y > b.Max.Y-margin {
		return "the sheet's box " + box.String() + " reaches the page edge of " + b.String()
	}
	red := func(x, y int) bool { r, g, bl, _ := img.At(x, y).RGBA(); return isRed(r, g, bl) }
	sides := []struct {
		name   string
		n      int
		at     func(i int) bool
		inside func(i int) (int, int)
	}{
		{"top", box.Dx(), func(i int) bool { return red(box.Min.X+i, box.Min.Y) }, func(i int) (int, int) { return box.Min.X + i, box.Min.Y + 3 }},
		{"bottom", box.Dx(), func(i int) bool { return red(box.Min.X+i, box.Max.Y-1) }, func(i int) (int, int) { return box.Min.X + i, box.Max.Y - 4 }},
		{"left", box.Dy(), func(i int) bool { return red(box.Min.X, box.Min.Y+i) }, func(i int) (int, int) { return box.Min.X + 3, box.Min.Y + i }},
		{"right", box.Dy(), func(i int) bool { return red(box.Max.X-1, box.Min.Y+i) }, func(i int) (int, int) { return box.Max.X - 4, box.Min.Y + i }},
	}
	for _, s := range sides {
		drawn, inked := 0, 0
		for i := 3; i < s.n-3; i++ {
			if s.at(i) {
				drawn++
			}
			x, y := s.inside(i)
			if r, g, bl, _ := img.At(x, y).RGBA(); r < 0xc000 && g < 0xc000 && bl < 0xc000 {
				inked++
			}
		}
		if drawn < (s.n-6)*9/10 {
			return "the sheet box's " + s.name + " side is not whole: cut off"
		}
		if inked > 0 {
			return "ink right inside the " + s.name + " side of the sheet box: the drawing runs into its edge"
		}
	}
	sub, ok := img.(interface {
		SubImage(image.Rectangle) image.Image
	})
	if !ok {
		return "cannot look inside the sheet box"
	}
	if ink, _ := countInk(sub.SubImage(box.Inset(4))); ink < 0.01 {
		return "hardly any ink inside the sheet box: no drawing?"
	}
	return ""
}

// hoverProbe is appended to a copy of notes.html: it points at every part
// of both views (each one sheet or its pages) in turn (the events a mouse sends) and writes what lit up
// on the other sheet into an attribute of the body, which --dump-dom shows.
const hoverProbe = `<script>
(function(){
function sel(id,c){return 'figure[id="'+id+'"] '+c+',figure[id^="'+id+'-p"] '+c}
function probe(from,to){var out=[];
document.querySelectorAll(sel(from,".part")).forEach(function(g){
g.dispatchEvent(new MouseEvent("mouseenter"));
var lit=[].map.call(document.querySelectorAll(sel(to,".part.hl")),function(e){return e.getAttribute("data-ref")}).sort();
g.dispatchEvent(new MouseEvent("mouseleave"));
out.push(g.getAttribute("data-ref")+"="+lit.join(","));});
return out.join(" ")}
document.body.setAttribute("data-reduced",probe("n-reduced","n-faded"));
document.body.setAttribute("data-faded",probe("n-faded","n-reduced"));
document.body.setAttribute("data-left",document.querySelectorAll(".hl").length);
})();
</script>`

// mergeLine is notes.md's merge record: "- `C3` stands for `C3`, `TC2`".
var mergeLine = regexp.MustCompile("(?m)^- `([^`]+)` stands for (.+)$")

// TestNoteHoverLightsOriginals points at every part of the HTML note's
// sheets in Chromium: a reduced part lights up exactly the original parts
// notes.md says it stands for (itself when it was kept as it is), a part on
// the faded sheet lights up the reduced part it went into, and nothing stays
// lit when the pointer leaves.
func TestNoteHoverLightsOriginals(t *testing.T) {
	t.Parallel() // files and runs of its own only (sheetcache_test.go)
	browser := findChromium(t)
	r := cachedJob(t, redExample)
	if r.code == exitBad {
		t.Fatalf("main job failed: %s", r.stderr)
	}
	md := readString(t, filepath.Join(r.dir, fileNote))
	from := map[string][]string{}
	into := map[string]string{}
	for _, m := range mergeLine.FindAllStringSubmatch(md, -1) {
		for _, o := range strings.Split(m[2], ", ") {
			o = strings.Trim(o, "`")
			from[m[1]] = append(from[m[1]], o)
			into[o] = m[1]
		}
	}
	if len(from) == 0 {
		t.Fatal("notes.md records no merge: the example cannot show the hover")
	}
	page := readString(t, filepath.Join(r.dir, fileNoteHTML))
	probe := filepath.Join(t.TempDir(), "probe.html")
	if err := os.WriteFile(probe, []byte(strings.Replace(page, "</body>", hoverProbe+"</body>", 1)), 0o644); err != nil {
		t.Fatal(err)
	}
	dom := string(runBrowser(t, browser, "--dump-dom", "file://"+probe))
	reduced, faded := bodyAttr(t, dom, "data-reduced"), bodyAttr(t, dom, "data-faded")
	if left := bodyAttr(t, dom, "data-left"); left != "0" {
		t.Errorf("%s parts still lit after the pointer left", left)
	}
	for _, kv := range strings.Fields(reduced) {
		ref, lit, _ := strings.Cut(kv, "=")
		want := []string{ref}
		if f, ok := from[ref]; ok {
			want = append([]string(nil), f...)
			sort.Strings(want)
		}
		if strings.HasPrefix(ref, "_") { // a port: drawn on both sheets under its own name
			continue
		}
		if lit != strings.Join(want, ",") {
			t.Errorf("pointing at reduced %s lights %q on the faded sheet, want %q", ref, lit, strings.Join(want, ","))
		}
	}
	checked := 0
	for _, kv := range strings.Fields(faded) {
		ref, lit, _ := strings.Cut(kv, "=")
		if in, ok := into[ref]; ok {
			checked++
			if lit != in {
				t.Errorf("pointing at original %s lights %q on the reduced sheet, want %q", ref, lit, in)
			}
		}
	}
	if checked == 0 || len(strings.Fields(reduced)) == 0 {
		t.Errorf("no merged part was pointed at (reduced %q, faded %q)", reduced, faded)
	}
}

// bodyAttr reads an attribute of the body from Chromium's DOM dump.
func bodyAttr(t *testing.T, dom, name string) string {
	t.Helper()
	m := regexp.MustCompile(`<body[^>]* ` + name + `="([^"]*)"`).FindStringSubmatch(dom)
	if m == nil {
		t.Fatalf("the probe left no %s on the body: the page's script did not run?", name)
	}
	return m[1]
}
