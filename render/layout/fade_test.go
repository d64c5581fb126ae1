package layout

import (
	"reflect"
	"testing"

	"pare/render/geom"
)

// TestFadeRunsGreysOnlyTheBranch: two live pins and a third pin between
// them, above their line, on one net. Fading the third pin's part (or only that pin,
// as a dropped heater or grid) greys the branch and nothing else, and the
// wires are where they are with nothing faded: the faded view is the full
// view's wiring (the rule a technician follows greying a copy by hand:
// common practice).
func TestFadeRunsGreysOnlyTheBranch(t *testing.T) {
	sheet := func() *state {
		return handSheet(
			box{"A", geom.R(-1, -1, 2, 1), []geom.Pin{pinAt("n", 2, 0, geom.Right)}},
			box{"B", geom.R(10, -1, 13, 1), []geom.Pin{pinAt("n", 10, 0, geom.Left)}},
			box{"C", geom.R(5, -6, 7, -3), []geom.Pin{pinAt("n", 6, -3, geom.Down)}},
		)
	}
	plain, _ := routeSheet(sheet(), true)
	for _, tc := range []struct {
		name string
		fade func(*state)
	}{
		{"faded part", func(ly *state) { ly.cells[2].faded = true }},
		{"dropped pin", func(ly *state) { ly.cells[2].fadedPins = map[string]bool{"n": true} }},
	} {
		ly := sheet()
		tc.fade(ly)
		g, _ := routeSheet(ly, true)
		if !reflect.DeepEqual(steps(plain, nil), steps(g, nil)) {
			t.Errorf("%s: the wires moved when a pin was faded", tc.name)
		}
		live := map[geom.Pt]int{} // live steps at each point
		fadedAtC := 0
		for st, faded := range steps(g, new(bool)) {
			if !faded {
				live[st.A]++
				live[st.B]++
			} else if st.A == (geom.Pt{X: 6, Y: -3}) || st.B == (geom.Pt{X: 6, Y: -3}) {
				fadedAtC++
			}
		}
		// the live wire is one path from A's pin to B's pin: both ends
		// there, no live end anywhere else, and C's pin on faded wire only
		for p, n := range live {
			end := p == geom.Pt{X: 2, Y: 0} || p == geom.Pt{X: 10, Y: 0}
			if (n == 1) != end || n > 2 {
				t.Errorf("%s: %d live steps at %v", tc.name, n, p)
			}
		}
		if live[geom.Pt{X: 2, Y: 0}] != 1 || live[geom.Pt{X: 10, Y: 0}] != 1 || fadedAtC != 1 {
			t.Errorf("%s: live ends %d, %d, faded steps at C %d; want 1, 1, 1", tc.name,
				live[geom.Pt{X: 2, Y: 0}], live[geom.Pt{X: 10, Y: 0}], fadedAtC)
		}
	}
}

// steps splits a sheet's wires into unit steps, with whether each is faded
// (or all false when style is nil, to compare where the wires run).
func steps(g *geom.Sheet, style *bool) map[geom.Seg]bool {
	out := map[geom.Seg]bool{}
	for _, w := range g.Wires {
		for i, s := range w.Segs {
			a, b := s.A, s.B
			if b.X < a.X || b.Y < a.Y {
				a, b = b, a
			}
			dx, dy := sign(b.X-a.X), sign(b.Y-a.Y)
			for p := a; p != b; {
				q := geom.Pt{X: p.X + dx, Y: p.Y + dy}
				out[geom.Seg{A: p, B: q}] = style != nil && w.Faded[i]
				p = q
			}
		}
	}
	return out
}

func sign(v float64) float64 {
	switch {
	case v > 0:
		return 1
	case v < 0:
		return -1
	}
	return 0
}
