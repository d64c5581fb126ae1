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
