package layout

import (
	"slices"
	"strings"
	"testing"

	"pare/graph"
	"pare/render/check"
	"pare/render/geom"
	"pare/render/symbol"
)

// Small hand-made circuits for the placement tests. Invented values; only
// their topology matters here.
const (
	// rcLadder: two RC sections in a row, the signal from in to out.
	rcLadder = `title = "ladder"
band = "1k..2k"
inputs = ["in"]
outputs = ["out"]
[parts]
R1 = { r = "1k", pins = ["in", "n1"] }
C1 = { c = "10n", pins = ["n1", "gnd"] }
R2 = { r = "1k", pins = ["n1", "out"] }
C2 = { c = "10n", pins = ["out", "gnd"] }
`
	// triodeStage: a common-cathode triode with grid capacitor and leak,
	// bypassed cathode resistor, anode load and output coupling.
	triodeStage = `title = "stage"
band = "20..20k"
inputs = ["in"]
outputs = ["out"]
[nets]
ht = { role = "supply", volts = 250, label = "HT +250 V" }
[parts]
C1 = { c = "10n", pins = ["in", "g"] }
R1 = { r = "1M", pins = ["g", "gnd"] }
V1 = { valve = "triode", pins = { a = "a", g1 = "g", k = "k" } }
R2 = { r = "1k5", pins = ["k", "gnd"] }
C3 = { c = "25u", pins = ["k", "gnd"] }
R3 = { r = "100k", pins = ["ht", "a"] }
C2 = { c = "22n", pins = ["a", "out"] }
`
	// tunedCircuit: a coil and capacitor across the same two nets, fed
	// through a resistor.
	tunedCircuit = `title = "tank"
band = "500k..1.6M"
inputs = ["in"]
outputs = ["tank"]
[parts]
R1 = { r = "10k", pins = ["in", "tank"] }
L1 = { l = "200u", pins = ["tank", "gnd"] }
C1 = { c = "100p", pins = ["tank", "gnd"] }
`
	// paddedTank: a cathode-tapped Hartley oscillator whose tank
	// capacitance is a padder in series with the tuning capacitor.
	paddedTank = `title = "padded"
band = "1M..2M"
inputs = ["in"]
outputs = ["out"]
[parts]
C1 = { c = "10p", pins = ["in", "g"] }
R1 = { r = "47k", pins = ["g", "gnd"] }
C2 = { c = "100p", pins = ["g", "tank"] }
V1 = { valve = "triode", pins = { a = "out", g1 = "g", k = "k" } }
R2 = { r = "10k", pins = ["out", "gnd"] }
L1 = { l = "128u", tap = 0.1, pins = ["tank", "k", "gnd"] }
C3 = { c = "380p", pins = ["tank", "pad"] }
VC1 = { c = "53p..406p", pins = ["pad", "gnd"], gang = "tune" }
`
	// paddedMixer: a self-oscillating pentode mixer, the signal on its grid
	// through a small capacitor, the cathode on a tap of the oscillator coil
	// (written cold end first), the padder between the coil's hot end and the
	// tuning capacitor, an IF transformer in the anode.
	paddedMixer = `title = "padded mixer"
band = "1M..2M"
inputs = ["in"]
outputs = ["if"]
[nets]
ht = { role = "supply", volts = 250, label = "HT +250 V" }
[parts]
C1 = { c = "10p", pins = ["in", "g"] }
C2 = { c = "100p", pins = ["tank", "g"] }
R1 = { r = "47k", pins = ["g", "gnd"] }
L1 = { l = "127u", tap = 0.12, pins = ["gnd", "k", "tank"] }
C3 = { c = "380p", pins = ["tank", "pad"] }
VC1 = { c = "47p..400p", pins = ["pad", "gnd"], gang = "tune" }
V1 = { valve = "pentode", pins = { a = "a", g1 = "g", g2 = "nc", g3 = "nc", k = "k" } }
T1 = { windings = { p = "1m", s = "1m" }, k = 0.01, pins = { p1 = "a", p2 = "ht", s1 = "if", s2 = "gnd" } }
C4 = { c = "100p", pins = ["a", "ht"] }
C5 = { c = "100p", pins = ["if", "gnd"] }
`
	// coupledStages: a transformer between two transistors, a pot and a
	// switch on the output, to give the placement a mix of kinds.
	coupledStages = `title = "coupled"
band = "400k..500k"
inputs = ["in"]
outputs = ["out"]
[nets]
vcc = { role = "supply", volts = 9, label = "+9 V" }
[parts]
Q1 = { bjt = "npn", pins = { b = "in", c = "p1", e = "gnd" } }
T1 = { windings = { p = "1m", s = "100u" }, k = 0.9, pins = { p1 = "p1", p2 = "vcc", s1 = "b2", s2 = "gnd" } }
Q2 = { bjt = "npn", pins = { b = "b2", c = "c2", e = "e2" } }
R2 = { r = "470", pins = ["e2", "gnd"] }
R3 = { r = "4k7", pins = ["vcc", "c2"] }
RV1 = { pot = "10k", set = 0.5, pins = ["c2", "w", "gnd"] }
S1 = { switch = 2, set = 1, closes = ["c-1", "c-2"], pins = { c = "w", "1" = "out", "2" = "gnd" } }
`
)

