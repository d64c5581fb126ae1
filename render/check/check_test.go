package check

import (
	"strings"
	"testing"

	"pare/render/geom"
)

// Hand-worked geometry: each case is drawn on squared paper first, the
// expected findings counted by eye (independent of the layout code).

func sym(ref string, x0, y0, x1, y1 float64, pins ...geom.Pin) geom.Symbol {
	return geom.Symbol{Ref: ref, Box: geom.Rect{X0: x0, Y0: y0, X1: x1, Y1: y1}, Pins: pins}
}

func pin(name, net string, x, y float64, d geom.Dir) geom.Pin {
	return geom.Pin{Name: name, Net: net, At: geom.Pt{X: x, Y: y}, Dir: d}
}

func seg(x0, y0, x1, y1 float64) geom.Seg {
	return geom.Seg{A: geom.Pt{X: x0, Y: y0}, B: geom.Pt{X: x1, Y: y1}}
}

func withKind(s geom.Symbol, kind string) geom.Symbol {
	s.Kind = kind
	return s
}

func wire(net string, segs ...geom.Seg) geom.Wire {
	return geom.Wire{Net: net, Segs: segs, Faded: make([]bool, len(segs))}
}

// two resistors R1 (0..4) and R2 (10..14) on y=0, joined by net n from 4 to 10
func clean() *geom.Sheet {
	return &geom.Sheet{
		Symbols: []geom.Symbol{
			sym("R1", 0, -0.6, 4, 0.6, pin("1", "a", 0, 0, geom.Left), pin("2", "n", 4, 0, geom.Right)),
			sym("R2", 10, -0.6, 14, 0.6, pin("1", "n", 10, 0, geom.Left), pin("2", "b", 14, 0, geom.Right)),
		},
		Wires: []geom.Wire{wire("n", seg(4, 0, 10, 0))},
	}
}

func TestCleanSheet(t *testing.T) {
	r := Measure(clean())
	if p := r.Problems(); len(p) != 0 {
		t.Fatalf("clean sheet has problems: %v", p)
	}
	if r.Crossings != 0 || r.Bends != 0 {
		t.Errorf("crossings %d bends %d, want 0 0", r.Crossings, r.Bends)
	}
}

