package render

import (
	"reflect"
	"testing"

	"pare/graph"
	"pare/render/geom"
)

// TestUnitsByWiring: the groups a page cut must not separate are found by
// wiring alone, and wiring that only looks alike is not taken for them.
// Common practice: a push-pull pair shares its cathode (or is driven from
// the two ends of a centre-tapped winding) and feeds the two ends of one
// output winding; a Zobel is a series R and C across the speaker.
func TestUnitsByWiring(t *testing.T) {
	cases := []struct {
		name, toml string
		want       [][]string
	}{
		{"pentodes sharing a cathode, one output winding", pushPullStage, [][]string{{"T1", "V1", "V2"}}},
		{"class B driven from a centre-tapped winding", `
band = "60..8k"
inputs = ["in"]
outputs = ["spk"]
[nets]
vcc = { role = "supply", volts = 9 }
[parts]
T1 = { windings = { p = "3", s = ["0.4", "0.4"] }, k = 0.95, pins = { p1 = "vcc", p2 = "in", s1 = "b1", st = "bias", s2 = "b2" } }
R1 = { r = "100", pins = ["bias", "gnd"] }
Q1 = { bjt = "npn", pins = { b = "b1", c = "c1", e = "e1" } }
Q2 = { bjt = "npn", pins = { b = "b2", c = "c2", e = "e2" } }
R2 = { r = "2R2", pins = ["e1", "gnd"] }
R3 = { r = "2R2", pins = ["e2", "gnd"] }
T2 = { windings = { p = ["0.1", "0.1"], s = "8m" }, k = 0.98, pins = { p1 = "c1", pt = "vcc", p2 = "c2", s1 = "gnd", s2 = "spk" } }
LS1 = { spk = "8", pins = ["spk", "gnd"] }
`, [][]string{{"Q1", "Q2", "T2"}, {"LS1", "T2"}}},
		{"two IF stages, emitters on chassis, each on its own can", `
band = "60..8k"
inputs = ["in"]
outputs = ["out"]
[nets]
vcc = { role = "supply", volts = 9 }
[parts]
Q1 = { bjt = "npn", pins = { b = "in", c = "c1", e = "gnd" } }
T1 = { windings = { p = "450u", s = "12u" }, k = 0.15, pins = { p1 = "vcc", p2 = "c1", s1 = "b2", s2 = "gnd" } }
Q2 = { bjt = "npn", pins = { b = "b2", c = "c2", e = "gnd" } }
T2 = { windings = { p = "450u", s = "12u" }, k = 0.15, pins = { p1 = "vcc", p2 = "c2", s1 = "out", s2 = "gnd" } }
R1 = { r = "10k", pins = ["out", "gnd"] }
`, nil},
		{"long-tailed pair into two resistors", `
band = "60..8k"
inputs = ["in"]
outputs = ["out"]
[nets]
vcc = { role = "supply", volts = 12 }
[parts]
Q1 = { bjt = "npn", pins = { b = "in", c = "c1", e = "tail" } }
Q2 = { bjt = "npn", pins = { b = "gnd", c = "out", e = "tail" } }
R1 = { r = "4k7", pins = ["tail", "gnd"] }
R2 = { r = "4k7", pins = ["vcc", "c1"] }
R3 = { r = "4k7", pins = ["vcc", "out"] }
`, nil},
		{"grounded cathodes fed from a cathodyne's anode and cathode", `
band = "60..8k"
inputs = ["in"]
outputs = ["spk"]
[nets]
ht = { role = "supply", volts = 250 }
[parts]
V1 = { valve = "triode", gm = "2mA/V", ra = "60k", pins = { a = "pa", g1 = "in", k = "pk" } }
R1 = { r = "47k", pins = ["ht", "pa"] }
R2 = { r = "47k", pins = ["pk", "gnd"] }
C1 = { c = "47n", pins = ["pa", "g1"] }
C2 = { c = "47n", pins = ["pk", "g2"] }
R3 = { r = "470k", pins = ["g1", "gnd"] }
R4 = { r = "470k", pins = ["g2", "gnd"] }
V2 = { valve = "triode", gm = "6mA/V", ra = "2k", pins = { a = "a1", g1 = "g1", k = "gnd" } }
V3 = { valve = "triode", gm = "6mA/V", ra = "2k", pins = { a = "a2", g1 = "g2", k = "gnd" } }
T1 = { windings = { p = ["10", "10"], s = "25m" }, k = 0.99, pins = { p1 = "a1", pt = "ht", p2 = "a2", s1 = "spk", s2 = "gnd" } }
R5 = { r = "8", pins = ["spk", "gnd"] }
`, [][]string{{"T1", "V2", "V3"}}},
		{"two stages on one transformer's windings, not its ends", `
band = "60..8k"
inputs = ["in"]
outputs = ["out"]
[nets]
vcc = { role = "supply", volts = 9 }
[parts]
Q1 = { bjt = "npn", pins = { b = "in", c = "c1", e = "t" } }
Q2 = { bjt = "npn", pins = { b = "in2", c = "c2", e = "t" } }
R1 = { r = "1k", pins = ["t", "gnd"] }
C1 = { c = "10n", pins = ["in", "in2"] }
T1 = { windings = { p = "1m", s = "1m" }, k = 0.5, pins = { p1 = "vcc", p2 = "c1", s1 = "c2", s2 = "out" } }
R2 = { r = "1k", pins = ["out", "gnd"] }
`, nil},
		{"Zobel across a speaker, feedback from it not", `
band = "60..8k"
inputs = ["in"]
outputs = ["spk"]
[parts]
Q1 = { bjt = "npn", pins = { b = "in", c = "gnd", e = "e1" } }
C1 = { c = "470u", pins = ["e1", "spk"] }
LS1 = { spk = "8", pins = ["spk", "gnd"] }
R1 = { r = "10R", pins = ["spk", "zb"] }
C2 = { c = "47n", pins = ["zb", "gnd"] }
R2 = { r = "10k", pins = ["spk", "in"] }
`, [][]string{{"C2", "LS1", "R1"}}},
	}
	for _, tc := range cases {
		c, err := graph.Parse(tc.name+".toml", []byte(tc.toml))
		if err != nil {
			t.Fatalf("%s: %v", tc.name, err)
		}
		if got := units(c); !reflect.DeepEqual(got, tc.want) {
			t.Errorf("%s: units %v, want %v", tc.name, got, tc.want)
		}
	}
}

