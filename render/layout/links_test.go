package layout

import (
	"testing"

	"pare/render/geom"
)

// TestLinkPathsShortOnly: a gang link is offered between sections whose
// centres lie within linkReach grid steps along an L, and never round the
// drawing (review18 b02's loop read as a frame).
func TestLinkPathsShortOnly(t *testing.T) {
	sq := func(x, y float64) geom.Rect { return geom.Rect{X0: x - 1, Y0: y - 1, X1: x + 1, Y1: y + 1} }
	cases := []struct {
		name   string
		a, b   geom.Rect
		offers bool
	}{
		{"level, 8 apart", sq(0, 0), sq(8, 0), true},
		{"one bend, 3 + 13 (neighbouring sections)", sq(0, 0), sq(13, 3), true},
		{"one bend, 10 + 10", sq(0, 0), sq(10, 10), true},
		{"one bend, 11 + 10", sq(0, 0), sq(11, 10), false},
		{"far across the sheet", sq(0, 0), sq(40, 20), false},
	}
	for _, c := range cases {
		paths := linkPaths(c.a, c.b)
		if (len(paths) > 0) != c.offers {
			t.Errorf("%s: %d paths offered, want offered %v", c.name, len(paths), c.offers)
		}
		for _, p := range paths {
			if len(p) != 3 {
				t.Errorf("%s: path %v has more than one bend", c.name, p)
			}
		}
	}
}
