package symbol

import (
	"math"
	"reflect"
	"testing"

	"pare/graph"
	"pare/render/geom"
)

func part(k graph.Kind, typ string, pins ...string) *graph.Part {
	p := &graph.Part{Ref: "X1", Kind: k, Type: typ}
	for _, n := range pins {
		p.Pins = append(p.Pins, graph.Pin{Name: n, Net: "n_" + n})
	}
	return p
}

func labelled(p *graph.Part, label string) *graph.Part {
	p.Label = label
	return p
}

func kinds() map[string]*graph.Part {
	tapped := part(graph.Inductor, "plain", "1", "t", "2")
	tapped.Windings = []graph.Winding{{Name: "1t", L: 10e-6, From: "1", To: "t"}, {Name: "t2", L: 90e-6, From: "t", To: "2"}}
	xfmr := part(graph.Transformer, "", "p1", "p2", "s1", "st", "s2")
	xfmr.Windings = []graph.Winding{{Name: "p", L: 1e-3, From: "p1", To: "p2"},
		{Name: "sa", L: 5e-4, From: "s1", To: "st"}, {Name: "sb", L: 5e-4, From: "st", To: "s2"}}
	xfmr.Coupling = []graph.Coupling{{A: "p", B: "sa", K: 0.3}}
	sw := part(graph.Switch, "", "c", "1", "2")
	sw.Closes = [][][2]string{{{"c", "1"}}, {{"c", "2"}}}
	sw.Set = 1
	return map[string]*graph.Part{
		"resistor":     part(graph.Resistor, "", "1", "2"),
		"capacitor":    part(graph.Capacitor, graph.CapFixed, "1", "2"),
		"electrolytic": part(graph.Capacitor, graph.CapElectrolytic, "+", "-"),
		"variable":     part(graph.Capacitor, graph.CapVariable, "1", "2"),
		"trimmer":      part(graph.Capacitor, graph.CapTrimmer, "1", "2"),
		"inductor":     part(graph.Inductor, "plain", "1", "2"),
		"tapped":       tapped,
		"transformer":  xfmr,
		"triode":       part(graph.Valve, "triode", "a", "g1", "k", "h1", "h2"),
		"heptode":      part(graph.Valve, "heptode", "a", "g1", "g2", "g3", "g4", "g5", "k", "s"),
		"double-diode": part(graph.Valve, "double-diode", "a1", "a2", "k"),
		"npn":          part(graph.BJT, "npn", "b", "c", "e"),
		"pnp":          part(graph.BJT, "pnp", "b", "c", "e"),
		"njfet":        part(graph.FET, "njfet", "g", "d", "s"),
		"nmos":         part(graph.FET, "nmos", "g", "d", "s", "b"),
		"diode":        part(graph.Diode, "signal", "a", "k"),
		"zener":        part(graph.Diode, "zener", "a", "k"),
		"varicap":      part(graph.Diode, "varicap", "a", "k"),
		"crystal":      part(graph.Crystal, "", "1", "2"),
		"pot":          part(graph.Pot, "", "1", "w", "2"),
		"switch":       sw,
		"generic":      part(graph.Generic, "", "a", "b", "c"),
		"fuse":         labelled(part(graph.Generic, "", "a", "b"), "mains fuse 500 mA"),
		"lamp":         labelled(part(graph.Generic, "", "a", "b"), "dial lamp 6V3 0.3 A"),
		"loudspeaker":  part(graph.Loudspeaker, "", "1", "2"),
		"port":         part(graph.Port, "", "1"),
	}
}

