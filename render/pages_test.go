package render

import (
	"bytes"
	"fmt"
	"math"
	"pare/render/layout"
	"path/filepath"
	"reflect"
	"strings"
	"testing"

	"pare/graph"
	"pare/internal/golden"
	"pare/render/check"
	"pare/render/geom"
)

// chainSheet is a chain of triode stages, each framed: 6 parts a stage.
func chainSheet(stages int) *Sheet {
	c := stageChain(6*stages + 1)
	s := &Sheet{Circuit: c, View: Reduced}
	for i := 1; i <= stages; i++ {
		var refs []string
		for _, f := range []string{"C%da", "R%dg", "V%d", "R%dk", "C%dk", "R%da"} {
			refs = append(refs, fmt.Sprintf(f, i))
		}
		s.Frames = append(s.Frames, Frame{Title: fmt.Sprintf("S%d triode stage", i), Parts: refs})
	}
	return s
}

func TestParsePaper(t *testing.T) {
	cases := []struct {
		in   string
		want string // "" for none
		bad  bool
	}{
		{"A4", "A4", false}, {"a3", "A3", false}, {"Letter", "letter", false}, {"none", "", false},
		{"NONE", "", false}, {"B5", "", true}, {"", "", false},
	}
	for _, tc := range cases {
		p, err := ParsePaper(tc.in)
		if (err != nil) != tc.bad {
			t.Errorf("%q: err %v", tc.in, err)
			continue
		}
		if got := ""; p != nil {
			got = p.Name
			if got != tc.want {
				t.Errorf("%q: %s, want %s", tc.in, got, tc.want)
			}
		} else if tc.want != "" {
			t.Errorf("%q: none, want %s", tc.in, tc.want)
		}
	}
	// A4 landscape less 10 mm margins is 277 × 190 mm (ISO 216); at 2.5 mm
	// small text (0.85 of a grid unit) one unit is 2.94 mm
	a4, _ := ParsePaper("A4")
	if w, h := a4.content(); w < 94.1 || w > 94.3 || h < 64.5 || h > 64.7 {
		t.Errorf("A4 printable area %.2f × %.2f grid units, want 94.2 × 64.6", w, h)
	}
}

// TestChainPages: three framed stages (62 units wide each) on A4 (94 units) flow into rows and pages: each
// page passes the checker, its connectors pair up across pages, each page
// says "sheet n of m", and the pages are the committed ones byte for byte
// (look at them as PNG after go test ./render -update) on every run.
func TestChainPages(t *testing.T) {
	a4, _ := ParsePaper("A4")
	s := chainSheet(3)
	cfg := Config{Page: a4}
	pages, err := cfg.FprintPages(s)
	if err != nil {
		t.Fatal(err)
	}
	if len(pages) < 2 {
		t.Fatalf("three stages on A4: %d page(s)", len(pages))
	}
	again, _ := cfg.FprintPages(chainSheet(3))
	gs, err := cfg.Geometries(s)
	if err != nil {
		t.Fatal(err)
	}
	for i, g := range gs {
		// a problem includes a label printing under MinTextMM at the
		// page's scale (g.PageMM)
		if want := mmPerUnit(); math.Abs(g.PageMM-want) > 1e-9 {
			t.Errorf("page %d: %g mm a grid unit, want the paper's scale %g", i+1, g.PageMM, want)
		}
		for _, p := range check.Measure(g).Problems() {
			t.Errorf("page %d: %s", i+1, p)
		}
	}
	for _, p := range check.Connectors(gs) {
		t.Error(p)
	}
	conns := 0
	for _, g := range gs {
		for _, sym := range g.Symbols {
			if strings.HasPrefix(sym.Ref, "@from:") || strings.HasPrefix(sym.Ref, "@to:") {
				conns++
			}
		}
	}
	if conns < 2 {
		t.Errorf("%d off-row connectors on %d pages", conns, len(pages))
	}
	for i, svg := range pages {
		if !bytes.Contains(svg, []byte(fmt.Sprintf("sheet %d of %d", i+1, len(pages)))) {
			t.Errorf("page %d has no 'sheet %d of %d'", i+1, i+1, len(pages))
		}
		if !bytes.Equal(svg, again[i]) {
			t.Errorf("page %d differs from run to run", i+1)
		}
		wellFormed(t, svg)
		file := filepath.Join("testdata", fmt.Sprintf("chain-a4-%d.svg", i+1))
		golden.Check(t, file, svg, *update, "look at the PNG, then go test ./render -update")
		renders(t, file)
	}
}