func parse(t *testing.T, src string) *graph.Circuit {
	t.Helper()
	c, err := graph.Parse("test.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	return c
}

func symbolOf(t *testing.T, g *geom.Sheet, ref string) geom.Symbol {
	t.Helper()
	for _, s := range g.Symbols {
		if s.Ref == ref {
			return s
		}
	}
	t.Fatalf("no symbol %s on the sheet", ref)
	return geom.Symbol{}
}

// TestLayersFollowTheSignal: each pair's first part stands left of its
// second. Signal flows left to right and parts are layered by their
// distance from the input (common practice; layering after Sugiyama,
// Tagawa and Toda 1981); the grid leak stands in its own column before its
// valve and the load after it (common practice, /work/shared notes on stage
// templates: grid capacitor and leak between the input and the grid).
func TestLayersFollowTheSignal(t *testing.T) {
	for _, tc := range []struct {
		name, src string
		before    [][2]string // left, right
	}{
		{"ladder", rcLadder, [][2]string{{"@in:in", "R1"}, {"R1", "R2"}, {"R1", "C1"}, {"C1", "C2"}, {"R2", "@out:out"}}},
		{"stage", triodeStage, [][2]string{{"@in:in", "C1"}, {"C1", "R1"}, {"R1", "V1"}, {"V1", "C2"}, {"V1", "R3"}, {"C2", "@out:out"}}},
		{"coupled", coupledStages, [][2]string{{"Q1", "T1"}, {"T1", "Q2"}, {"Q2", "RV1"}, {"RV1", "S1"}}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			res, err := Layout(parse(t, tc.src), Options{})
			if err != nil {
				t.Fatal(err)
			}
			for _, p := range tc.before {
				a, b := symbolOf(t, &res.Geom, p[0]), symbolOf(t, &res.Geom, p[1])
				if a.Box.X1 > b.Box.X0 {
					t.Errorf("%s (x %g..%g) does not stand left of %s (x %g..%g)", p[0], a.Box.X0, a.Box.X1, p[1], b.Box.X0, b.Box.X1)
				}
			}
		})
	}
}

// TestCathodePartsUnderTheValve: the bypassed cathode resistor sits below
// its valve, in the valve's column (common practice: "its bypassed
// cathode/emitter resistor sits below").
func TestCathodePartsUnderTheValve(t *testing.T) {
	res, err := Layout(parse(t, triodeStage), Options{})
	if err != nil {
		t.Fatal(err)
	}
	v := symbolOf(t, &res.Geom, "V1")
	for _, ref := range []string{"R2", "C3"} {
		s := symbolOf(t, &res.Geom, ref)
		if s.Box.Y0 <= v.Box.Y1 {
			t.Errorf("%s (y from %g) is not below V1 (y to %g)", ref, s.Box.Y0, v.Box.Y1)
		}
		// in the valve's column: the two boxes overlap in x or nearly so
		if s.Box.X1 < v.Box.X0-4 || s.Box.X0 > v.Box.X1+4 {
			t.Errorf("%s (x %g..%g) is not under V1 (x %g..%g)", ref, s.Box.X0, s.Box.X1, v.Box.X0, v.Box.X1)
		}
	}
}

