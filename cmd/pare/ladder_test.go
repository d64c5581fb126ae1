package main

import (
	"path/filepath"
	"testing"

	"pare/render"
	"pare/render/geom"
)

// An RC ladder is drawn as the trade draws one (common practice): its
// series parts lying along one line, in the order the signal passes them,
// each shunt standing below the line between the two series parts it
// joins. The chains are read off the circuits (series, shunt, series, ...):
// review14 b01's three-section high-pass ladder was tangled round the
// collector load, and the class fixtures (testdata/phase-shift/) hold a
// three-section low-pass and a four-section one with a buffer tapping it.
// The valve fixture's four-section ladder is left out: its first
// capacitor, beside the output coupling, keeps the generic place.
func TestLaddersDrawnInOrder(t *testing.T) {
	cases := []struct {
		file  string
		chain []string
		view  render.View // Reduced when left out
	}{
		{"review14/b01.toml", []string{"C1", "R4", "C2", "R5", "C3"}, render.Reduced},
		{"phase-shift/fet-lowpass3.toml", []string{"R1", "C1", "R2", "C2", "R3"}, render.Reduced},
		{"phase-shift/bjt-lowpass4-buffer.toml", []string{"R1", "C1", "R2", "C2", "R3", "C3", "R4"}, render.Reduced},
		// a part-bypassed emitter (a preset's wiper to the bypass): the
		// ladder had kept the generic placement, its capacitors scattered
		// round the collector (review16 b01)
		{"review16/b01.toml", []string{"C6", "R8", "C5", "R7", "C4"}, render.Reduced},
		// the full and faded sheets draw the ladder on the original
		// parts the same way: the generic placement had wound it round
		// the collector and the base divider
		{"review16/b01.toml", []string{"C6", "R8", "C5", "R7", "C4"}, render.Faded},
		{"osc/phase-shift-valve.toml", []string{"C3", "R2", "C2", "R1", "C1"}, render.Faded},
	}
	for _, tc := range cases {
		pages, err := cachedPages(filepath.Join("../../testdata", tc.file), tc.view, "A3")
		if err != nil {
			t.Fatal(err)
		}
		sym := map[string]geom.Symbol{}
		for _, g := range pages {
			for _, s := range g.Symbols {
				sym[s.Ref] = s
			}
		}
		checkLadder(t, tc.file, tc.chain, sym)
	}
}

// A merged base bias divider that is the ladder's last leg is drawn as its
// two halves, one to the supply line and one to chassis (as elsewhere on
// the reduced sheet, splitdividers.go), not as one part marked "≡ R5, R6"
// that reads as a resistor from the line alone (review16 b01).
func TestLadderLegDividerApart(t *testing.T) {
	pages, err := cachedPages("../../testdata/review16/b01.toml", render.Reduced, "A3")
	if err != nil {
		t.Fatal(err)
	}
	got := map[string]bool{}
	for _, g := range pages {
		for _, s := range g.Symbols {
			got[s.Ref] = true
		}
	}
	if !got["R5"] || !got["R6"] {
		t.Errorf("review16 b01: the base divider's halves R5 %v, R6 %v: want both drawn", got["R5"], got["R6"])
	}
}

// checkLadder fails unless chain's series parts (even places) lie
// horizontal on one line, in order along it, and each shunt (odd places)
// stands below the line between its neighbours.
func checkLadder(t *testing.T, file string, chain []string, sym map[string]geom.Symbol) {
	t.Helper()
	cx := func(r string) float64 { return (sym[r].Box.X0 + sym[r].Box.X1) / 2 }
	for _, r := range chain {
		if len(sym[r].Pins) != 2 {
			t.Fatalf("%s: %s not drawn as a two-terminal part", file, r)
		}
	}
	line := sym[chain[0]].Pins[0].At.Y
	dir := cx(chain[len(chain)-1]) - cx(chain[0])
	for i, r := range chain {
		s := sym[r]
		if i%2 == 0 {
			if s.Pins[0].At.Y != line || s.Pins[1].At.Y != line {
				t.Errorf("%s: series part %s (pins at y %v, %v) off the ladder's line y %v", file, r, s.Pins[0].At.Y, s.Pins[1].At.Y, line)
			}
			continue
		}
		a, b := cx(chain[i-1]), cx(chain[i+1])
		if x := cx(r); (x-a)*dir <= 0 || (b-x)*dir <= 0 {
			t.Errorf("%s: shunt %s at x %v not between %s (%v) and %s (%v)", file, r, x, chain[i-1], a, chain[i+1], b)
		}
		if s.Box.Y0 < line {
			t.Errorf("%s: shunt %s (top %v) not below the ladder's line y %v", file, r, s.Box.Y0, line)
		}
	}
}

// A pi filter reads shunt capacitor, series resistor, shunt capacitor left
// to right and stands whole on one page: review14 b03 drew C11 at the
// filter's input and put C10 on the page before; a03's faded view drew
// C14 on the detector's side of R5 (common practice: the filter drawn in
// the order the signal passes it).
func TestPiFiltersInOrder(t *testing.T) {
	cases := []struct {
		file string
		view render.View
		pi   [3]string
	}{
		{"review14/b03.toml", render.Reduced, [3]string{"C10", "R8", "C11"}},
		{"review14/b03.toml", render.Faded, [3]string{"C10", "R8", "C11"}},
		{"review14/a03.toml", render.Reduced, [3]string{"C13", "R5", "C14"}},
		{"review14/a03.toml", render.Faded, [3]string{"C13", "R5", "C14"}},
	}
	for _, tc := range cases {
		pages, err := cachedPages(filepath.Join("../../testdata", tc.file), tc.view, "A3")
		if err != nil {
			t.Fatal(err)
		}
		page, x := map[string]int{}, map[string]float64{}
		for i, g := range pages {
			for _, s := range g.Symbols {
				page[s.Ref], x[s.Ref] = i+1, (s.Box.X0+s.Box.X1)/2
			}
		}
		in, r, out := tc.pi[0], tc.pi[1], tc.pi[2]
		if page[in] != page[r] || page[r] != page[out] || page[in] == 0 {
			t.Errorf("%s %s: pi filter split, %s on page %d, %s on %d, %s on %d", tc.file, tc.view, in, page[in], r, page[r], out, page[out])
			continue
		}
		if !(x[in] < x[r] && x[r] < x[out]) {
			t.Errorf("%s %s: pi filter out of order, %s at x %v, %s at %v, %s at %v", tc.file, tc.view, in, x[in], r, x[r], out, x[out])
		}
	}
}