// TestRowsFillThePage: stages flow into rows in signal order, and a row
// ends only where the next stretch does not fit beside it once routed
// (common practice: a printed sheet is filled left to right before the next
// row starts). The placement without routing overstates a row's width (the
// gaps of the whole sheet), so a rule on it alone left rows with room for a
// whole stage: the club receiver framed by its regions on A3 ended a row
// 128 units wide with the next stretch beside it, on a page 136 wide.
func TestRowsFillThePage(t *testing.T) {
	regions := func(path string) func() *Sheet {
		return func() *Sheet {
			c := load(t, path)
			s := &Sheet{Circuit: c, View: Reduced}
			for _, r := range c.Regions {
				s.Frames = append(s.Frames, Frame{Title: r.Name, Parts: r.Parts})
			}
			return s
		}
	}
	for _, tc := range []struct {
		name, paper string
		sheet       func() *Sheet
	}{
		{"chain of 5", "A3", func() *Sheet { return chainSheet(5) }},
		{"chain of 4", "A4", func() *Sheet { return chainSheet(4) }},
		{"club-receiver", "A3", regions("../examples/club-receiver.toml")},
		{"bank of 2 chains of 12", "A3", func() *Sheet { return bankSheet(2, 12) }},
	} {
		p, _ := ParsePaper(tc.paper)
		cfg := Config{Page: p}
		s := tc.sheet()
		f, ends, laid, err := cfg.flowRows(s)
		if err != nil {
			t.Fatal(err)
		}
		cw, ch := p.content()
		ch -= 1 + cfg.footReserve(s)
		t.Logf("%s on %s: %d rows, %d layouts", tc.name, tc.paper, len(ends), len(f.laid))
		// a row is laid out, then once more with the next stretch to show it
		// does not fit: laying a row out again for every stretch it gave
		// away took the reduced sheet of a 1,010-part bank to 558 row layouts for 98 rows
		if len(f.laid) > 2*len(ends) {
			t.Errorf("%s on %s: %d row layouts for %d rows; want at most two a row", tc.name, tc.paper, len(f.laid), len(ends))
		}
		for i := 0; i+1 < len(ends); i++ {
			if !fits(laid[i], cw, ch) && ends[i]-start(ends, i) > 1 {
				t.Errorf("%s on %s: row %d is %.0f × %.0f, beyond the page", tc.name, tc.paper, i+1,
					laid[i].Geom.Bounds.W(), laid[i].Geom.Bounds.H())
			}
			g, err := f.layout(start(ends, i), pullEnd(f.bs, ends, i))
			if err != nil {
				t.Fatal(err)
			}
			if fits(g, cw, ch) {
				t.Errorf("%s on %s: row %d of %d ends with room for the next stretch (%.0f units wide with it, the page %.0f)",
					tc.name, tc.paper, i+1, len(ends), g.Geom.Bounds.W(), cw)
			}
		}
	}
}

// TestFitDoesNotRouteWhatCannotFit: a sheet whose parts, placed but not
// routed, are already wider than the paper widths allowed is reported as
// not fitting without being routed and drawn (no bytes): the main job's
// one-sheet try of a whole set's sheet routed hundreds of parts only to
// cut them into rows after. A sheet that fits is drawn as before.
func TestFitDoesNotRouteWhatCannotFit(t *testing.T) {
	a4 := &Papers[0]
	cfg := Config{}
	one, fits, err := cfg.FprintFit(chainSheet(40), a4, 1)
	if err != nil || fits || one != nil {
		t.Errorf("240 parts on one A4 width: %d bytes, fits %v, %v; want no drawing, not fitting", len(one), fits, err)
	}
	one, fits, err = cfg.FprintFit(chainSheet(1), a4, 1)
	if err != nil || !fits || len(one) == 0 {
		t.Errorf("one stage on A4: %d bytes, fits %v, %v; want a drawing that fits", len(one), fits, err)
	}
}

// TestJoinedFramesAreOneStretch: a frame joined to the one before it (a
// supply's smoothing filter after its rectifier) is never cut from it, even
// with a gap between them where a row could end; unjoined, the two are
// stretches of their own.
func TestJoinedFramesAreOneStretch(t *testing.T) {
	c := &graph.Circuit{Parts: []*graph.Part{{Ref: "C1"}, {Ref: "L1"}, {Ref: "V1"}}}
	ext := map[string]geom.Rect{
		"V1": geom.R(0, 0, 10, 10),
		"C1": geom.R(20, 0, 30, 10),
		"L1": geom.R(30, 0, 40, 10),
	}
	for _, joined := range []bool{false, true} {
		s := &Sheet{Circuit: c, Frames: []Frame{
			{Title: "ST2 rectifier", Parts: []string{"V1"}},
			{Title: "ST1 filter", Parts: []string{"C1", "L1"}, Joined: joined},
		}}
		bs := blocks(s, ext)
		want := 2
		if joined {
			want = 1
		}
		if len(bs) != want {
			t.Errorf("joined %v: %d stretches, want %d", joined, len(bs), want)
		}
	}
}

