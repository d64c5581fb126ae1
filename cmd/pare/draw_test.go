package main

import (
	"bytes"
	"encoding/xml"
	"errors"
	"flag"
	"io"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"pare/cmd/internal/pipeline"
	"pare/graph"
	"pare/internal/golden"
	"pare/internal/reftool"
	"pare/render"
	"pare/render/check"
	"pare/rules"
)

var updateSheets = flag.Bool("update", false, "rewrite the example sheets under examples/")

var drawViews = []render.View{render.Reduced, render.Full, render.Faded}

func exampleFiles(t testing.TB) []string {
	files, err := filepath.Glob("../../examples/*.toml")
	if err != nil || len(files) == 0 {
		t.Fatalf("no examples found: %v", err)
	}
	return files
}

// TestDrawExamplesCheck lays out every example in every view and fails on
// any overlap, wire through a symbol, broken net or bad junction, the
// qualities the sheet must have; crossings and bends are reported, and the
// reduced sheets must have no crossing inside a stage frame and no crowded
// wires.
func TestDrawExamplesCheck(t *testing.T) {
	warmSheets(exampleFiles(t), "")
	for _, f := range exampleFiles(t) {
		for _, v := range drawViews {
			for _, st := range []render.Style{render.IEC, render.IEEE} {
				ls := cachedSheet(t, f, v, st)
				g, r := ls.g, ls.report
				t.Logf("%s %s %s: %s", filepath.Base(f), v, st, r.Summary())
				for _, p := range r.Problems() {
					t.Errorf("%s %s %s: %s", filepath.Base(f), v, st, p)
				}
				if v == render.Reduced {
					for i, n := range r.FrameCrossings {
						if n > 0 {
							t.Errorf("%s reduced %s: %d crossings inside frame %q", filepath.Base(f), st, n, g.Frames[i].Title.Lines)
						}
					}
					// Reduced sheets go into repair notes: no wires crowded
					// against each other or against a frame edge either.
					for _, p := range r.Crowding() {
						t.Errorf("%s reduced %s: %s", filepath.Base(f), st, p)
					}
				}
			}
		}
	}
}

// TestDrawFocus: a sheet of a --focus reduction (the oscillator valve and
// what surrounds it) is as clean as a whole one.
func TestDrawFocus(t *testing.T) {
	res := sheetsOf(t, pipeline.Options{Path: "../../examples/frequency-changer.toml", Level: rules.LevelSignal, Focus: []string{"V1"}})
	g, err := render.Config{}.Geometry(res.Sheet(render.Reduced))
	if err != nil {
		t.Fatal(err)
	}
	r := check.Measure(g)
	t.Logf("focus V1: %s", r.Summary())
	for _, p := range r.Problems() {
		t.Error(p)
	}
	found := false
	for _, sym := range g.Symbols {
		found = found || sym.Ref == "V1"
	}
	if !found {
		t.Error("the focused valve is not on the sheet")
	}
}

// sheetsOf runs the pipeline up to the stages, ready for any sheet.
func sheetsOf(t *testing.T, o pipeline.Options) *pipeline.Result {
	t.Helper()
	o.Until = pipeline.PhaseStages
	res, err := pipeline.Run(o)
	if err != nil {
		t.Fatalf("%s: %v", o.Path, err)
	}
	return res
}

// sheetName is where the committed sheet of an example and view lives.
func sheetName(toml string, v render.View) string {
	return strings.TrimSuffix(toml, ".toml") + "." + v.String() + ".svg"
}

// TestDrawExampleSheets runs `pare draw --page none` (the whole sheet in
// one piece, for a screen: the README shows them; the pages --page auto
// cuts for paper are the main job's, TestDrawMatchesMainJob) on every
// example in every view and
// compares with the sheets committed under examples/ (byte-identical; run
// with -update to regenerate), checks the SVG is well-formed XML with the
// SVG namespace, and renders it with rsvg-convert. A second run must give
// the same bytes; for the reduced and faded views that second, independent
// run is the main job's, compared in TestDrawMatchesMainJob, so only the
// full view is drawn twice here.
func TestDrawExampleSheets(t *testing.T) {
	warmDraws(exampleFiles(t))
	for _, f := range exampleFiles(t) {
		for _, v := range drawViews {
			out := cachedDraw(t, f, v)
			checkXML(t, out)
			name := sheetName(f, v)
			golden.Check(t, name, out, *updateSheets, "look at the PNG, then go test ./cmd/pare -run TestDrawExampleSheets -update")
			rsvg(t, name)
			if v != render.Full {
				continue
			}
			var again bytes.Buffer
			run([]string{"draw", f, "-o", "-", "--view", v.String(), "--page", "none"}, &again, io.Discard)
			if !bytes.Equal(again.Bytes(), out) {
				t.Errorf("%s %s: two runs differ", f, v)
			}
		}
	}
}

