package check

import (
	"testing"

	"pare/render/geom"
)

// Hand-worked geometry (squared paper, one unit a grid step): a transistor
// Q1 boxed (0,0)-(4,4), collector pin at (2,0) pointing up, base at (0,2)
// left, emitter at (2,4) down; its collector lead runs up, right to x 6
// and down past the emitter's level to R1 at (6,8). The counts follow from
// the rule by hand: a crossing counts only between two of one part's leads
// on different nets, each lead ending at its first junction or pin.
func TestOwnLeadCrossings(t *testing.T) {
	q1 := sym("Q1", 0, 0, 4, 4, pin("c", "col", 2, 0, geom.Up), pin("b", "base", 0, 2, geom.Left), pin("e", "em", 2, 4, geom.Down))
	q1.Kind = "transistor"
	r1 := sym("R1", 5.5, 8, 6.5, 12, pin("1", "col", 6, 8, geom.Up), pin("2", "vcc", 6, 12, geom.Down))
	r2 := sym("R2", 7.5, 6, 11.5, 7, pin("1", "em", 8, 6, geom.Left), pin("2", "0", 11, 6, geom.Right))
	r3 := sym("R3", -6, 5.5, -2, 6.5, pin("1", "em", -2, 6, geom.Right), pin("2", "0", -6, 6, geom.Left))
	col := wire("col", seg(2, 0, 2, -2), seg(2, -2, 6, -2), seg(6, -2, 6, 8))
	cases := []struct {
		name  string
		parts []geom.Symbol
		ws    []geom.Wire
		dots  []geom.Pt
		want  int
	}{
		// review22 b01: the collector's lead down across the emitter's
		{"collector lead over the emitter lead", []geom.Symbol{q1, r1, r2}, []geom.Wire{col, wire("em", seg(2, 4, 2, 6), seg(2, 6, 8, 6))}, nil, 1},
		{"emitter lead turned away", []geom.Symbol{q1, r1, r3}, []geom.Wire{col, wire("em", seg(2, 4, 2, 6), seg(2, 6, -2, 6))}, nil, 0},
		// the emitter's lead ends at a junction dot before the crossing:
		// what lies beyond is the net's wiring, not the part's lead
		{"crossing beyond the emitter's junction", []geom.Symbol{q1, r1, r2, r3},
			[]geom.Wire{col, wire("em", seg(2, 4, 2, 6), seg(2, 6, 8, 6), seg(2, 6, -2, 6))}, []geom.Pt{{X: 2, Y: 6}}, 0},
		// a two-pin part's leads are not counted: no tangle of its own
		{"two-pin part", []geom.Symbol{withKind(r1, "resistor"), withKind(r2, "resistor")}, []geom.Wire{col, wire("em", seg(2, 6, 8, 6))}, nil, 0},
	}
	for _, c := range cases {
		g := &geom.Sheet{Symbols: c.parts, Wires: c.ws, Dots: c.dots}
		if got := OwnLeadCrossings(g); len(got) != c.want {
			t.Errorf("%s: %q, want %d findings", c.name, got, c.want)
		}
	}
}