// TestRailsUpGroundsDown: a pin on ground points down, a pin on a supply
// points up, where the part has a choice (common practice: higher
// potential up, lower down).
func TestRailsUpGroundsDown(t *testing.T) {
	c := parse(t, triodeStage)
	res, err := Layout(c, Options{})
	if err != nil {
		t.Fatal(err)
	}
	for _, ref := range []string{"R1", "R2", "C3", "R3"} {
		for _, p := range symbolOf(t, &res.Geom, ref).Pins {
			switch c.RoleOf(p.Net) {
			case graph.Ground:
				if p.Dir != geom.Down {
					t.Errorf("%s.%s on ground points %v, want down", ref, p.Name, p.Dir)
				}
			case graph.Supply:
				if p.Dir != geom.Up {
					t.Errorf("%s.%s on the supply points %v, want up", ref, p.Name, p.Dir)
				}
			}
		}
	}
	// and every ground or supply pin ends in a local symbol, not a wire
	locals := map[string]bool{}
	for _, l := range res.Geom.Locals {
		locals[l.Owner+"."+l.Pin] = true
	}
	for _, s := range res.Geom.Symbols {
		for _, p := range s.Pins {
			if c.RoleOf(p.Net).IsACGround() && !locals[s.Ref+"."+p.Name] {
				t.Errorf("%s.%s on %s has no local symbol", s.Ref, p.Name, p.Net)
			}
		}
	}
}

// TestTankSideBySide: a tuned circuit's L and C stand side by side, both
// vertical, level with each other (common practice: "A tuned circuit's L
// and C stand side by side, both vertical, joined at top and bottom").
func TestTankSideBySide(t *testing.T) {
	res, err := Layout(parse(t, tunedCircuit), Options{})
	if err != nil {
		t.Fatal(err)
	}
	l, c := symbolOf(t, &res.Geom, "L1"), symbolOf(t, &res.Geom, "C1")
	for _, s := range []geom.Symbol{l, c} {
		if s.Box.H() <= s.Box.W() {
			t.Errorf("%s is not upright: %g wide, %g high", s.Ref, s.Box.W(), s.Box.H())
		}
	}
	if l.Box.X1 > c.Box.X0 {
		t.Errorf("L1 (x to %g) not left of C1 (x from %g): the tank reads L, C", l.Box.X1, c.Box.X0)
	}
	if gap := c.Box.X0 - l.Box.X1; gap > 6 {
		t.Errorf("L1 and C1 stand %g apart, not side by side", gap)
	}
	top := func(s geom.Symbol) float64 {
		for _, p := range s.Pins {
			if p.Net == "tank" {
				return p.At.Y
			}
		}
		return -1e9
	}
	if top(l) != top(c) {
		t.Errorf("hot ends at y %g and %g, want level", top(l), top(c))
	}
}

// TestPadderBesideTheCoil: a padder in series with the tuning capacitor
// stands beside the coil, its top level with the coil's hot end and joined
// to it by one straight wire, the tuning capacitor straight under it (common
// practice: a tuned circuit's L and C side by side, joined at the top),
// whichever way round the coil's pins are written and whether the tap
// leaves on the side the pair would take. In the mixer the padder, between
// two signal nets, once lay along the signal path, its tank reached by a
// loop round the stage.
func TestPadderBesideTheCoil(t *testing.T) {
	coldFirst := strings.Replace(paddedTank, `pins = ["tank", "k", "gnd"]`, `pins = ["gnd", "k", "tank"]`, 1)
	for _, tc := range []struct {
		name, src, hot string
		untangle       bool
	}{
		{"hot end first", paddedTank, "L1.1", true},
		{"cold end first", coldFirst, "L1.2", true},
		{"mixer", paddedMixer, "L1.2", false},
		{"mixer, untangled", paddedMixer, "L1.2", true},
	} {
		res, err := Layout(parse(t, tc.src), Options{Untangle: tc.untangle})
		if err != nil {
			t.Fatal(err)
		}
		pin := map[string]geom.Pt{}
		for _, s := range res.Geom.Symbols {
			for _, p := range s.Pins {
				pin[s.Ref+"."+p.Name] = p.At
			}
		}
		hot, pad := pin[tc.hot], pin["C3.1"]
		if hot.Y != pad.Y || pad.X == hot.X || max(pad.X-hot.X, hot.X-pad.X) > 10 {
			t.Errorf("%s: padder's top pin at %v, coil's hot end at %v: want it level, beside", tc.name, pad, hot)
		}
		if !bridged(res.Geom, "tank", hot, pad) {
			t.Errorf("%s: the coil's hot end %v and the padder's top %v are not joined straight across the top", tc.name, hot, pad)
		}
		if low, tune := pin["C3.2"], pin["VC1.1"]; tune.X != low.X || tune.Y <= low.Y {
			t.Errorf("%s: tuning capacitor's top pin at %v, padder's lower pin at %v: want it straight under", tc.name, tune, low)
		}
	}
}

