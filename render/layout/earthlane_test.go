package layout

import (
	"testing"

	"pare/render/geom"
)

// TestFacesLane: an earth hung from a winding's end faces the next
// winding's lane when that lane runs less than a grid step past its bars,
// across their width; a lane two steps on, one of the earth's own net, one
// beside the bars, or a rail tag does not. Drawn on squared paper first.
func TestFacesLane(t *testing.T) {
	earth := geom.Local{Kind: geom.LocalGround, Net: "gnd", At: geom.Pt{X: 0, Y: 0}, Box: geom.R(-0.7, 0, 0.7, 0.55), Down: true}
	up := geom.Local{Kind: geom.LocalGround, Net: "gnd", At: geom.Pt{X: 0, Y: 0}, Box: geom.R(-0.7, -0.55, 0.7, 0)}
	rail := earth
	rail.Kind = geom.LocalRail
	pinAt := func(net string, x, y float64, d geom.Dir) []geom.Pin {
		return []geom.Pin{{Name: "p1", Net: net, At: geom.Pt{X: x, Y: y}, Dir: d}}
	}
	cases := []struct {
		name  string
		l     geom.Local
		wired []geom.Pin
		want  bool
	}{
		{"lane on the next grid line under the bars", earth, pinAt("tank", 3, 1, geom.Left), true},
		{"lane two grid lines under", earth, pinAt("tank", 3, 2, geom.Left), false},
		{"its own net's lane", earth, pinAt("gnd", 3, 1, geom.Left), false},
		{"lane leaving the other way", earth, pinAt("tank", 3, 1, geom.Right), false},
		{"turned up, lane above the bars", up, pinAt("tank", 3, -1, geom.Left), true},
		{"turned up, lane below the stub", up, pinAt("tank", 3, 1, geom.Left), false},
		{"a rail tag", rail, pinAt("tank", 3, 1, geom.Left), false},
		{"lane out of a pin four steps off", earth, pinAt("tank", 4.5, 1, geom.Left), false},
	}
	for _, c := range cases {
		if got := facesLane(c.l, c.wired, "gnd"); got != c.want {
			t.Errorf("%s: facesLane %v, want %v", c.name, got, c.want)
		}
	}
}
