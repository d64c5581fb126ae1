package check

import (
	"testing"

	"pare/render/geom"
	"pare/render/symbol"
)

// Hand-worked geometry: "C8 100p" (7 characters, 7 × CharW = 4.34 grid
// wide) set at x = 0, y = 0; the second label is set at x = 4.34 + gap,
// dy lower; a part's body, when given, stands in the gap 0.4 from the
// first label. Expected counts by eye.
func TestRunTogether(t *testing.T) {
	w := symbol.TextWidth("C8 100p")
	cases := []struct {
		name    string
		owner   string
		gap, dy float64
		small   bool
		body    float64 // width of a symbol in the gap, 0 for none
		want    int
	}{
		{"touching on one baseline (review21 b03)", "T1", 0, 0, false, 0, 1},
		{"half a character apart, two hundredths lower (review21 a02)", "T3", 0.3, 0.2, false, 0, 1},
		{"two characters apart", "T3", 2 * symbol.CharW, 0, false, 0, 0},
		{"a line lower, touching in x", "T3", 0, symbol.LineH, false, 0, 0},
		{"overlapping in x, half a line lower", "T3", -1, symbol.LineH / 2, false, 0, 1},
		{"the part's own pin figure", "C8.a", 0, 0, true, 0, 0},
		{"another part's pin figure", "V1.g1", 0.2, 0, true, 0, 1},
		// review21 b03: T1's name 0.4 past C15's plates (1.6 wide),
		// C15's label 0.4 before them
		{"a standing capacitor between", "T1", 2.4, 0, false, 1.6, 1},
		{"a lying resistor between", "R2", 4.8, 0, false, 4, 0},
	}
	for _, c := range cases {
		g := &geom.Sheet{Labels: []geom.Label{
			{Owner: "C8", Lines: []string{"C8 100p"}, Box: geom.Rect{X0: 0, Y0: 0, X1: w, Y1: symbol.LineH}},
			{Owner: c.owner, Lines: []string{"T3 k=0.01"}, Small: c.small, Box: geom.Rect{X0: w + c.gap, Y0: c.dy, X1: w + c.gap + 6, Y1: c.dy + symbol.LineH}},
		}}
		if c.body > 0 {
			g.Symbols = []geom.Symbol{withKind(sym("C8", w+0.4, -1, w+0.4+c.body, 3), "capacitor")}
		}
		if got := RunTogether(g); len(got) != c.want {
			t.Errorf("%s: %d findings %q, want %d", c.name, len(got), got, c.want)
		}
	}
}