// Every symbol, in every orientation it may take, has each of the part's
// pins once, on a whole grid point (10-unit grid, common practice for
// schematic capture), on the edge of its box, pointing out of it.
func TestPinsOnGridAndEdge(t *testing.T) {
	for name, p := range kinds() {
		for _, st := range []Style{IEC, IEEE} {
			base := For(p, st)
			if len(base.Pins) != len(p.Pins) {
				t.Errorf("%s: %d pins drawn, part has %d", name, len(base.Pins), len(p.Pins))
			}
			for _, o := range base.Turns {
				s := base.Oriented(o)
				for _, pn := range s.Pins {
					if pn.At.X != math.Round(pn.At.X) || pn.At.Y != math.Round(pn.At.Y) {
						t.Errorf("%s %v: pin %s at %v is off the grid", name, o, pn.Name, pn.At)
					}
					b := s.Box
					onEdge := map[geom.Dir]bool{
						geom.Left: pn.At.X == b.X0, geom.Right: pn.At.X == b.X1,
						geom.Up: pn.At.Y == b.Y0, geom.Down: pn.At.Y == b.Y1,
					}
					if !onEdge[pn.Dir] || !b.Contains(pn.At) {
						t.Errorf("%s %v: pin %s at %v (dir %v) is not on the %v edge of %v", name, o, pn.Name, pn.At, pn.Dir, pn.Dir, b)
					}
					if pn.Net != "n_"+pn.Name {
						t.Errorf("%s: pin %s has net %q", name, pn.Name, pn.Net)
					}
				}
			}
		}
	}
}

// IEC 60617 draws a resistor as a rectangle, IEEE 315 as a zig-zag: the two
// styles must differ for a resistor and agree on its pins.
func TestStylesDiffer(t *testing.T) {
	p := part(graph.Resistor, "", "1", "2")
	a, b := For(p, IEC), For(p, IEEE)
	if reflect.DeepEqual(a.Prims, b.Prims) {
		t.Error("IEC and IEEE resistors are drawn the same")
	}
	if !reflect.DeepEqual(a.Pins, b.Pins) {
		t.Error("IEC and IEEE resistors have different pins")
	}
	closed := false
	for _, pr := range a.Prims {
		closed = closed || (pr.Closed && len(pr.Pts) == 4)
	}
	if !closed {
		t.Error("IEC resistor has no rectangle")
	}
}

// A reduced valve that lost its screen and heater pins is drawn without
// them, and with fewer grid lines.
func TestValveDrawsOnlyItsPins(t *testing.T) {
	full := For(part(graph.Valve, "pentode", "a", "g1", "g2", "g3", "k", "h1", "h2"), IEC)
	reduced := For(part(graph.Valve, "pentode", "a", "g1", "g3", "k"), IEC)
	if reduced.Pin("g2") != nil || reduced.Pin("h1") != nil {
		t.Error("reduced valve still has screen or heater pins")
	}
	dashes := func(s Shape) int {
		n := 0
		for _, p := range s.Prims {
			if p.Dash {
				n++
			}
		}
		return n
	}
	if dashes(full) != 3 || dashes(reduced) != 2 {
		t.Errorf("grid lines: full %d (want 3), reduced %d (want 2)", dashes(full), dashes(reduced))
	}
}

// Orienting a symbol four quarter turns gives it back; a mirror twice too.
func TestOrientRoundTrip(t *testing.T) {
	s := For(kinds()["pot"], IEC)
	got := s
	for i := 0; i < 4; i++ {
		got = got.Oriented(Orient{Quarter: 1})
	}
	if !reflect.DeepEqual(got.Pins, s.Pins) || got.Box != s.Box {
		t.Error("four quarter turns changed the symbol")
	}
	m := s.Oriented(Orient{Mirror: true}).Oriented(Orient{Mirror: true})
	if !reflect.DeepEqual(m.Pins, s.Pins) {
		t.Error("mirroring twice changed the symbol")
	}
	r := s.Oriented(Orient{Quarter: 1})
	if p := r.Pin("1"); p.At != (geom.Pt{X: 0, Y: -2}) || p.Dir != geom.Up {
		t.Errorf("a quarter turn clockwise takes the left pin to the top, got %v %v", p.At, p.Dir)
	}
}

