package render

import (
	"testing"

	"pare/render/geom"
)

// TestBandBesideCorner: on a page 136 by 94 grid units (A3's printable
// area at the paper's scale) with 88 above a footer across the page, and
// a corner footer 50 wide and 12 tall, a row too tall for the room above
// the footer goes down to 93 (the printable foot less one unit) where it
// keeps left of the corner (136 - 50 - cornerGap = 84), rows 4 apart, and not where it
// reaches into it. The expected places are the page's arithmetic, worked
// by hand; with no corner (a zero footCorner) every such row opens a page.
func TestBandBesideCorner(t *testing.T) {
	corner := footCorner{w: 50, h: 12}
	cases := []struct {
		name   string
		rows   [][2]float64 // w, h
		corner footCorner
		want   geom.Pt
		ok     bool
	}{
		{"narrow last row beside the corner", [][2]float64{{120, 36}, {130, 30}, {44, 16}}, corner, geom.Pt{X: 0, Y: 74}, true},
		{"as wide as the room left of the corner", [][2]float64{{120, 36}, {130, 30}, {84, 16}}, corner, geom.Pt{X: 0, Y: 74}, true},
		{"into the corner", [][2]float64{{120, 36}, {130, 30}, {85, 16}}, corner, geom.Pt{}, false},
		{"below the printable area", [][2]float64{{120, 36}, {130, 30}, {44, 20}}, corner, geom.Pt{}, false},
		{"no corner footer", [][2]float64{{120, 36}, {130, 30}, {44, 16}}, footCorner{}, geom.Pt{}, false},
		{"beside a row, left of the corner", [][2]float64{{130, 66}, {40, 20}, {30, 20}}, corner, geom.Pt{X: 48, Y: 70}, true},
		{"beside a row, into the corner", [][2]float64{{130, 66}, {40, 20}, {40, 20}}, corner, geom.Pt{}, false},
	}
	for _, tc := range cases {
		p := newBand(136, 88, rowGap)
		p.ch, p.corner = 94, tc.corner
		var got geom.Pt
		ok := true
		for i, r := range tc.rows {
			b := geom.R(0, 0, r[0], r[1])
			if i == 0 {
				p.put(b, geom.Pt{})
				continue
			}
			got, ok = p.at(b, false)
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
