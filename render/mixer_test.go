package render

import (
	"testing"

	"pare/graph"
	"pare/render/check"
)

// The portable's self-oscillating mixer as the reduction leaves it
// (examples/transistor-front-end.toml at level signal, notes dropped): T2's
// tapped tuned winding sends its tap to C3 on the emitter side while its
// feedback winding's ends go to the collector and to T3's tap. Drawn with
// T2 as written the tap's wire must cross the collector's; mirrored, with
// the padder C4 moved below T3's tap wire, the stage is planar (worked by
// hand on squared paper), and a repairer should get that drawing.
const portableMixer = `
title = "Portable mixer, reduced"
band = "530k..1.6M"
inputs = ["ext_ant"]
outputs = ["if_out"]
[regions]
if = { band = "445k..465k", parts = ["C5", "C7", "C8", "Q2", "R6", "T3", "T4"], input = "q1_c", output = "if_out" }
osc = { band = "985k..2.055M", parts = ["C3", "C4", "T2", "VC1b"] }
[parts]
C1 = { c = "4p7", pins = ["ext_ant", "ant_tank"] }
C3 = { c = "10n", pins = ["osc_tap", "q1_e"] }
C4 = { c = "240p", pins = ["osc_tank", "osc_pad"] }
C5 = { c = "180p", pins = ["ift1_hot", "gnd"] }
C7 = { c = "47n", pins = ["q2_e", "gnd"] }
C8 = { c = "180p", pins = ["ift2_hot", "gnd"] }
P2 = { port = "car aerial socket", pins = ["ext_ant"] }
P3 = { port = "to second IF amplifier", pins = ["if_out"] }
Q1 = { bjt = "npn", pins = { b = "q1_b", c = "q1_c", e = "q1_e" }, beta = 100, ic = "0.5mA" }
Q2 = { bjt = "npn", pins = { b = "q2_b", c = "q2_c", e = "q2_e" }, beta = 80, ic = "1mA" }
R3 = { r = "2k2", pins = ["q1_e", "gnd"] }
R6 = { r = "680R", pins = ["q2_e", "gnd"] }
T1 = { windings = { p = { l = "365u", q = 150 }, s = "8u" }, k = 0.8, pins = { p1 = "ant_tank", p2 = "gnd", s1 = "q1_b", s2 = "gnd" } }
T2 = { windings = { f = "6u", p = ["2u1", "167u"] }, k = 0.5, pins = { f1 = "q1_c", f2 = "ift1_t", p1 = "gnd", p2 = "osc_tank", pt = "osc_tap" }, q = 100 }
T3 = { windings = { p = ["75u", "300u"], s = "20u" }, k = 0.15, pins = { p1 = "gnd", p2 = "ift1_hot", pt = "ift1_t", s1 = "q2_b", s2 = "gnd" }, q = 110 }
T4 = { windings = { p = ["75u", "300u"], s = "20u" }, k = 0.15, pins = { p1 = "gnd", p2 = "ift2_hot", pt = "q2_c", s1 = "if_out", s2 = "gnd" }, q = 110 }
VC1a = { c = "27p..249p", pins = ["ant_tank", "gnd"], gang = "tune" }
VC1b = { c = "33p..255p", pins = ["osc_pad", "gnd"], gang = "tune" }
`

func TestMixerStageUncrossed(t *testing.T) {
	c, err := graph.Parse("mixer.toml", []byte(portableMixer))
	if err != nil {
		t.Fatal(err)
	}
	frames := []Frame{
		{Title: "S1 Coupling capacitor", Parts: []string{"C1"}},
		{Title: "S2 Single-tuned transformer", Parts: []string{"T1", "VC1a"}},
		{Title: "S3 Self-oscillating mixer, oscillator fed into the emitter (BJT)", Parts: []string{"Q1", "R3", "T2", "C3", "C4", "VC1b", "T3", "C5"}},
		{Title: "S4 Tuned amplifier, collector on a tap of the tuned winding (BJT)", Parts: []string{"Q2", "C7", "R6", "T4", "C8"}},
	}
	for _, st := range []Style{IEC, IEEE} {
		g, err := Config{Style: st}.Geometry(&Sheet{Circuit: c, View: Reduced, Frames: frames})
		if err != nil {
			t.Fatal(err)
		}
		r := check.Measure(g)
		for _, p := range r.Problems() {
			t.Errorf("%s: %s", st, p)
		}
		for i, n := range r.FrameCrossings {
			if n != 0 {
				t.Errorf("%s: %d crossing(s) inside frame %q", st, n, g.Frames[i].Title.Lines[0])
			}
		}
	}
}