// bridged says whether net's wire joins two pins level with each other
// across the top: runs at their height or a step or two above cover the
// whole way from one to the other.
func bridged(g geom.Sheet, net string, a, b geom.Pt) bool {
	lo, hi := min(a.X, b.X), max(a.X, b.X)
	for grew := true; grew && lo < hi; {
		grew = false
		for _, w := range g.Wires {
			for _, s := range w.Segs {
				top := w.Net == net && s.A.Y == s.B.Y && s.A.Y <= a.Y && s.A.Y >= a.Y-2
				if top && min(s.A.X, s.B.X) <= lo && max(s.A.X, s.B.X) > lo {
					lo, grew = max(s.A.X, s.B.X), true
				}
			}
		}
	}
	return lo >= hi
}

// TestGangLink: ganged sections drawn near each other are joined by a
// short dashed mechanical link from one body to the other, clear of every
// other symbol (common practice for a full view); sections drawn far apart
// (the padded tank's VC1 and a grid section 39 steps off) get no link run
// round the drawing, which closed into a loop read as a frame (review18
// b02), but each its "gang tune" in its label.
func TestGangLink(t *testing.T) {
	const near = `title = "near"
band = "1M..2M"
inputs = ["in"]
outputs = ["out"]
[parts]
VC1 = { c = "10p..100p", pins = ["in", "gnd"], gang = "tune" }
R1 = { r = "1k", pins = ["in", "out"] }
VC2 = { c = "10p..100p", pins = ["out", "gnd"], gang = "tune" }
`
	const far = paddedTank + `VC2 = { c = "5p..50p", pins = ["g", "gnd"], gang = "tune" }
`
	res, err := Layout(parse(t, near), Options{Links: true})
	if err != nil {
		t.Fatal(err)
	}
	if len(res.Geom.Links) != 1 {
		t.Fatalf("%d links, want 1 between VC1 and VC2", len(res.Geom.Links))
	}
	l := res.Geom.Links[0]
	a, b := symbolOf(t, &res.Geom, "VC1").Box, symbolOf(t, &res.Geom, "VC2").Box
	ends := []geom.Pt{l.Path[0], l.Path[len(l.Path)-1]}
	if l.Name != "tune" || !a.Contains(ends[0]) || !b.Contains(ends[1]) || len(l.Path) > 3 {
		t.Errorf("link %q from %v to %v by %v, want tune from VC1 %v to VC2 %v, one bend at most", l.Name, ends[0], ends[1], l.Path, a, b)
	}
	for k := 0; k+1 < len(l.Path); k++ {
		seg := geom.Seg{A: l.Path[k], B: l.Path[k+1]}
		for _, s := range res.Geom.Symbols {
			if s.Ref != "VC1" && s.Ref != "VC2" && seg.Touches(s.Box) {
				t.Errorf("the link runs through %s", s.Ref)
			}
		}
	}
	if plain, _ := Layout(parse(t, near), Options{}); len(plain.Geom.Links) != 0 {
		t.Error("a link drawn without Links")
	}
	res, err = Layout(parse(t, far), Options{Links: true})
	if err != nil {
		t.Fatal(err)
	}
	if len(res.Geom.Links) != 0 {
		t.Errorf("far sections linked by %v, want their labels alone", res.Geom.Links)
	}
	for _, ref := range []string{"VC1", "VC2"} {
		named := false
		for _, lb := range res.Geom.Labels {
			named = named || lb.Owner == ref && slices.Contains(lb.Lines, "gang tune")
		}
		if !named {
			t.Errorf("%s's label does not name its gang", ref)
		}
	}
}

