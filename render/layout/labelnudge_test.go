package layout

import (
	"reflect"
	"testing"

	"pare/render/check"
	"pare/render/geom"
	"pare/render/symbol"
)

// nudgeSheet is a hand-made IF can as review21 b03 drew it: tuning
// capacitor C15 standing at x 10–11.6, its label on its left, the can T1
// (four pins) at x 14–17 with its name set against C15's plates on C15's
// label's line, 0.8 of empty room between once C15's body is taken out:
// under render/check's 1.5 character widths (0.93), so they run together.
// more are the extra wires of each case.
func nudgeSheet(more ...geom.Seg) *geom.Sheet {
	c15 := symbol.TextWidth("C15 180p")
	g := &geom.Sheet{
		Symbols: []geom.Symbol{
			{Ref: "C15", Kind: "capacitor", Box: geom.Rect{X0: 10, Y0: 5, X1: 11.6, Y1: 7},
				Pins: []geom.Pin{{Name: "a", At: geom.Pt{X: 10.8, Y: 5}, Dir: geom.Up}, {Name: "b", At: geom.Pt{X: 10.8, Y: 7}, Dir: geom.Down}}},
			{Ref: "T1", Kind: "transformer", Box: geom.Rect{X0: 14, Y0: 3, X1: 17, Y1: 9},
				Pins: []geom.Pin{{Name: "p1", At: geom.Pt{X: 14, Y: 3}, Dir: geom.Left}, {Name: "p2", At: geom.Pt{X: 14, Y: 9}, Dir: geom.Left},
					{Name: "s1", At: geom.Pt{X: 17, Y: 3}, Dir: geom.Right}, {Name: "s2", At: geom.Pt{X: 17, Y: 9}, Dir: geom.Right}}},
		},
		Labels: []geom.Label{
			{Owner: "C15", Lines: []string{"C15 180p"}, Box: geom.Rect{X0: 10 - 0.4 - c15, Y0: 5.4, X1: 9.6, Y1: 6.6}},
			{Owner: "T1", Lines: []string{"T1"}, Box: geom.Rect{X0: 12, Y0: 5.4, X1: 12 + symbol.TextWidth("T1"), Y1: 6.6}},
		},
		Wires: []geom.Wire{{Net: "hot", Segs: []geom.Seg{{A: geom.Pt{X: 10.8, Y: 5}, B: geom.Pt{X: 10.8, Y: 3}}, {A: geom.Pt{X: 10.8, Y: 3}, B: geom.Pt{X: 14, Y: 3}}}},
			{Net: "cold", Segs: []geom.Seg{{A: geom.Pt{X: 10.8, Y: 7}, B: geom.Pt{X: 10.8, Y: 9}}, {A: geom.Pt{X: 10.8, Y: 9}, B: geom.Pt{X: 14, Y: 9}}}},
			// the secondary's leads out to the next stage at x 24
			{Net: "base", Segs: []geom.Seg{{A: geom.Pt{X: 17, Y: 3}, B: geom.Pt{X: 24, Y: 3}}}},
			{Net: "agc", Segs: []geom.Seg{{A: geom.Pt{X: 17, Y: 9}, B: geom.Pt{X: 24, Y: 9}}}}},
	}
	if len(more) > 0 {
		g.Wires = append(g.Wires, geom.Wire{Net: "other", Segs: more})
	}
	return g
}

