package layout

import (
	"testing"
)

// outputWithTone: an output pentode into its transformer and loudspeaker,
// an extension socket on the speaker's net, and a top-cut tone control
// (capacitor and rheostat) hanging on the anode: a stage of its own after
// the output stage. Invented values.
const outputWithTone = `title = "output"
band = "20..20k"
inputs = ["in"]
outputs = ["spk"]
[nets]
ht = { role = "supply", volts = 250, label = "HT +250 V" }
[parts]
C1 = { c = "22n", pins = ["in", "g"] }
R1 = { r = "470k", pins = ["g", "gnd"] }
V1 = { valve = "pentode", pins = { a = "a", g1 = "g", g2 = "ht", g3 = "k", k = "k" } }
R2 = { r = "160", pins = ["k", "gnd"] }
T1 = { windings = { p = "15", s = "6m" }, k = 0.99, pins = { p1 = "a", p2 = "ht", s1 = "spk", s2 = "gnd" } }
LS1 = { spk = "3R", pins = ["spk", "gnd"] }
P1 = { port = "extension speaker socket", pins = ["spk"] }
C2 = { c = "47n", pins = ["a", "tone"] }
RV1 = { pot = "50k", pins = ["tone", "gnd", "gnd"] }
`

// TestSocketBesideItsNet: a port stands with the parts on its net, not
// after a later stage that only hangs on another net of the same stage (a
// branch): the extension socket beside the loudspeaker, the tone control
// after them on a wire from the anode. With the socket at the sheet's edge
// past the tone control, the tone control read as wired in series between
// the loudspeaker and the socket (common practice: parts on one net drawn
// together; a branch drawn at the net it hangs on).
func TestSocketBesideItsNet(t *testing.T) {
	frames := []Frame{
		{Title: "output stage", Parts: []string{"C1", "R1", "V1", "R2", "T1", "LS1"}},
		{Title: "tone control", Parts: []string{"C2", "RV1"}},
	}
	for _, untangle := range []bool{false, true} {
		res, err := Layout(parse(t, outputWithTone), Options{Frames: frames, Untangle: untangle})
		if err != nil {
			t.Fatal(err)
		}
		x := map[string]float64{}
		for _, s := range res.Geom.Symbols {
			x[s.Ref] = s.Box.X0
		}
		if x["P1"] < x["LS1"] || x["P1"] > x["C2"] || x["P1"] > x["RV1"] {
			t.Errorf("untangle %v: socket at x %g, loudspeaker %g, tone control %g and %g: want the socket after the loudspeaker, before the tone control",
				untangle, x["P1"], x["LS1"], x["C2"], x["RV1"])
		}
	}
}
