package main

import (
	"path/filepath"
	"testing"

	"pare/graph"
	"pare/render"
)

// TestRowBreaks: where a sheet cut onto A3 ends its rows (common practice,
// ../shared/DRAWING-NOTES.md: a feedback loop is drawn whole, its lead
// running back above or below the stages it spans, and a long drawing is
// cut where fewest wires cross). On every example and review14-17
// circuit, reduced and faded, each row break is measured by
// render.Config.Breaks: the feedback loops (graph.FeedbackParts) that fit
// one row and are split by it, and the nets crossing it (an off-row
// connector on each side). Review17's b04 and b05 were rejected for
// breaks through their feedback loops ("connector maze"); a04's and b04's
// loops are wider than an A3 row, so only b05's counts here. The counts
// are held under rowBreakCeiling, a ratchet lowered only.
func TestRowBreaks(t *testing.T) {
	files := append(exampleFiles(t), reviewCircuits(t)...)
	a3, _ := render.ParsePaper("A3")
	cases := []struct {
		name string
		view render.View
	}{{"reduced", render.Reduced}, {"faded", render.Faded}}
	var loops, conns, breaks, worst int
	for _, f := range files {
		res := cachedResult(t, f)
		for _, tc := range cases {
			bs, err := render.Config{Page: a3}.Breaks(res.Sheet(tc.view))
			if err != nil {
				t.Fatal(err)
			}
			for i, b := range bs {
				breaks++
				loops += b.Loops
				conns += b.Connectors
				worst = max(worst, b.Connectors)
				if b.Loops > 0 {
					t.Logf("%s %s: break %d splits %d feedback loop(s) that fit a row", filepath.Join(filepath.Base(filepath.Dir(f)), filepath.Base(f)), tc.name, i+1, b.Loops)
				}
			}
		}
	}
	t.Logf("row breaks %d: loops split %d, connectors %d (most at one break %d); ceiling %v",
		breaks, loops, conns, worst, rowBreakCeiling)
	got := [3]int{loops, conns, worst}
	for i, c := range rowBreakCeiling {
		if got[i] > c {
			t.Errorf("row breaks: %v over the ceiling %v (loops split, connectors, most at one break)", got, rowBreakCeiling)
			break
		}
	}
}

// rowBreakCeiling bounds TestRowBreaks: {loops split, connectors, most
// connectors at one break} over 194 breaks, as measured when the test was
// written (review16 b05 and review17 b05 cut through a loop that fits a
// row). A ratchet: lowered as the cuts improve, never raised. Connectors
// 394 (+2, 0.5 %) with a kept supply filter drawn apart on reduced sheets
// (render/supplyapart.go): review17 a05's smoothing filter and review14
// a04's screen decoupler left the output stage's row, each joined to it by
// one labelled connector ("ht", "scr") across a break of its own, as the
// trade joins a supply to its stages by rail marks; both sheets read
// better for it.
var rowBreakCeiling = [3]int{2, 388, 8} // 388 (with a shunt stabiliser's feed framed after its rectifier as a supply section (review15 b05)); 394 (+4, 1.0 %) with a supply line's parts kept off another stage's row (render/strand.go): review17 b05's faded dropper resistors R3, R16, R19 and R20 left the rectifier's row, where they stood away from every stage they feed with their lines run across the page to connectors, for the smoothing filter's row, and the lines they feed now cross that row's break (the only sheet whose breaks changed; looked at: the rectifier row reads clean and the droppers stand with the filter that feeds them); 390 with small sets' rows two steps apart where that saves a page (render/pagebalance.go); 392 with push-pull pairs mirrored on the full and faded sheets: review17 a04's faded and full page 3 put the Zobel network on a row under the pair (one more connector), every changed sheet reads better (review13/14/16/17/18 a04 full and faded pair pages: no anode or screen lead across the cathode network, no suppressor lead across the screen lead); 391 with the AGC filters named on DDT sets (one more stage frame, one more connector at a break); 390 with IF cans' AGC decouplers at their feet; 404 before the faded-view and crossing fixes, 392 before the supply apart

