package layout

import "testing"

// ifStrip: two transistor IF stages in the trade's form (invented values):
// each IF can's primary from the decoupled supply line to a collector (the
// first from the mixer's input), its link secondary into the next base,
// returned to a bias point; the first two links' cold ends share the AGC
// line. The line is a signal net on the original circuit that the
// reduction ties to AC ground (R10 and C10 decouple it).
const ifStrip = `title = "IF strip"
band = "445k..465k"
inputs = ["in"]
outputs = ["out"]
[nets]
vcc = { role = "supply", volts = 9 }
[parts]
T1 = { windings = { p = "680u", s = "12u" }, k = 0.6, pins = { p1 = "line", p2 = "in", s1 = "b1", s2 = "agc" } }
C1 = { c = "180p", pins = ["in", "line"] }
Q1 = { bjt = "npn", pins = { b = "b1", c = "c1", e = "gnd" } }
T2 = { windings = { p = "680u", s = "12u" }, k = 0.6, pins = { p1 = "line", p2 = "c1", s1 = "b2", s2 = "agc" } }
C2 = { c = "180p", pins = ["c1", "line"] }
Q2 = { bjt = "npn", pins = { b = "b2", c = "c2", e = "gnd" } }
T3 = { windings = { p = "680u", s = "40u" }, k = 0.6, pins = { p1 = "line", p2 = "c2", s1 = "out", s2 = "gnd" } }
C3 = { c = "180p", pins = ["c2", "line"] }
R1 = { r = "2k2", pins = ["agc", "gnd"] }
C4 = { c = "47n", pins = ["agc", "gnd"] }
R10 = { r = "220", pins = ["vcc", "line"] }
C10 = { c = "100u", pins = ["line", "gnd"] }
`

// TestTransformersFollowTheirFeed: signal flows left to right, so an IF
// can stands right of the collector feeding it and left of the base its
// secondary feeds (common practice, ../shared/DRAWING-NOTES.md; what
// render/check's FeedOrder holds the gallery to). The rank along the
// signal used to cross the decoupled supply line (reaching every can on it
// one layer after the first) and the AGC line (reaching T2 from T1's
// secondary), so the cans stood level with or before their collectors,
// and a frame spread over the line took T1 into the second stage.
func TestTransformersFollowTheirFeed(t *testing.T) {
	quiet := map[string]bool{"line": true, "agc": true}
	frames := []Frame{{Title: "S1", Parts: []string{"Q1", "T2", "C2"}}, {Title: "S2", Parts: []string{"Q2", "T3", "C3"}}}
	order := [][2]string{{"T1", "Q1"}, {"Q1", "T2"}, {"T2", "Q2"}, {"Q2", "T3"}}
	for _, tc := range []struct {
		name string
		o    Options
	}{
		{"quiet lines", Options{Quiet: quiet}},
		{"quiet lines, framed", Options{Quiet: quiet, Frames: frames}},
		// the AGC line as a signal net too (a reduced sheet keeps it
		// when its capacitor is no bypass): a can is entered from its
		// collector only
		{"AGC line carrying", Options{Quiet: map[string]bool{"line": true}, Frames: frames}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			res, err := Layout(parse(t, ifStrip), tc.o)
			if err != nil {
				t.Fatal(err)
			}
			for _, p := range order {
				a, b := symbolOf(t, &res.Geom, p[0]), symbolOf(t, &res.Geom, p[1])
				if (a.Box.X0+a.Box.X1)/2 >= (b.Box.X0+b.Box.X1)/2 {
					t.Errorf("%s (x %g..%g) does not stand left of %s (x %g..%g)", p[0], a.Box.X0, a.Box.X1, p[1], b.Box.X0, b.Box.X1)
				}
			}
		})
	}
}