// An output transformer (centre-tapped primary, one secondary, iron core):
// the secondary stands centred against the primary and every coil hump keeps
// clear of the core lines, so the symbol reads at print size (common
// drawing practice: the windings face each other across the core).
func TestOutputTransformerReads(t *testing.T) {
	p := part(graph.Transformer, "", "p1", "pt", "p2", "s1", "s2")
	p.Windings = []graph.Winding{{Name: "pa", L: 10, From: "p1", To: "pt"}, {Name: "pb", L: 10, From: "pt", To: "p2"},
		{Name: "s", L: 0.025, From: "s1", To: "s2"}}
	p.Coupling = []graph.Coupling{{A: "pa", B: "s", K: 0.99}, {A: "pb", B: "s", K: 0.99}, {A: "pa", B: "pb", K: 0.99}}
	s := For(p, IEC)
	y := map[string]float64{}
	for _, pn := range s.Pins {
		y[pn.Name] = pn.At.Y
	}
	// primary p1..p2 spans 8 steps; the 4-step secondary is centred on pt
	if mid := (y["s1"] + y["s2"]) / 2; mid != y["pt"] {
		t.Errorf("secondary centred at %g, primary tap at %g: want the same", mid, y["pt"])
	}
	coreX, humpX := 0.0, math.Inf(1)
	for _, pr := range s.Prims {
		switch {
		case pr.Thick && pr.Pts[0].X == pr.Pts[1].X:
			coreX = math.Max(coreX, math.Abs(pr.Pts[0].X))
		case pr.Kind == Arc:
			// a hump's tip lies its radius from its chord, towards the core
			humpX = math.Min(humpX, math.Abs(pr.Pts[0].X)-pr.R)
		}
	}
	if coreX == 0 {
		t.Fatal("no core drawn for k = 0.99")
	}
	if gap := humpX - coreX; gap < 0.2 {
		t.Errorf("coil humps come within %g of the core lines, want at least 0.2 grid steps", gap)
	}
}

// Every kind in the symbol table is drawn in both styles, and the IEEE 315
// set differs from the IEC 60617 one exactly where the standards' forms
// differ (from the standards' symbol tables as the trade knows them):
// resistor and pot (zig-zag against rectangle), capacitors (one curved
// plate), coils and windings (loops against humps), diodes (IEC's open
// triangle with the lead through it); valves, transistors, crystals,
// loudspeakers, switches and the generic box are drawn alike in both; a
// fuse (IEC's rectangle with the lead through it, IEEE's S-curve) and a
// lamp (IEC's crossed circle, IEEE's filament loop) differ. The
// pins never move with the style: the layout is the same in both.
func TestStylesDifferWhereStandardsDiffer(t *testing.T) {
	differ := map[string]bool{
		"resistor": true, "pot": true, "capacitor": true, "electrolytic": true, "variable": true, "trimmer": true,
		"inductor": true, "tapped": true, "transformer": true, "diode": true, "zener": true, "varicap": true,
		"fuse": true, "lamp": true,
	}
	ks := kinds()
	drawn := map[graph.Kind]bool{}
	for name, p := range ks {
		drawn[p.Kind] = true
		a, b := For(p, IEC), For(p, IEEE)
		if got := !reflect.DeepEqual(a.Prims, b.Prims); got != differ[name] {
			t.Errorf("%s: IEC and IEEE differ = %v, want %v", name, got, differ[name])
		}
		if !reflect.DeepEqual(a.Pins, b.Pins) || a.Box != b.Box {
			t.Errorf("%s: the styles place pins or box differently", name)
		}
	}
	for k := range table {
		if !drawn[k] {
			t.Errorf("kind %s has a symbol but no case here", k)
		}
	}
	gi, _ := Ground(geom.Pt{}, false, IEC)
	ge, _ := Ground(geom.Pt{}, false, IEEE)
	if reflect.DeepEqual(gi, ge) {
		t.Error("the IEEE 315 chassis mark is drawn as the IEC earth")
	}
}

// Every stroke of every symbol stays near its box (the layout keeps other
// parts, wires and labels off the box, so a stroke far outside it would be
// drawn over them); half a stroke's reach of slack for round caps and bars.
func TestStrokesInsideBox(t *testing.T) {
	for name, p := range kinds() {
		for _, st := range []Style{IEC, IEEE} {
			s := For(p, st)
			b := s.Box
			b = geom.Rect{X0: b.X0 - 0.35, Y0: b.Y0 - 0.35, X1: b.X1 + 0.35, Y1: b.Y1 + 0.35}
			for _, pr := range s.Prims {
				for _, q := range pr.Pts {
					if pr.Kind != Arc && !b.Contains(q) {
						t.Errorf("%s %v: stroke point %v outside box %v", name, st, q, s.Box)
					}
				}
			}
		}
	}
}

