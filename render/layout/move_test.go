package layout

import (
	"reflect"
	"testing"

	"pare/graph"
	"pare/render/geom"
	"pare/render/symbol"
)

// TestCellMoveKeepsGivenShape: a cell moves its shape in place once the
// shape is its own (cell.move), so the shape it was given (an orientation
// other cells or a later turn may share) must stay where it was, and the
// moved shape must be the same numbers as the copying Moved, move by move
// (the expected values are Moved's own sums, the behaviour before the
// in-place shift).
func TestCellMoveKeepsGivenShape(t *testing.T) {
	p := &graph.Part{Ref: "R1", Kind: graph.Resistor, Pins: []graph.Pin{{Name: "1", Net: "a"}, {Name: "2", Net: "b"}}}
	base := symbol.For(p, symbol.IEC)
	given := base.Oriented(base.Turns[0])
	before := given.Owned()
	moves := []geom.Pt{{X: 3}, {X: 0.1, Y: -2}, {X: 7, Y: 0.3}}
	cases := []struct {
		name  string
		reset int // after this many moves the cell is given the shape again (a turn put back); -1 never
	}{
		{"three moves", -1},
		{"given again after one", 1},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			cl := &cell{part: p, ref: p.Ref, shape: given}
			want := given
			for i, d := range moves {
				if i == tc.reset {
					cl.shape, want = given, given
				}
				cl.move(d)
				want = want.Moved(d)
			}
			if !reflect.DeepEqual(cl.shape, want) {
				t.Errorf("moved shape %+v, want %+v", cl.shape, want)
			}
			if !reflect.DeepEqual(given, before) {
				t.Errorf("the given shape changed: %+v, was %+v", given, before)
			}
		})
	}
}