// TestTransformersPrimaryLeft: a transformer is drawn primary left,
// secondary right, the signal through it left to right (common practice,
// ../shared/DRAWING-NOTES.md). On every example and review14-17 circuit,
// reduced and faded, whole and on A3 pages, a transformer with a winding
// driven by an active part's output electrode (its primary) whose
// primary pins stand right of its other pins on average is counted and
// held under primaryRightCeiling. Review17 b05's faded view drew its
// output transformer T5 secondary-left.
func TestTransformersPrimaryLeft(t *testing.T) {
	files := append(exampleFiles(t), reviewCircuits(t)...)
	a3, _ := render.ParsePaper("A3")
	cases := []struct {
		name string
		view render.View
		cfg  render.Config
	}{
		{"reduced", render.Reduced, render.Config{}},
		{"faded", render.Faded, render.Config{}},
		{"reduced A3", render.Reduced, render.Config{Page: a3}},
		{"faded A3", render.Faded, render.Config{Page: a3}},
	}
	right, seen := 0, 0
	for _, f := range files {
		res := cachedResult(t, f)
		for _, tc := range cases {
			s := res.Sheet(tc.view)
			gs, err := tc.cfg.Geometries(s)
			if err != nil {
				t.Fatal(err)
			}
			for _, g := range gs {
				for _, sym := range g.Symbols {
					p := s.Circuit.Part(sym.Ref)
					if p == nil || p.Kind != graph.Transformer {
						continue
					}
					prim := drivenWinding(s.Circuit, p)
					if prim == nil {
						continue
					}
					seen++
					var px, ox float64
					var pn, on int
					for _, pin := range sym.Pins {
						if prim[pin.Name] {
							px, pn = px+pin.At.X, pn+1
						} else {
							ox, on = ox+pin.At.X, on+1
						}
					}
					if pn > 0 && on > 0 && px/float64(pn) > ox/float64(on) {
						right++
						t.Logf("%s %s: %s drawn primary right", filepath.Join(filepath.Base(filepath.Dir(f)), filepath.Base(f)), tc.name, sym.Ref)
					}
				}
			}
		}
	}
	t.Logf("transformers drawn %d times, primary right %d (ceiling %d)", seen, right, primaryRightCeiling)
	if right > primaryRightCeiling {
		t.Errorf("%d transformers drawn primary right, ceiling %d; the log lists them", right, primaryRightCeiling)
	}
}

// primaryRightCeiling bounds TestTransformersPrimaryLeft: 21 of 210
// drawings as measured when the test was written (review17 b05's T5 on
// its faded views; the rest oscillator coils, whose reaction winding is
// the "primary" here). Keeping the primary left in orient (tried) fixed
// T5 but raised the misread ratchets on the gallery (wires beside 1036
// over 1020, crossings near pins 172 over 168). A ratchet: lowered only.
const primaryRightCeiling = 20 // 20 with a stretch too big for its page cut from the unframed parts riding on it (render/riders.go; review16 b05's mixer at 2.5 mm)

// drivenWinding is the pin names of the winding of p on a net an active
// part's output electrode (anode, collector, drain) drives, with the
// windings chained to it; nil when none is, or every pin is on it.
func drivenWinding(c *graph.Circuit, p *graph.Part) map[string]bool {
	driven := map[string]bool{}
	for _, d := range c.Parts {
		if !d.IsActive() {
			continue
		}
		for _, pn := range d.Pins {
			if graph.RoleOfPin(d.Kind, pn.Name) == graph.RoleOutput && !c.RoleOf(pn.Net).IsACGround() {
				driven[pn.Net] = true
			}
		}
	}
	pins := map[string]bool{}
	for _, w := range p.Windings {
		if driven[p.NetOf(w.From)] || driven[p.NetOf(w.To)] {
			pins[w.From], pins[w.To] = true, true
			break
		}
	}
	for grown := len(pins) > 0; grown; {
		grown = false
		for _, w := range p.Windings {
			if pins[w.From] != pins[w.To] {
				pins[w.From], pins[w.To], grown = true, true, true
			}
		}
	}
	if len(pins) == 0 || len(pins) == len(p.Pins) {
		return nil
	}
	return pins
}