// TestUnitsOneStretch: the stretches a sheet is cut between keep a unit in
// one, however the frames and the whole sheet's placement split it: halves
// of a pair framed as two stages with the bias network placed between
// them, and a Zobel placed left of the stage before its loudspeaker (a
// branch hung on a later stretch, which branchesBeside leaves in place).
// On the six-transistor set the review found Q6 a page after Q5, and the
// Zobel a page away from its loudspeaker, both by such placements.
func TestUnitsOneStretch(t *testing.T) {
	c, err := graph.Parse("classb.toml", []byte(`
band = "60..8k"
inputs = ["in"]
outputs = ["spk"]
[nets]
vcc = { role = "supply", volts = 9 }
[parts]
T1 = { windings = { p = "3", s = ["0.4", "0.4"] }, k = 0.95, pins = { p1 = "vcc", p2 = "in", s1 = "b1", st = "bias", s2 = "b2" } }
R1 = { r = "100", pins = ["bias", "gnd"] }
C1 = { c = "100u", pins = ["bias", "gnd"] }
Q1 = { bjt = "npn", pins = { b = "b1", c = "c1", e = "e1" } }
Q2 = { bjt = "npn", pins = { b = "b2", c = "c2", e = "e2" } }
R2 = { r = "2R2", pins = ["e1", "gnd"] }
R3 = { r = "2R2", pins = ["e2", "gnd"] }
T2 = { windings = { p = ["0.1", "0.1"], s = "8m" }, k = 0.98, pins = { p1 = "c1", pt = "vcc", p2 = "c2", s1 = "gnd", s2 = "spk" } }
R4 = { r = "10R", pins = ["spk", "zb"] }
C2 = { c = "47n", pins = ["zb", "gnd"] }
R5 = { r = "1k", pins = ["spk", "in"] }
LS1 = { spk = "8", pins = ["spk", "gnd"] }
`))
	if err != nil {
		t.Fatal(err)
	}
	s := &Sheet{Circuit: c, View: Reduced, Frames: []Frame{
		{Title: "S1", Parts: []string{"T1"}},
		{Title: "S2", Parts: []string{"Q1", "R2"}},
		{Title: "S3", Parts: []string{"R1", "C1"}},
		{Title: "S4", Parts: []string{"Q2", "R3", "T2"}},
		{Title: "S5", Parts: []string{"R4", "C2"}},
		{Title: "S6", Parts: []string{"R5"}},
		{Title: "S7", Parts: []string{"LS1"}},
	}}
	ext := map[string]geom.Rect{}
	for i, f := range s.Frames {
		for _, r := range f.Parts {
			ext[r] = geom.Rect{X0: float64(20 * i), Y0: 0, X1: float64(20*i + 10), Y1: 10}
		}
	}
	stretchOf := map[string]int{}
	for i, b := range blocks(s, ext) {
		for _, r := range b.refs {
			stretchOf[r] = i
		}
	}
	for _, u := range [][]string{{"Q1", "Q2", "T2"}, {"LS1", "T2"}, {"LS1", "R4", "C2"}} {
		for _, r := range u {
			if stretchOf[r] != stretchOf[u[0]] {
				t.Errorf("%s in stretch %d, %s in stretch %d: %v is one unit", r, stretchOf[r], u[0], stretchOf[u[0]], u)
			}
		}
	}
	if stretchOf["R5"] == stretchOf["LS1"] {
		t.Errorf("R5 (feedback from the speaker to the input, not across it) joined to the speaker's stretch")
	}
}