// A pentode whose screen the reduction put at AC ground and whose
// suppressor is strapped to the cathode is still drawn with three grids
// (common practice: a valve keeps its electrodes on a diagram); the static
// two have no pin, the screen a stub to a chassis mark, the suppressor a
// strap to the cathode; the live pins and the box are those of the pentode
// drawn without them, so the layout is unaffected by the marks.
func TestStaticGridsKeepTheirLines(t *testing.T) {
	p := part(graph.Valve, "pentode", "a", "g1", "k")
	plain := For(p, IEC)
	marked := ForMarked(p, IEC, Marks{Ties: map[string]Tie{"g2": TieGround, "g3": TieCathode}})
	dashes := func(s Shape) int {
		n := 0
		for _, pr := range s.Prims {
			if pr.Dash {
				n++
			}
		}
		return n
	}
	if dashes(plain) != 1 || dashes(marked) != 3 {
		t.Errorf("grid lines: plain %d (want 1), marked %d (want 3)", dashes(plain), dashes(marked))
	}
	if marked.Pin("g2") != nil || marked.Pin("g3") != nil || len(marked.Pins) != 3 {
		t.Errorf("static grids have pins: %v", marked.Pins)
	}
	k := marked.Pin("k").At
	strap, chassis := false, 0
	for _, pr := range marked.Prims {
		last := pr.Pts[len(pr.Pts)-1]
		if pr.Kind == Line && len(pr.Pts) == 4 && !pr.Thick && last.X == 1 && last.Y < k.Y {
			strap = true
		}
		if pr.Kind == Line && len(pr.Pts) == 2 && pr.Pts[0].Y == pr.Pts[1].Y && pr.Pts[0].X < -2 && pr.Pts[1].X < -2 {
			chassis++
		}
	}
	if !strap || chassis != 3 {
		t.Errorf("strap to the cathode %v, chassis bars %d (want true, 3)", strap, chassis)
	}
	// a static grid takes no row of its own: the live pins and the box are
	// those of the valve drawn without it, so the layout is unchanged
	if !reflect.DeepEqual(marked.Pins, plain.Pins) || marked.Box != plain.Box {
		t.Errorf("pins or box moved: %v %v, plain %v %v", marked.Pins, marked.Box, plain.Pins, plain.Box)
	}
}

// A tap is drawn where it is along the turns (the netlist's tap fraction,
// or the halves' inductances: L goes with turns squared, handbook formula
// L ∝ N², docs/references.md §20), not mid-winding: an inductor's tap lead meets the coil at that
// fraction of its turns; a transformer's tap pin stands near it.
func TestTapAtItsPlace(t *testing.T) {
	for _, tc := range []struct {
		l1, l2 float64 // μH of the halves, tightly coupled (k = 1)
		frac   float64 // of the turns from pin 1
	}{
		{1.44, 77.44, 0.12}, // N ratio 12:88 → L1 = 0.12² of 100, L2 = 0.88² of 100
		{25, 25, 0.5},
		{56.25, 6.25, 0.75},
	} {
		p := part(graph.Inductor, "plain", "1", "t", "2")
		p.Windings = []graph.Winding{{Name: "1t", L: tc.l1 * 1e-6, From: "1", To: "t"}, {Name: "t2", L: tc.l2 * 1e-6, From: "t", To: "2"}}
		p.Coupling = []graph.Coupling{{A: "1t", B: "t2", K: 1}}
		if got := tapAt(p); math.Abs(got-tc.frac) > 0.02 {
			t.Errorf("tap of %g+%g µH at %.3f of the turns, want %.2f", tc.l1, tc.l2, got, tc.frac)
			continue
		}
		for _, st := range []Style{IEC, IEEE} {
			s := For(p, st)
			tx := s.Pin("t").At.X
			x0, x1 := math.Inf(1), math.Inf(-1) // the turns' extent, leads left out
			for _, pr := range s.Prims {
				if pr.Kind == Arc || (pr.Kind == Line && len(pr.Pts) > 2) {
					for _, q := range pr.Pts {
						x0, x1 = math.Min(x0, q.X), math.Max(x1, q.X)
					}
				}
			}
			if st == IEEE {
				// the loops run back past their ends by the pen's back-run
				x0, x1 = x0+0.15, x1-0.15
			}
			if got := (tx - x0) / (x1 - x0); math.Abs(got-tc.frac) > 0.06 {
				t.Errorf("%v: tap lead at %.2f of the coil, want %.2f", st, got, tc.frac)
			}
		}
	}
	// a transformer winding tapped a quarter of the way: turns 1:3, L 1:9
	x := part(graph.Transformer, "", "p1", "pt", "p2", "s1", "s2")
	x.Windings = []graph.Winding{{Name: "pa", L: 1e-6, From: "p1", To: "pt"}, {Name: "pb", L: 9e-6, From: "pt", To: "p2"},
		{Name: "s", L: 1e-6, From: "s1", To: "s2"}}
	x.Coupling = []graph.Coupling{{A: "pa", B: "pb", K: 0.99}, {A: "pa", B: "s", K: 0.1}}
	s := For(x, IEC)
	y := func(n string) float64 { return s.Pin(n).At.Y }
	if got := (y("pt") - y("p1")) / (y("p2") - y("p1")); math.Abs(got-0.25) > 0.05 {
		t.Errorf("transformer tap at %.2f of the winding, want 0.25", got)
	}
}

