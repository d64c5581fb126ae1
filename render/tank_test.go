package render

import (
	"math"
	"testing"

	"pare/graph"
	"pare/render/check"
	"pare/render/geom"
)

// A cathode-tapped Hartley oscillator whose tank capacitance is a padder in
// series with the tuning capacitor, as a reduced sheet shows it. The trade
// draws a tuned circuit's L and C side by side, both vertical, joined at the
// top (DRAWING-NOTES.md, "conventions a reader expects"): the padder stands
// beside the coil, level with its hot end, the tuning capacitor under it.
const paddedTank = `
title = "Padded Hartley tank"
band = "1M..2M"
inputs = ["in"]
outputs = ["out"]
[parts]
C1 = { c = "10p", pins = ["in", "g"] }
R1 = { r = "47k", pins = ["g", "gnd"] }
C2 = { c = "100p", pins = ["g", "tank"] }
V1 = { valve = "triode", gm = "2mA/V", ra = "20k", pins = { a = "out", g1 = "g", k = "k" } }
R2 = { r = "10k", pins = ["out", "gnd"] }
L1 = { l = "128u", tap = 0.1, pins = ["tank", "k", "gnd"] }
C3 = { c = "380p", pins = ["tank", "pad"] }
VC1 = { c = "53p..406p", pins = ["pad", "gnd"] }
`

func TestPaddedTankSideBySide(t *testing.T) {
	c, err := graph.Parse("tank.toml", []byte(paddedTank))
	if err != nil {
		t.Fatal(err)
	}
	for _, st := range []Style{IEC, IEEE} {
		g, err := Config{Style: st}.Geometry(&Sheet{Circuit: c, View: Reduced})
		if err != nil {
			t.Fatal(err)
		}
		if p := check.Measure(g).Problems(); len(p) > 0 {
			t.Errorf("%s: %v", st, p)
		}
		pin := map[string]geom.Pt{}
		for _, s := range g.Symbols {
			for _, p := range s.Pins {
				pin[s.Ref+"."+p.Name] = p.At
			}
		}
		hot, pad, tune := pin["L1.1"], pin["C3.1"], pin["VC1.1"]
		if hot.Y != pad.Y || math.Abs(hot.X-pad.X) > 10 {
			t.Errorf("%s: padder's top pin at %v, coil's hot end at %v: want them level and at most 10 steps apart (room for the coil's label between)", st, pad, hot)
		}
		if tune.X != pin["C3.2"].X || tune.Y <= pin["C3.2"].Y || tune.Y-pin["C3.2"].Y > 4 {
			t.Errorf("%s: tuning capacitor's top pin at %v, padder's lower pin at %v: want it just under the padder", st, tune, pin["C3.2"])
		}
	}
}