// TestSheetsAreClean lays out every hand-made circuit in both symbol styles,
// with and without the untangle search, and measures the result with the
// sheet checker (package check): no overlap, no wire through a symbol, no
// label overlap, every net one connected tree, dots exactly at T junctions.
func TestSheetsAreClean(t *testing.T) {
	for _, src := range []string{rcLadder, triodeStage, tunedCircuit, paddedTank, coupledStages} {
		c := parse(t, src)
		for _, st := range []symbol.Style{symbol.IEC, symbol.IEEE} {
			for _, untangle := range []bool{false, true} {
				res, err := Layout(c, Options{Style: st, Untangle: untangle, HideUnconnected: untangle, Links: !untangle})
				if err != nil {
					t.Fatal(err)
				}
				r := check.Measure(&res.Geom)
				for _, p := range r.Problems() {
					t.Errorf("%s style %d untangle %v: %s", c.Title, st, untangle, p)
				}
				if len(res.Geom.Symbols) != len(c.Parts)+len(c.Inputs)+len(c.Outputs) {
					t.Errorf("%s: %d symbols for %d parts and %d flags", c.Title, len(res.Geom.Symbols), len(c.Parts), len(c.Inputs)+len(c.Outputs))
				}
			}
		}
	}
}

// TestFramesHoldTheirStage: each frame's box holds every symbol of its stage
// and its title, and the title names the stage.
func TestFramesHoldTheirStage(t *testing.T) {
	c := parse(t, triodeStage)
	frames := []Frame{
		{Title: "S1 grid circuit", Parts: []string{"C1", "R1"}},
		{Title: "S2 amplifier", Subtitle: "gain about 30", Parts: []string{"V1", "R2", "C3", "R3", "C2"}},
	}
	res, err := Layout(c, Options{Frames: frames, Untangle: true})
	if err != nil {
		t.Fatal(err)
	}
	if len(res.Geom.Frames) != len(frames) {
		t.Fatalf("%d frames drawn, want %d", len(res.Geom.Frames), len(frames))
	}
	for i, f := range frames {
		fb := res.Geom.Frames[i].Box
		if got := strings.Join(res.Geom.Frames[i].Title.Lines, " "); !strings.Contains(got, f.Title) {
			t.Errorf("frame %d title %q, want %q", i, got, f.Title)
		}
		for _, ref := range f.Parts {
			b := symbolOf(t, &res.Geom, ref).Box
			if b.X0 < fb.X0 || b.X1 > fb.X1 || b.Y0 < fb.Y0 || b.Y1 > fb.Y1 {
				t.Errorf("%s (%v) outside frame %q (%v)", ref, b, f.Title, fb)
			}
		}
		if i > 0 && res.Geom.Frames[i-1].Box.X1 >= fb.X0 {
			t.Errorf("frame %d overlaps the frame before it", i)
		}
	}
	if r := check.Measure(&res.Geom); len(r.FrameCuts) > 0 {
		t.Errorf("frame edges cut through: %v", r.FrameCuts)
	}
}

// TestDeterministic: the same circuit lays out the same way every time, also
// from a copy whose parts were added in another order.
func TestDeterministic(t *testing.T) {
	for _, src := range []string{triodeStage, coupledStages} {
		c := parse(t, src)
		o := Options{Untangle: true, Frames: []Frame{{Title: "all", Parts: []string{"C1", "Q1", "V1"}}}}
		a, err := Layout(c, o)
		if err != nil {
			t.Fatal(err)
		}
		b, _ := Layout(c.Clone(), o)
		if got, want := sheetText(&b.Geom), sheetText(&a.Geom); got != want {
			t.Errorf("%s: two layouts differ:\n%s\n---\n%s", c.Title, got, want)
		}
	}
}

// sheetText is a sheet's geometry as text, for comparing layouts.
func sheetText(g *geom.Sheet) string {
	var b strings.Builder
	for _, s := range g.Symbols {
		b.WriteString(s.Ref + " " + rectText(s.Box) + "\n")
	}
	for _, w := range g.Wires {
		b.WriteString(w.Net)
		for _, s := range w.Segs {
			b.WriteString(" " + rectText(s.Box()))
		}
		b.WriteString("\n")
	}
	for _, l := range g.Labels {
		b.WriteString(strings.Join(l.Lines, "/") + " " + rectText(l.Box) + "\n")
	}
	return b.String()
}

func rectText(r geom.Rect) string {
	return strings.Join([]string{formatG(r.X0), formatG(r.Y0), formatG(r.X1), formatG(r.Y1)}, ",")
}

func TestNoCircuit(t *testing.T) {
	if _, err := Layout(nil, Options{}); err == nil {
		t.Error("Layout(nil) gave no error")
	}
	res, err := Layout(&graph.Circuit{}, Options{Untangle: true})
	if err != nil || len(res.Geom.Symbols) != 0 {
		t.Errorf("an empty circuit: %v, %d symbols", err, len(res.Geom.Symbols))
	}
}