func TestFindings(t *testing.T) {
	cases := []struct {
		name  string
		edit  func(g *geom.Sheet)
		want  string // a word the finding must contain, "" for none
		field func(r *Report) []string
	}{
		{"symbols overlap", func(g *geom.Sheet) {
			g.Symbols = append(g.Symbols, sym("C1", 3, -1, 5, 1))
		}, "overlaps", func(r *Report) []string { return r.SymbolOverlaps }},
		{"touching boxes are not an overlap", func(g *geom.Sheet) {
			g.Symbols = append(g.Symbols, sym("C1", 4, 0.6, 6, 2))
		}, "", func(r *Report) []string { return r.SymbolOverlaps }},
		{"wire through a symbol", func(g *geom.Sheet) {
			g.Wires = append(g.Wires, wire("x", seg(2, -3, 2, 3)))
		}, "runs through symbol R1", func(r *Report) []string { return r.WireThrough }},
		{"label on a wire", func(g *geom.Sheet) {
			g.Labels = append(g.Labels, geom.Label{Lines: []string{"C9 1n"}, Box: geom.Rect{X0: 6, Y0: -0.5, X1: 8, Y1: 0.5}})
		}, "touches label", func(r *Report) []string { return r.LabelOverlaps }},
		{"label on a label", func(g *geom.Sheet) {
			g.Labels = append(g.Labels,
				geom.Label{Lines: []string{"A"}, Box: geom.Rect{X0: 0, Y0: 2, X1: 3, Y1: 3}},
				geom.Label{Lines: []string{"B"}, Box: geom.Rect{X0: 2, Y0: 2.5, X1: 5, Y1: 3.5}})
		}, "overlaps label", func(r *Report) []string { return r.LabelOverlaps }},
		{"broken net", func(g *geom.Sheet) {
			g.Wires[0] = wire("n", seg(4, 0, 6, 0), seg(8, 0, 10, 0))
		}, "pieces", func(r *Report) []string { return r.Connectivity }},
		{"net with a flag on each piece is joined", func(g *geom.Sheet) {
			g.Wires[0] = wire("n", seg(4, 0, 6, 0), seg(8, 0, 10, 0))
			g.Locals = []geom.Local{
				{Kind: geom.LocalFlag, Net: "n", At: geom.Pt{X: 6, Y: 0}, Box: geom.Rect{X0: 6, Y0: 2, X1: 7, Y1: 3}},
				{Kind: geom.LocalFlag, Net: "n", At: geom.Pt{X: 8, Y: 0}, Box: geom.Rect{X0: 7.5, Y0: 2, X1: 8.5, Y1: 3}},
			}
		}, "", func(r *Report) []string { return r.Connectivity }},
		{"wire onto another net's pin", func(g *geom.Sheet) {
			g.Wires = append(g.Wires, wire("m", seg(14, 0, 14, 3)))
		}, "touches pin R2.2", func(r *Report) []string { return r.Connectivity }},
		{"wires of two nets overlap", func(g *geom.Sheet) {
			g.Wires = append(g.Wires, wire("m", seg(5, 0, 9, 0)))
		}, "overlap", func(r *Report) []string { return r.Connectivity }},
		{"T onto another net", func(g *geom.Sheet) {
			g.Wires = append(g.Wires, wire("m", seg(7, 0, 7, 3)))
		}, "touch", func(r *Report) []string { return r.Connectivity }},
		{"junction without a dot", func(g *geom.Sheet) {
			g.Symbols = append(g.Symbols, sym("C1", 6, 4, 8, 8, pin("1", "n", 7, 4, geom.Up)))
			g.Wires = append(g.Wires, wire("n", seg(7, 0, 7, 4)))
		}, "no dot", func(r *Report) []string { return r.Junctions }},
		{"four-way junction", func(g *geom.Sheet) {
			g.Symbols = append(g.Symbols, sym("C1", 6, 4, 8, 8, pin("1", "n", 7, 4, geom.Up)),
				sym("C2", 6, -8, 8, -4, pin("1", "n", 7, -4, geom.Down)))
			g.Wires = append(g.Wires, wire("n", seg(7, 0, 7, 4)), wire("n", seg(7, -4, 7, 0)))
			g.Dots = []geom.Pt{{X: 7, Y: 0}}
		}, "four-way", func(r *Report) []string { return r.Junctions }},
		// n runs y=0 from x=4 to 10; a wire of m one step above it for 4
		// steps reads as a double line, two steps above it does not
		{"wires side by side", func(g *geom.Sheet) {
			g.Wires = append(g.Wires, wire("m", seg(5, -1, 9, -1)))
		}, "run 1 apart for 4", func(r *Report) []string { return r.CloseWires }},
		{"wires two steps apart", func(g *geom.Sheet) {
			g.Wires = append(g.Wires, wire("m", seg(5, -2, 9, -2)))
		}, "", func(r *Report) []string { return r.CloseWires }},
		{"a short jog beside a wire", func(g *geom.Sheet) {
			g.Wires = append(g.Wires, wire("m", seg(5, -1, 7, -1)))
		}, "", func(r *Report) []string { return r.CloseWires }},
		{"wire along a frame edge", func(g *geom.Sheet) {
			g.Frames = []geom.Frame{{Box: geom.Rect{X0: -1.5, Y0: -2.5, X1: 15.5, Y1: 0.5}}}
		}, "runs 0.5 from the edge", func(r *Report) []string { return r.FrameHugs }},
		{"frame with room round its wires", func(g *geom.Sheet) {
			g.Frames = []geom.Frame{{Box: geom.Rect{X0: -1.5, Y0: -2.5, X1: 15.5, Y1: 1.5}}}
		}, "", func(r *Report) []string { return append(r.FrameHugs, r.FrameCuts...) }},
		{"frame edge through a label", func(g *geom.Sheet) {
			g.Labels = append(g.Labels, geom.Label{Lines: []string{"C13 100u"}, Box: geom.Rect{X0: 6, Y0: 2, X1: 9, Y1: 3.2}})
			g.Frames = []geom.Frame{{Box: geom.Rect{X0: 7.5, Y0: -2.5, X1: 15.5, Y1: 4.5}}}
		}, "runs through label \"C13 100u\"", func(r *Report) []string { return r.FrameCuts }},
		{"frame edge through a symbol", func(g *geom.Sheet) {
			g.Frames = []geom.Frame{{Box: geom.Rect{X0: 2.5, Y0: -2.5, X1: 15.5, Y1: 2.5}}}
		}, "runs through symbol R1", func(r *Report) []string { return r.FrameCuts }},
		{"frame title inside its frame", func(g *geom.Sheet) {
			title := geom.Label{Owner: "frame:S1", Lines: []string{"S1"}, Box: geom.Rect{X0: 0, Y0: -3, X1: 2, Y1: -2}}
			g.Labels = append(g.Labels, title)
			g.Frames = []geom.Frame{{Box: geom.Rect{X0: -1.5, Y0: -3.5, X1: 15.5, Y1: 2.5}, Title: title}}
		}, "", func(r *Report) []string { return r.FrameCuts }},
		// a reader's complaints (render/check/reader.go): parallel wires of
		// two nets closer than two steps over any shared stretch; two nets in
		// line across a short empty gap
		{"a short jog one step beside a wire reads as joined", func(g *geom.Sheet) {
			g.Wires = append(g.Wires, wire("m", seg(5, -1, 7, -1)))
		}, "run 1 apart for 2", func(r *Report) []string { return r.Beside }},
		{"half a step apart", func(g *geom.Sheet) {
			g.Wires = append(g.Wires, wire("m", seg(5, 1.5, 9, 1.5)))
		}, "run 1.5 apart for 4", func(r *Report) []string { return r.Beside }},
		{"two steps apart reads as two wires", func(g *geom.Sheet) {
			g.Wires = append(g.Wires, wire("m", seg(5, -2, 9, -2)))
		}, "", func(r *Report) []string { return r.Beside }},
		{"parallel but not side by side", func(g *geom.Sheet) {
			g.Wires = append(g.Wires, wire("m", seg(10, -1, 12, -1)))
		}, "", func(r *Report) []string { return r.Beside }},
		{"a wire in line with another across an empty gap", func(g *geom.Sheet) {
			g.Wires = append(g.Wires, wire("m", seg(-9, 6, -4, 6)), wire("n", seg(4, 0, 4, 6), seg(4, 6, 0.5, 6)))
			g.Dots = nil
		}, "lie in line 4.5 apart", func(r *Report) []string { return r.InLine }},
		{"a part in the gap", func(g *geom.Sheet) {
			g.Wires = append(g.Wires, wire("a", seg(-3, 0, 0, 0)), wire("b", seg(14, 0, 17, 0)))
		}, "", func(r *Report) []string { return r.InLine }},
		{"a gap long enough to read as two wires", func(g *geom.Sheet) {
			g.Wires = append(g.Wires, wire("m", seg(-12, 6, -6, 6)), wire("n", seg(4, 0, 4, 6), seg(4, 6, 0.5, 6)))
		}, "", func(r *Report) []string { return r.InLine }},
		// net p runs along y=20 and turns down to C1's top pin at (24,21);
		// net q starts a step further along the same line (the screen and
		// decoupling lines that met end to end at a capacitor)
		{"a wire starting a step past another's turn to a part", func(g *geom.Sheet) {
			g.Symbols = append(g.Symbols, sym("C1", 23.4, 21, 24.6, 25, pin("1", "p", 24, 21, geom.Up)))
			g.Wires = append(g.Wires, wire("p", seg(18, 20, 24, 20), seg(24, 20, 24, 21)), wire("q", seg(25, 20, 30, 20)))
		}, "end in line 1 apart beside a part", func(r *Report) []string { return r.EndsInLine }},
		{"three steps past another's turn to a part", func(g *geom.Sheet) {
			g.Symbols = append(g.Symbols, sym("C1", 23.4, 21, 24.6, 25, pin("1", "p", 24, 21, geom.Up)))
			g.Wires = append(g.Wires, wire("p", seg(18, 20, 24, 20), seg(24, 20, 24, 21)), wire("q", seg(27, 20, 30, 20)))
		}, "", func(r *Report) []string { return r.EndsInLine }},
		{"a part across the line between two wire ends", func(g *geom.Sheet) {
			g.Wires = append(g.Wires, wire("a", seg(-3, 0, 0, 0)), wire("b", seg(14, 0, 17, 0)))
		}, "", func(r *Report) []string { return r.EndsInLine }},
		// net n branches down at (6,0); m crosses n at x=7, a step from
		// the dot (the wire that crossed a base line near its junction)
		{"a crossing a step from a junction dot", func(g *geom.Sheet) {
			g.Wires[0].Segs = append(g.Wires[0].Segs, seg(6, 0, 6, 3))
			g.Dots = []geom.Pt{{X: 6, Y: 0}}
			g.Wires = append(g.Wires, wire("m", seg(7, -3, 7, 2)))
		}, "cross at (7,0), 1 from a junction dot at (6,0)", func(r *Report) []string { return r.NearDots }},
		{"a crossing two steps from a junction dot", func(g *geom.Sheet) {
			g.Wires[0].Segs = append(g.Wires[0].Segs, seg(6, 0, 6, 3))
			g.Dots = []geom.Pt{{X: 6, Y: 0}}
			g.Wires = append(g.Wires, wire("m", seg(8, -3, 8, 2)))
		}, "", func(r *Report) []string { return r.NearDots }},
		// net n branches down at (6,0), net m at (6,1) a step below it on
		// the same vertical (review20 a04's HT dot over the grid line's)
		{"two nets' junction dots a step apart on one line", func(g *geom.Sheet) {
			g.Wires[0].Segs = append(g.Wires[0].Segs, seg(6, 0, 6, -3))
			g.Wires = append(g.Wires, wire("m", seg(3, 1, 9, 1), seg(6, 1, 6, 4)))
			g.Dots = []geom.Pt{{X: 6, Y: 0}, {X: 6, Y: 1}}
		}, "junction dots of n at (6,0) and of m at (6,1), 1 apart on one line", func(r *Report) []string { return r.DotPairs }},
		{"two nets' junction dots two steps apart", func(g *geom.Sheet) {
			g.Wires[0].Segs = append(g.Wires[0].Segs, seg(6, 0, 6, -3))
			g.Wires = append(g.Wires, wire("m", seg(3, 2, 9, 2), seg(6, 2, 6, 4)))
			g.Dots = []geom.Pt{{X: 6, Y: 0}, {X: 6, Y: 2}}
		}, "", func(r *Report) []string { return r.DotPairs }},
		// a flag P1 on net s, its tip at 27,0, and a wire of m turning just
		// beyond it (the extension socket that read as feeding the tone
		// control)
		{"a wire one step past a flag's tip", func(g *geom.Sheet) {
			g.Symbols = append(g.Symbols, sym("P1", 20, -0.7, 27, 0.7, pin("1", "s", 20, 0, geom.Left)))
			g.Wires = append(g.Wires, wire("m", seg(28, -3, 28, 0), seg(28, 0, 32, 0)))
		}, "P1's end (27,0) is 1 from a wire of m", func(r *Report) []string { return r.EndsNear }},
		{"a wire two steps past a flag's tip", func(g *geom.Sheet) {
			g.Symbols = append(g.Symbols, sym("P1", 20, -0.7, 27, 0.7, pin("1", "s", 20, 0, geom.Left)))
			g.Wires = append(g.Wires, wire("m", seg(29, -3, 29, 0), seg(29, 0, 32, 0)))
		}, "", func(r *Report) []string { return r.EndsNear }},
		{"the flag's own net beside its tip", func(g *geom.Sheet) {
			g.Symbols = append(g.Symbols, sym("P1", 20, -0.7, 27, 0.7, pin("1", "s", 20, 0, geom.Left)))
			g.Wires = append(g.Wires, wire("s", seg(28, -3, 28, 0)))
		}, "", func(r *Report) []string { return r.EndsNear }},
		// the same flag, and net m's run starting in line beyond its tip (the
		// tone control's feed two steps past the extension socket's flag):
		// the flag's body is its net's line (flagBodies)
		{"a wire in line two steps past a flag's tip", func(g *geom.Sheet) {
			g.Symbols = append(g.Symbols, sym("P1", 20, -0.7, 27, 0.7, pin("1", "s", 20, 0, geom.Left)))
			g.Wires = append(g.Wires, wire("m", seg(29, -3, 29, 0), seg(29, 0, 32, 0)))
		}, "wires of m (29,0)-(32,0) and s (20,0)-(27,0) lie in line 2 apart", func(r *Report) []string { return r.InLine }},
		{"a wire in line six steps past a flag's tip", func(g *geom.Sheet) {
			g.Symbols = append(g.Symbols, sym("P1", 20, -0.7, 27, 0.7, pin("1", "s", 20, 0, geom.Left)))
			g.Wires = append(g.Wires, wire("m", seg(33, -3, 33, 0), seg(33, 0, 36, 0)))
		}, "", func(r *Report) []string { return r.InLine }},
		{"the flag's own net in line past its tip", func(g *geom.Sheet) {
			g.Symbols = append(g.Symbols, sym("P1", 20, -0.7, 27, 0.7, pin("1", "s", 20, 0, geom.Left)))
			g.Wires = append(g.Wires, wire("s", seg(29, -3, 29, 0), seg(29, 0, 32, 0)))
		}, "", func(r *Report) []string { return r.InLine }},
		{"a wire in line before a flag's pin is in line with a pin", func(g *geom.Sheet) {
			g.Symbols = append(g.Symbols, sym("P1", 20, 19.3, 27, 20.7, pin("1", "s", 20, 20, geom.Left)))
			g.Wires = append(g.Wires, wire("m", seg(14, 20, 17, 20)), wire("s", seg(20, 20, 20, 17)))
		}, "", func(r *Report) []string { return r.InLine }},
		{"a wire one step beside a flag's body is no wire beside", func(g *geom.Sheet) {
			g.Symbols = append(g.Symbols, sym("P1", 20, -0.7, 27, 0.7, pin("1", "s", 20, 0, geom.Left)))
			g.Wires = append(g.Wires, wire("m", seg(21, 1, 26, 1)))
		}, "", func(r *Report) []string { return r.Beside }},
		// C1 upright at x=24, its earth symbol under it (y 25..27); net p
		// leaves its top pin, runs left, down its side and under the earth
		// two steps below it (review19 b02's VC1b): three sides of the
		// part with its earth, two of the part alone
		{"a wire round a part and its earth symbol", func(g *geom.Sheet) {
			g.Symbols = append(g.Symbols, withKind(sym("C1", 23.4, 21, 24.6, 25, pin("1", "p", 24, 21, geom.Up), pin("2", "gnd", 24, 25, geom.Down)), "capacitor"))
			g.Locals = append(g.Locals, geom.Local{Net: "gnd", Owner: "C1", Pin: "2", Stub: []geom.Seg{seg(24, 25, 24, 26)}, At: geom.Pt{X: 24, Y: 26}, Box: geom.Rect{X0: 23, Y0: 25, X1: 25, Y1: 27}})
			g.Wires = append(g.Wires, wire("p", seg(24, 21, 24, 20), seg(26, 20, 21, 20), seg(21, 20, 21, 29), seg(21, 29, 27, 29)))
		}, "wire of p runs on the bottom, left, top of part C1", func(r *Report) []string { return r.WireBoxes }},
		{"another part's earth symbol is not the part's", func(g *geom.Sheet) {
			g.Symbols = append(g.Symbols, withKind(sym("C1", 23.4, 21, 24.6, 25, pin("1", "p", 24, 21, geom.Up), pin("2", "gnd", 24, 25, geom.Down)), "capacitor"))
			g.Locals = append(g.Locals, geom.Local{Net: "gnd", Owner: "C9", Pin: "2", Stub: []geom.Seg{seg(24, 25, 24, 26)}, At: geom.Pt{X: 24, Y: 26}, Box: geom.Rect{X0: 23, Y0: 25, X1: 25, Y1: 27}})
			g.Wires = append(g.Wires, wire("p", seg(24, 21, 24, 20), seg(26, 20, 21, 20), seg(21, 20, 21, 29), seg(21, 29, 27, 29)))
		}, "", func(r *Report) []string { return r.WireBoxes }},
		{"a wire round the sheet", func(g *geom.Sheet) {
			g.Frames = []geom.Frame{{Box: geom.Rect{X0: 9, Y0: -2, X1: 15, Y1: 2}, Parts: []string{"R2"}}}
			g.Wires[0].Segs = []geom.Seg{seg(4, 0, 4, 10), seg(4, 10, 10, 10), seg(10, 10, 10, 0)}
		}, "4.3 times its stage's width 6", func(r *Report) []string { return r.LongWires }},
		{"stray dot", func(g *geom.Sheet) {
			g.Dots = []geom.Pt{{X: 6, Y: 0}}
		}, "not on a junction", func(r *Report) []string { return r.Junctions }},
	}
	for _, tc := range cases {
		g := clean()
		tc.edit(g)
		got := tc.field(Measure(g))
		switch {
		case tc.want == "" && len(got) > 0:
			t.Errorf("%s: unexpected %v", tc.name, got)
		case tc.want != "" && (len(got) == 0 || !strings.Contains(strings.Join(got, "\n"), tc.want)):
			t.Errorf("%s: got %v, want a finding with %q", tc.name, got, tc.want)
		}
	}
}