// TestApartLabels checks the pass on the hand-made can: which label moves,
// that the pair no longer runs together by the checker's measure, and that
// the wires and the sheet's bounds stay as they were. Expected moves worked
// by hand from the geometry (the rules in labelnudge.go).
func TestApartLabels(t *testing.T) {
	cases := []struct {
		name  string
		more  []geom.Seg
		moved string // the owner of the label that must move, "" for none
	}{
		// the can's far side is free between its leads out: its name goes
		// there, the capacitor's label stays beside its body
		{"room on the can's far side", nil, "T1"},
		// a wire standing 0.5 right of the can, top to bottom: no room for
		// the name there (0.4 clear of wires), and above or below the can
		// lies outside the sheet: the capacitor's label moves instead
		{"the can hemmed in", []geom.Seg{{A: geom.Pt{X: 17.5, Y: 3}, B: geom.Pt{X: 17.5, Y: 9}}}, "C15"},
	}
	for _, c := range cases {
		g := nudgeSheet(c.more...)
		before := append([]geom.Label(nil), g.Labels...)
		wires := append([]geom.Wire(nil), g.Wires...)
		b0 := bounds(g)
		if n := len(check.RunTogether(g)); n != 1 {
			t.Fatalf("%s: the sheet as made has %d pairs running together, want 1", c.name, n)
		}
		apartLabels(g)
		if got := check.RunTogether(g); len(got) != 0 {
			t.Errorf("%s: still running together: %q", c.name, got)
		}
		for i, l := range g.Labels {
			if moved := l.Box != before[i].Box; moved != (l.Owner == c.moved) {
				t.Errorf("%s: label of %s moved %v, from %v to %v; want %s to move", c.name, l.Owner, moved, before[i].Box, l.Box, c.moved)
			}
		}
		if !reflect.DeepEqual(wires, g.Wires) || bounds(g) != b0 {
			t.Errorf("%s: wires or bounds changed", c.name)
		}
	}
}

// TestNudgeNearKeepsEveryAnswer: nudgeFree given only what of the sheet a
// label's area can meet (nearArea) answers as it does given every wire
// and symbol of the sheet, at every place round every label: on the
// hand-made can with a wire hemming it in, and on examples laid out
// whole (many wires and symbols far from each label). It fails when
// nearArea drops too much: given nothing at all, some places change
// their answer, which the test also checks, so the sheets exercise the
// wire and symbol tests.
func TestNudgeNearKeepsEveryAnswer(t *testing.T) {
	sheets := map[string]*geom.Sheet{"hand-made can": nudgeSheet(geom.Seg{A: geom.Pt{X: 17.5, Y: 3}, B: geom.Pt{X: 17.5, Y: 9}})}
	for _, f := range []string{"../../examples/club-receiver.toml", "../../examples/transistor-front-end.toml"} {
		r, err := Layout(loadFixture(t, f), Options{Links: true})
		if err != nil {
			t.Fatal(err)
		}
		sheets[f] = &r.Geom
	}
	for name, g := range sheets {
		tried, dropped := nudgeAgree(t, name, g)
		if tried == 0 || dropped == 0 {
			t.Errorf("%s: %d places tried, %d answered otherwise given no wire or symbol: the sheet tests nothing", name, tried, dropped)
		}
	}
}

// nudgeAgree compares nudgeFree's answers, given nearArea's part of g
// and given all of it, at every place nudgeSpots would try for each part
// label of g; it returns the places tried and how many of them answer
// otherwise given no wire and no symbol.
func nudgeAgree(t *testing.T, name string, g *geom.Sheet) (tried, dropped int) {
	t.Helper()
	syms := map[string]int{}
	all := nudgeNear{}
	for i, s := range g.Symbols {
		syms[s.Ref] = i
		all.syms = append(all.syms, i)
	}
	for _, w := range g.Wires {
		all.segs = append(all.segs, w.Segs...)
	}
	for k, l := range g.Labels {
		si, ok := syms[l.Owner]
		if !ok || l.Small {
			continue
		}
		sb := g.Symbols[si].Box
		area := nudgeArea(l, sb)
		obs, near := nudgeObstacles(g, k, area), nearArea(g, area)
		for y := area.Y0; y+l.Box.H() <= area.Y1; y += nudgeStep {
			for x := area.X0; x+l.Box.W() <= area.X1; x += nudgeStep {
				r := geom.Rect{X0: x, Y0: y, X1: x + l.Box.W(), Y1: y + l.Box.H()}
				if boxDist(r, sb) > nudgeReach {
					continue // nudgeSpots never asks
				}
				tried++
				want := nudgeFree(g, k, si, r, obs, all)
				if got := nudgeFree(g, k, si, r, obs, near); got != want {
					t.Errorf("%s: label of %s at %v: free %v given the area's part of the sheet, %v given all of it", name, l.Owner, r, got, want)
				}
				if nudgeFree(g, k, si, r, obs, nudgeNear{}) != want {
					dropped++
				}
			}
		}
	}
	return tried, dropped
}
