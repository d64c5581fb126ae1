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