// checkXML decodes the whole document and checks the root is an svg element
// in the SVG namespace.
func checkXML(t *testing.T, data []byte) {
	t.Helper()
	d := xml.NewDecoder(bytes.NewReader(data))
	root := true
	for {
		tok, err := d.Token()
		if errors.Is(err, io.EOF) {
			break
		}
		if err != nil {
			t.Fatalf("SVG is not well-formed XML: %v", err)
		}
		if se, ok := tok.(xml.StartElement); ok && root {
			root = false
			if se.Name.Local != "svg" || se.Name.Space != "http://www.w3.org/2000/svg" {
				t.Fatalf("root element is %v, want svg in the SVG namespace", se.Name)
			}
		}
	}
}

// rsvg renders an SVG file with rsvg-convert (librsvg, Debian librsvg2-bin).
func rsvg(t *testing.T, file string) { t.Helper(); reftool.RenderSVG(t, file) }

func TestDrawBadInput(t *testing.T) {
	dir := t.TempDir()
	bad := filepath.Join(dir, "bad.toml")
	os.WriteFile(bad, []byte("title = \"x\"\nband = \"1k..2k\"\n[parts]\nR1 = { r = \"4k7\", pins = [\"a\"] }\n"), 0o644)
	out := filepath.Join(dir, "out.svg")
	cases := []struct {
		name string
		args []string
		want string
	}{
		{"no output", []string{"draw", bad}, "no output file"},
		{"bad view", []string{"draw", "../../examples/frequency-changer.toml", "-o", out, "--view", "sideways"}, "unknown view"},
		{"bad symbols", []string{"draw", "../../examples/frequency-changer.toml", "-o", out, "--symbols", "din"}, "unknown symbol style"},
		{"bad level", []string{"draw", "../../examples/frequency-changer.toml", "-o", out, "--level", "extreme"}, "level"},
		{"bad netlist", []string{"draw", bad, "-o", out}, "bad.toml:4"},
		{"two files", []string{"draw", bad, bad, "-o", out}, "exactly one"},
	}
	for _, tc := range cases {
		var stdout, stderr bytes.Buffer
		if code := run(tc.args, &stdout, &stderr); code != exitBad {
			t.Errorf("%s: exit %d, want %d", tc.name, code, exitBad)
		}
		if !strings.Contains(stderr.String(), tc.want) {
			t.Errorf("%s: stderr %q does not mention %q", tc.name, stderr.String(), tc.want)
		}
		if _, err := os.Stat(out); err == nil {
			t.Errorf("%s: an output file was written", tc.name)
		}
	}
}

// chainNetlist writes a netlist of n/6 RC-coupled triode stages (coupling
// C, grid leak, valve, cathode R and bypass, anode load to HT), a long strip
// for the drawing benchmarks.
func chainNetlist(n int) string {
	var b strings.Builder
	b.WriteString("title = \"benchmark chain\"\nband = \"20..20k\"\ninputs = [\"in\"]\n")
	stages := n / 6
	b.WriteString("outputs = [\"a" + itoa(stages) + "\"]\n[nets]\nht = { role = \"supply\", volts = 250 }\n[parts]\n")
	prev := "in"
	for i := 1; i <= stages; i++ {
		s := itoa(i)
		b.WriteString("C" + s + " = { c = \"22n\", pins = [\"" + prev + "\", \"g" + s + "\"] }\n")
		b.WriteString("R" + s + "g = { r = \"1M\", pins = [\"g" + s + "\", \"gnd\"] }\n")
		b.WriteString("V" + s + " = { valve = \"triode\", pins = { a = \"a" + s + "\", g1 = \"g" + s + "\", k = \"k" + s + "\" } }\n")
		b.WriteString("R" + s + "k = { r = \"1k5\", pins = [\"k" + s + "\", \"gnd\"] }\n")
		b.WriteString("C" + s + "k = { c = \"25u\", type = \"electrolytic\", pins = [\"k" + s + "\", \"gnd\"] }\n")
		b.WriteString("R" + s + "a = { r = \"100k\", pins = [\"ht\", \"a" + s + "\"] }\n")
		prev = "a" + s
	}
	return b.String()
}

func itoa(i int) string { return strconv.Itoa(i) }