// Alignment points stay marked: a gang section a trimmer was merged into
// carries the preset mark (its bar) beside its own arrow, and a coil or a
// transformer winding with an adjustable core carries it across the turns.
func TestPresetMarks(t *testing.T) {
	bars := func(s Shape) int {
		n := 0
		for _, pr := range s.Prims {
			if pr.Thick && len(pr.Pts) == 2 && pr.Pts[0].X != pr.Pts[1].X && pr.Pts[0].Y != pr.Pts[1].Y {
				n++ // a slanting bar: the preset mark's end
			}
		}
		return n
	}
	vc := part(graph.Capacitor, graph.CapVariable, "1", "2")
	coil := part(graph.Inductor, "plain", "1", "2")
	slug := part(graph.Inductor, "plain", "1", "2")
	slug.Adjust = []string{graph.CoreWhole}
	ift := kinds()["transformer"]
	ift.Adjust = []string{"p", "sa"}
	plainIFT := kinds()["transformer"]
	for _, st := range []Style{IEC, IEEE} {
		for _, tc := range []struct {
			name       string
			got, plain Shape
			want       int
		}{
			{"merged trimmer", ForMarked(vc, st, Marks{Preset: true}), For(vc, st), 1},
			{"adjustable core", For(slug, st), For(coil, st), 1},
			{"two adjustable windings", For(ift, st), For(plainIFT, st), 2},
		} {
			if d := bars(tc.got) - bars(tc.plain); d != tc.want {
				t.Errorf("%v %s: %d preset marks, want %d", st, tc.name, d, tc.want)
			}
		}
	}
}

// An oscillator coil's one adjustable core is marked across its tuned
// winding (the one the sheet's capacitors tune, Marks.Tuned), not across
// the feedback winding drawn first (review14 b05's T2: f feedback, p tuned,
// s link); with no winding tuned on the sheet it stays on the first coil.
func TestWholeCoreOnTunedWinding(t *testing.T) {
	x := part(graph.Transformer, "", "f1", "f2", "p1", "p2", "s1", "s2")
	x.Windings = []graph.Winding{{Name: "f", L: 12e-6, From: "f1", To: "f2"}, {Name: "p", L: 200e-6, From: "p1", To: "p2"},
		{Name: "s", L: 2e-6, From: "s1", To: "s2"}}
	x.Adjust = []string{graph.CoreWhole}
	// the mark's bar's y, and which coil's pin rows it lies between
	markY := func(s Shape) float64 {
		for _, pr := range s.Prims {
			if pr.Thick && len(pr.Pts) == 2 && pr.Pts[0].X != pr.Pts[1].X && pr.Pts[0].Y != pr.Pts[1].Y {
				return (pr.Pts[0].Y + pr.Pts[1].Y) / 2
			}
		}
		t.Fatal("no core mark")
		return 0
	}
	within := func(s Shape, a, b string) bool {
		y0, y1 := s.Pin(a).At.Y, s.Pin(b).At.Y
		y := markY(s)
		return y >= math.Min(y0, y1)-1 && y <= math.Max(y0, y1)+1
	}
	for _, st := range []Style{IEC, IEEE} {
		tuned := ForMarked(x, st, Marks{Tuned: [][2]string{{"p1", "p2"}}})
		if !within(tuned, "p1", "p2") || within(tuned, "f1", "f2") {
			t.Errorf("%v: core mark at y %.1f, not across the tuned winding p (%.0f..%.0f)", st, markY(tuned), tuned.Pin("p1").At.Y, tuned.Pin("p2").At.Y)
		}
		if plain := For(x, st); !within(plain, "f1", "f2") {
			t.Errorf("%v: with no winding tuned the core mark should stay on the first coil", st)
		}
	}
}