// A wire of another net crossing n at (7,0) is one crossing, not a touch;
// an L-shaped wire has one bend.
func TestCrossingsAndBends(t *testing.T) {
	g := clean()
	g.Symbols = append(g.Symbols,
		sym("C1", 6, -8, 8, -4, pin("1", "m", 7, -4, geom.Down)),
		sym("C2", 16, 4, 18, 8, pin("1", "m", 17, 4, geom.Up)))
	g.Wires = append(g.Wires, wire("m", seg(7, -4, 7, 2), seg(7, 2, 17, 2), seg(17, 2, 17, 4)))
	g.Frames = []geom.Frame{{Box: geom.Rect{X0: 5, Y0: -2, X1: 9, Y1: 1}}}
	r := Measure(g)
	if p := r.Problems(); len(p) != 0 {
		t.Fatalf("problems: %v", p)
	}
	if r.Crossings != 1 || r.FrameCrossings[0] != 1 {
		t.Errorf("crossings %d (frame %v), want 1 (frame [1])", r.Crossings, r.FrameCrossings)
	}
	if r.Bends != 2 || r.MaxBends != 2 {
		t.Errorf("bends %d max %d, want 2 2", r.Bends, r.MaxBends)
	}
}

// TestTextHeights: at 2.94 mm a grid unit (A4 at pare's page scale), a
// label prints 2.94 mm and a small line 2.5 mm (0.85 of it); at 2 mm a
// unit both are under the 2.5 mm IEC 61082-1 and ISO 3098 allow.
func TestTextHeights(t *testing.T) {
	g := &geom.Sheet{Labels: []geom.Label{{Lines: []string{"R1 4k7"}}, {Lines: []string{"gang tune"}, Small: true}}}
	if p := TextHeights(g, 2.5/0.85, 0.85, 2.5); len(p) != 0 {
		t.Errorf("at 2.94 mm a unit: %q", p)
	}
	if p := TextHeights(g, 2, 0.85, 2.5); len(p) != 2 {
		t.Errorf("at 2 mm a unit: %q, want both labels", p)
	}
}

// TestSmallTextIsAProblem: a page of paper (PageMM set) whose labels print
// under the 2.5 mm of IEC 61082-1 and ISO 3098 is a fatal finding of the
// checker; the same sheet at the paper's scale (2.94 mm a unit, 2.5 mm
// small text), or with no paper (PageMM 0: no size on paper), is not.
func TestSmallTextIsAProblem(t *testing.T) {
	cases := []struct {
		pageMM float64
		want   int
	}{
		{0, 0}, {2.5 / 0.85, 0}, {2.2, 2}, {1.5, 2},
	}
	for _, tc := range cases {
		g := &geom.Sheet{Labels: []geom.Label{{Lines: []string{"R1 4k7"}, Box: geom.Rect{X1: 6, Y1: 1}},
			{Lines: []string{"gang tune"}, Small: true, Box: geom.Rect{Y0: 5, X1: 9, Y1: 6}}}, PageMM: tc.pageMM}
		r := Measure(g)
		if len(r.SmallText) != tc.want || len(r.Problems()) != tc.want {
			t.Errorf("%g mm a unit: small text %q, problems %q; want %d", tc.pageMM, r.SmallText, r.Problems(), tc.want)
		}
	}
}