// BenchmarkDraw2000 draws the full and the reduced view of a 2,000-part
// strip (the reduction itself is not timed): each well under a second.
func BenchmarkDraw2000(b *testing.B) {
	c, err := graph.Parse("chain.toml", []byte(chainNetlist(2000)))
	if err != nil {
		b.Fatal(err)
	}
	reduced, _, err := rules.Reduce(c, rules.Options{Level: rules.LevelSignal})
	if err != nil {
		b.Fatal(err)
	}
	for _, tc := range []struct {
		name string
		s    *render.Sheet
	}{
		{"full", &render.Sheet{Circuit: c, View: render.Full}},
		{"reduced", &render.Sheet{Circuit: reduced, View: render.Reduced}},
	} {
		b.Run(tc.name, func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				if err := (render.Config{}).Fprint(io.Discard, tc.s); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// TestFadedViewFindsEveryReducedPart: every part of the reduced circuit is
// on the faded sheet of the original, drawn live under its own ref or named
// by the marker of a part merged into it.
func TestFadedViewFindsEveryReducedPart(t *testing.T) {
	for _, f := range exampleFiles(t) {
		reduced := cachedResult(t, f).Reduced
		g := cachedSheet(t, f, render.Faded, render.IEC).g
		live := map[string]bool{}
		for _, sym := range g.Symbols {
			if !sym.Faded {
				live[sym.Ref] = true
			}
		}
		marked := map[string]bool{}
		for _, l := range g.Labels {
			for _, line := range l.Lines[1:] {
				if i := strings.Index(line, "\u2192 "); i >= 0 {
					marked[strings.TrimSpace(strings.Split(line[i+len("\u2192 "):], ",")[0])] = true
				}
			}
		}
		for _, p := range reduced.Parts {
			if !live[p.Ref] && !marked[p.Ref] {
				t.Errorf("%s: reduced part %s is neither drawn live nor named by a marker on the faded sheet", filepath.Base(f), p.Ref)
			}
		}
	}
}

// A reduced sheet is true for one switch setting only: the information
// block must say which (the reduction keeps the contacts of the set position).
func TestFurnitureNamesSwitchPositions(t *testing.T) {
	src := `title = "Band switch"
band = "530k..1.6M"
inputs = ["ant"]
outputs = ["tank"]
[parts]
S1 = { switch = 2, set = 2, closes = ["c-1", "c-2"], pins = { c = "tank", 1 = "lmw", 2 = "llw" } }
L1 = { l = "230u", pins = ["lmw", "gnd"] }
L2 = { l = "2m", pins = ["llw", "gnd"] }
C1 = { c = "10p", pins = ["ant", "tank"] }
C2 = { c = "12p..365p", pins = ["tank", "gnd"] }
`
	c, err := graph.Parse("switch.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	lines := pipeline.Furniture(c, nil, rules.LevelSignal)
	want := "Switch S1 at position 2 of 2"
	for _, l := range lines {
		if l == want {
			return
		}
	}
	t.Errorf("furniture %q lacks %q", lines, want)
}

// TestDrawMatchesMainJob: `pare draw` and the main job draw their sheets
// from the one pipeline, so for every example the reduced and faded sheets
// of both are the same bytes, and so is the committed example sheet. A
// view the job cut onto pages (a whole set's) is compared page by page
// with `pare draw -o FILE.svg`, which cuts it the same way.
func TestDrawMatchesMainJob(t *testing.T) {
	warmJobs(t, examples(t))
	warmDraws(examples(t))
	for _, ex := range examples(t) {
		job := cachedJob(t, ex)
		if job.code == exitBad {
			t.Fatalf("main job failed: %s", job.stderr)
		}
		for _, sheet := range []struct {
			view render.View
			file string
		}{{render.Reduced, fileReducedSheet}, {render.Faded, fileFadedSheet}} {
			if _, err := os.Stat(filepath.Join(job.dir, sheet.file)); err != nil {
				drawMatchesPages(t, ex, job.dir, sheet.view, sheet.file)
				continue
			}
			drawn := string(cachedDraw(t, ex, sheet.view))
			if written := readString(t, filepath.Join(job.dir, sheet.file)); drawn != written {
				t.Errorf("%s: pare draw --view %s differs from the main job's %s", filepath.Base(ex), sheet.view, sheet.file)
			}
			if committed := readString(t, sheetName(ex, sheet.view)); drawn != committed {
				t.Errorf("%s: the %s sheet differs from the committed example sheet", filepath.Base(ex), sheet.view)
			}
		}
	}
}

// drawMatchesPages compares the pages of a view the main job wrote
// (reduced-1.svg ...) with those `pare draw` writes with its defaults.
func drawMatchesPages(t *testing.T, ex, dir string, v render.View, single string) {
	t.Helper()
	out := filepath.Join(t.TempDir(), single)
	if code, _, errs := runJob(t, "draw", ex, "--view", v.String(), "-o", out); code != exitOK {
		t.Fatalf("draw --view %s: exit %d: %s", v, code, errs)
	}
	pages, _ := filepath.Glob(filepath.Join(dir, strings.TrimSuffix(single, ".svg")+"-*.svg"))
	if len(pages) == 0 {
		t.Fatalf("%s: the main job wrote neither %s nor its pages", filepath.Base(ex), single)
	}
	for _, p := range pages {
		drawn := readString(t, filepath.Join(filepath.Dir(out), filepath.Base(p)))
		if drawn != readString(t, p) {
			t.Errorf("%s: pare draw --view %s differs from the main job's %s", filepath.Base(ex), v, filepath.Base(p))
		}
	}
}
