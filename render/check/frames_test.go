package check

import (
	"strings"
	"testing"

	"pare/render/geom"
)

// A frame round R1 alone (x −1..5) is clean; stretched to x −1..15 it
// encloses R2: an intruder when R2 is another frame's part, a stray when
// R2 is in no stage. Worked by hand on squared paper.
func TestFrameIntruders(t *testing.T) {
	frame := func(x1 float64, parts ...string) geom.Frame {
		return geom.Frame{Box: geom.Rect{X0: -1, Y0: -3, X1: x1, Y1: 3}, Title: geom.Label{Lines: []string{"S1"}}, Parts: parts}
	}
	far := geom.Frame{Box: geom.Rect{X0: 30, Y0: -3, X1: 40, Y1: 3}, Title: geom.Label{Lines: []string{"S2"}}, Parts: []string{"R2"}}
	cases := []struct {
		name              string
		frames            []geom.Frame
		intruders, strays int
	}{
		{"own parts only", []geom.Frame{frame(5, "R1"), far}, 0, 0},
		{"another stage's part inside", []geom.Frame{frame(15, "R1"), far}, 1, 0},
		{"a part of no stage inside", []geom.Frame{frame(15, "R1")}, 0, 1},
		{"no parts listed: not judged", []geom.Frame{frame(15)}, 0, 0},
	}
	for _, tc := range cases {
		g := clean()
		g.Frames = tc.frames
		r := Measure(g)
		if len(r.FrameIntruders) != tc.intruders || len(r.FrameStrays) != tc.strays {
			t.Errorf("%s: intruders %q, strays %q", tc.name, r.FrameIntruders, r.FrameStrays)
		}
		if tc.intruders > 0 && !strings.Contains(strings.Join(r.Problems(), "\n"), "R2 of another stage") {
			t.Errorf("%s: an intruder is not a problem: %q", tc.name, r.Problems())
		}
	}
}