// A coil of several windings on one adjustable core (an oscillator coil's
// tuned, feedback and link windings, review15 b05's T2) reads as one part:
// one dashed core line (a dust or ferrite core, common drawing practice;
// IEC 60617 draws a core as a line along the windings) runs between the
// two sides the full height of every winding; an iron core keeps its two
// solid lines, windings with a core each (an IF can's two slugs) or none
// get no shared line.
func TestOneCoreSpansItsWindings(t *testing.T) {
	three := func(adjust ...string) *graph.Part {
		x := part(graph.Transformer, "", "f1", "f2", "p1", "p2", "s1", "s2")
		x.Windings = []graph.Winding{{Name: "f", L: 12e-6, From: "f1", To: "f2"}, {Name: "p", L: 190e-6, From: "p1", To: "p2"},
			{Name: "s", L: 2e-6, From: "s1", To: "s2"}}
		x.Coupling = []graph.Coupling{{A: "f", B: "p", K: 0.5}, {A: "p", B: "s", K: 0.85}}
		x.Adjust = adjust
		return x
	}
	cases := []struct {
		name   string
		p      *graph.Part
		shared bool
	}{
		{"one core under three windings", three(graph.CoreWhole), true},
		{"a core per winding", three("f", "p", "s"), false},
		{"air-cored", three(), false},
	}
	for _, tc := range cases {
		for _, st := range []Style{IEC, IEEE} {
			s := For(tc.p, st)
			lo, hi := math.Inf(1), math.Inf(-1)
			for _, pn := range s.Pins {
				lo, hi = math.Min(lo, pn.At.Y), math.Max(hi, pn.At.Y)
			}
			found := false
			for _, pr := range s.Prims {
				if pr.Kind != Line || !pr.Dash || len(pr.Pts) != 2 || pr.Pts[0].X != 0 || pr.Pts[1].X != 0 {
					continue
				}
				found = true
				if math.Min(pr.Pts[0].Y, pr.Pts[1].Y) > lo || math.Max(pr.Pts[0].Y, pr.Pts[1].Y) < hi {
					t.Errorf("%s %v: core line %v does not span the windings' pins %g..%g", tc.name, st, pr.Pts, lo, hi)
				}
			}
			if found != tc.shared {
				t.Errorf("%s %v: shared core line drawn %v, want %v", tc.name, st, found, tc.shared)
			}
		}
	}
}

// A description names a fuse or a lamp by a whole word: "refused" or a
// "clamp" diode's description names nothing, and a plain description
// keeps the box (from the netlists' own wording, common practice).
func TestGenericForms(t *testing.T) {
	for _, tc := range []struct{ label, want string }{
		{"mains fuse 500 mA", "fuse"},
		{"Fuse, 2 A slow", "fuse"},
		{"dial lamp 6V3 0.3 A", "lamp"},
		{"scale bulb", "lamp"},
		{"clamp, refused", ""},
		{"mains inlet, 230 V", ""},
		{"", ""},
	} {
		if got := genericForm(tc.label); got != tc.want {
			t.Errorf("%q: form %q, want %q", tc.label, got, tc.want)
		}
	}
	plain := For(labelled(part(graph.Generic, "", "a", "b"), "mains inlet"), IEC)
	fuse := For(labelled(part(graph.Generic, "", "a", "b"), "fuse"), IEC)
	if plain.Box != fuse.Box || !reflect.DeepEqual(plain.Pins, fuse.Pins) {
		t.Errorf("the fuse moves the box's pins or box: %v %v against %v %v", fuse.Pins, fuse.Box, plain.Pins, plain.Box)
	}
}
