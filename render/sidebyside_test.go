package render

import (
	"testing"

	"pare/render/geom"
)

// TestBandPlacesRows: where band stands each row on a page 136 by 88 grid
// units (A3 less its margins and foot), rows 4 apart: under the last while
// it fits, else right of it, level with its top, sideGap (8) away, while
// both fit the width; nowhere on a page kept alone. The expected places
// are the page's arithmetic (widths and heights added), worked by hand.
func TestBandPlacesRows(t *testing.T) {
	type row struct {
		w, h   float64
		beside bool // placed as a chosen plan's row beside the last
	}
	cases := []struct {
		name  string
		rows  []row
		alone bool // the first row keeps its page
		want  geom.Pt
		ok    bool
	}{
		{"under while it fits", []row{{100, 40, false}, {100, 40, false}}, false, geom.Pt{X: 0, Y: 44}, true},
		{"beside when too tall to go under", []row{{60, 50, false}, {60, 50, false}}, false, geom.Pt{X: 68, Y: 0}, true},
		{"not beside when too wide", []row{{60, 50, false}, {80, 50, false}}, false, geom.Pt{}, false},
		{"beside as chosen, though it fits under", []row{{40, 20, false}, {40, 20, true}}, false, geom.Pt{X: 48, Y: 0}, true},
		{"under both after a pair", []row{{60, 50, false}, {60, 50, false}, {130, 30, false}}, false, geom.Pt{X: 0, Y: 54}, true},
		{"beside the lower row of two", []row{{130, 30, false}, {60, 50, false}, {60, 50, false}}, false, geom.Pt{X: 68, Y: 34}, true},
		{"a third beside a pair", []row{{40, 50, false}, {40, 50, false}, {40, 50, false}}, false, geom.Pt{X: 96, Y: 0}, true},
		{"too tall beside the lower row", []row{{130, 40, false}, {60, 40, false}, {60, 50, false}}, false, geom.Pt{}, false},
		{"nothing on a page kept alone", []row{{140, 100, false}, {10, 10, false}}, true, geom.Pt{}, false},
	}
	for _, tc := range cases {
		p := newBand(136, 88, rowGap)
		var got geom.Pt
		ok := true
		for i, r := range tc.rows {
			b := geom.R(0, 0, r.w, r.h)
			if i == 0 {
				p.put(b, geom.Pt{})
				if tc.alone {
					p.alone()
				}
				continue
			}
			got, ok = p.at(b, r.beside)
			if !ok {
				break
			}
			p.put(b, got)
		}
		if ok != tc.ok || ok && got != tc.want {
			t.Errorf("%s: last row at %v (%v), want %v (%v)", tc.name, got, ok, tc.want, tc.ok)
		}
	}
}
