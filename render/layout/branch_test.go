package layout

import (
	"math"
	"testing"

	"pare/render/geom"
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

// TestShuntHangsBelowItsWire: a two-terminal part standing upright from a
// wire that runs across (the loudspeaker on its transformer's secondary)
// stands with its upper pin below that wire, so the wire passes straight
// over it with a T and a drop to the pin (common practice: a shunt hangs
// from the wire it loads). Level with the secondary's pin, the wire had to
// climb over the pin and come back down: a bump that ran one grid step
// under the anode's wire to the tone control (render/check's reader: wires
// one step apart read as one).
func TestShuntHangsBelowItsWire(t *testing.T) {
	frames := []Frame{
		{Title: "output stage", Parts: []string{"C1", "R1", "V1", "R2", "T1", "LS1"}},
		{Title: "tone control", Parts: []string{"C2", "RV1"}},
	}
	res, err := Layout(parse(t, outputWithTone), Options{Frames: frames})
	if err != nil {
		t.Fatal(err)
	}
	pinOf := func(ref, net string) geom.Pin {
		for _, p := range symbolOf(t, &res.Geom, ref).Pins {
			if p.Net == net {
				return p
			}
		}
		t.Fatalf("%s has no pin on %s", ref, net)
		return geom.Pin{}
	}
	s, ls := pinOf("T1", "spk"), pinOf("LS1", "spk")
	if ls.Dir != geom.Up || ls.At.Y <= s.At.Y {
		t.Errorf("loudspeaker's pin at y %g (leaving %v), the secondary's at y %g: want it below, leaving upwards", ls.At.Y, ls.Dir, s.At.Y)
	}
	for _, w := range res.Geom.Wires {
		for _, g := range w.Segs {
			if w.Net == "spk" && math.Min(g.A.Y, g.B.Y) < s.At.Y {
				t.Errorf("the loudspeaker's wire climbs above its secondary's pin: %v", g)
			}
		}
	}
}