// TestUnframedPartsGoWithTheirStage: unframed parts wired only among
// themselves and to one frame's parts (a mains switch and a capacitor
// across a transformer's primary) stay on that frame's stretch, wherever
// the placement put them; a part wired to two frames' parts is a stretch
// of its own.
func TestUnframedPartsGoWithTheirStage(t *testing.T) {
	pins := func(nets ...string) []graph.Pin {
		var out []graph.Pin
		for i, n := range nets {
			out = append(out, graph.Pin{Name: fmt.Sprint(i + 1), Net: n})
		}
		return out
	}
	c := &graph.Circuit{Parts: []*graph.Part{
		{Ref: "C1", Kind: graph.Capacitor, Pins: pins("p", "q")},
		{Ref: "R1", Kind: graph.Resistor, Pins: pins("a", "b")},
		{Ref: "S1", Kind: graph.Switch, Pins: pins("q", "m")},
		{Ref: "T1", Kind: graph.Transformer, Pins: pins("p", "q", "s", "gnd")},
		{Ref: "V1", Kind: graph.Valve, Pins: pins("a", "x")},
		{Ref: "V2", Kind: graph.Valve, Pins: pins("s", "b")},
	}}
	c.Sort()
	ext := map[string]geom.Rect{
		"C1": geom.R(0, 0, 4, 2), "S1": geom.R(5, 0, 8, 2), "V1": geom.R(20, 0, 24, 4),
		"R1": geom.R(30, 0, 34, 2), "T1": geom.R(40, 0, 44, 4), "V2": geom.R(50, 0, 54, 4),
	}
	s := &Sheet{Circuit: c, Frames: []Frame{
		{Title: "ST1 amplifier", Parts: []string{"V1"}},
		{Title: "ST2 rectifier", Parts: []string{"T1", "V2"}},
	}}
	got := map[string]int{}
	for i, b := range blocks(s, ext) {
		for _, r := range b.refs {
			got[r] = i
		}
	}
	if got["C1"] != got["T1"] || got["S1"] != got["T1"] {
		t.Errorf("C1 and S1 on stretches %d and %d, T1's is %d: want them with T1", got["C1"], got["S1"], got["T1"])
	}
	if got["R1"] == got["V1"] || got["R1"] == got["T1"] {
		t.Errorf("R1, wired to two stages, joined stretch %d", got["R1"])
	}
}

// TestPlacementsKeptChangeNothing: a row's layout that starts from the
// placement its fit test made (flow.tooBig) is the same as one placed
// afresh, which is what a placement let go to save memory costs (paged.go,
// flow.go): every single-stretch row of a chain of stages framed in
// halves, in the faded and full views (the reduced view's rows have no
// fit test by placement), laid out both ways. It checks that the fit test
// kept placements to start from.
func TestPlacementsKeptChangeNothing(t *testing.T) {
	defer func() { placementsOff = false }()
	for _, view := range []View{Faded, Full} {
		kept, fresh := rowLayouts(t, view, false), rowLayouts(t, view, true)
		if kept == nil {
			t.Errorf("view %d: no row started from a placement its fit test kept; the test tests nothing", view)
		}
		if !reflect.DeepEqual(kept, fresh) {
			t.Errorf("view %d: rows laid out from kept placements differ from rows placed afresh", view)
		}
	}
}

// rowLayouts lays out each single-stretch row of splitChainSheet(6) on A4
// after its fit test, with placementsOff set to off; nil when no row's
// sheet held a placement to start from (with off clear).
func rowLayouts(t *testing.T, view View, off bool) []*layout.Result {
	t.Helper()
	placementsOff = off
	s := splitChainSheet(6)
	s.View = view
	cfg := Config{Page: &Papers[0]}
	cw, ch := cfg.Page.content()
	bs := blocks(s, cfg.extents(s))
	f := newFlow(cfg, s, bs, nil)
	var out []*layout.Result
	held := false
	for a := range bs {
		f.tooBig(a, a+1, cw, ch)
		sh, _ := f.rowSheets(a, a+1)
		held = held || sh.placed != nil
		r, err := f.layout(a, a+1)
		if err != nil {
			t.Fatal(err)
		}
		out = append(out, r)
	}
	if !held && !off {
		return nil
	}
	return out
}

// splitChainSheet is chainSheet with each stage framed in two (its grid
// coupling, then its valve and anode and cathode parts): stretches narrow
// enough that rows of several are placed, judged and laid out.
func splitChainSheet(stages int) *Sheet {
	s := chainSheet(stages)
	var fs []Frame
	for _, f := range s.Frames {
		fs = append(fs, Frame{Title: f.Title + " grid", Parts: f.Parts[:2]}, Frame{Title: f.Title, Parts: f.Parts[2:]})
	}
	s.Frames = fs
	return s
}
