package graph

import "testing"

// Where the signal starts in a circuit with no declared input: an
// oscillator (a device with a coil and a capacitor on one of its nets)
// before anything else, else the active part whose control no other device
// drives, whatever the order of refs; nothing without an active part.
func TestInferredInput(t *testing.T) {
	cases := []struct {
		name, parts   string
		net, ref, why string
		upstream      string
	}{
		{"chain written backwards", `
V1 = { valve = "triode", pins = { a = "ht", g1 = "a2", k = "k1" } }
R1 = { r = "10k", pins = ["k1", "gnd"] }
V2 = { valve = "triode", pins = { a = "a2", g1 = "g2", k = "gnd" } }
R2 = { r = "47k", pins = ["ht", "a2"] }
C1 = { c = "22n", pins = ["src", "g2"] }
R3 = { r = "470k", pins = ["g2", "gnd"] }`, "g2", "V2", "first active part", "src"},
		{"oscillator before the first device", `
Q1 = { bjt = "npn", pins = { b = "b1", c = "ht", e = "e1" } }
R1 = { r = "1k", pins = ["e1", "gnd"] }
Q2 = { bjt = "npn", pins = { b = "b2", c = "tank", e = "gnd" } }
L1 = { l = "100u", pins = ["tank", "ht"] }
C1 = { c = "250p", pins = ["tank", "ht"] }
C2 = { c = "1n", pins = ["tank", "b1"] }
R2 = { r = "10k", pins = ["b2", "gnd"] }`, "b2", "Q2", "oscillator", "b2"},
		// The review VFO (issue 10): the oscillator's cathode on the tank
		// coil's tap, its grid through a grid capacitor; a buffer with the
		// lower ref coupled to the tank by 4p7. The oscillator starts it;
		// the passive walk upstream of its grid ends at the buffer's grid,
		// so callers start an oscillator's walk at its own control.
		{"oscillator on a tap before its buffer", `
V1 = { valve = "triode", pins = { a = "ht", g1 = "g2", k = "k2" } }
R1 = { r = "470k", pins = ["g2", "gnd"] }
R5 = { r = "2k2", pins = ["k2", "gnd"] }
C6 = { c = "4p7", pins = ["tank", "g2"] }
V2 = { valve = "triode", pins = { a = "ht", g1 = "g1", k = "k1" } }
L1 = { l = "4u7", tap = 0.25, pins = ["gnd", "k1", "tank"] }
C1 = { c = "150p", pins = ["tank", "gnd"] }
C4 = { c = "100p", pins = ["tank", "g1"] }
R2 = { r = "47k", pins = ["g1", "gnd"] }`, "g1", "V2", "oscillator", "g2"}, // upstream through passives reaches the buffer: an oscillator's walk starts at its own control
		// The review Colpitts (review 11): the tank reaches the base through
		// a DC block, the feedback divider runs from the base to the emitter,
		// and a buffer hangs on the emitter. Upstream of the base is the
		// oscillator's own emitter, where the feedback starts, never the
		// buffer's base beyond it.
		{"feedback from its own emitter to a buffer", `
L1 = { l = "4u7", pins = ["tank", "gnd"] }
C1 = { c = "50p", pins = ["tank", "gnd"] }
C2 = { c = "1n", pins = ["tank", "b1"] }
C3 = { c = "220p", pins = ["b1", "e1"] }
R3 = { r = "2k2", pins = ["e1", "gnd"] }
Q1 = { bjt = "npn", pins = { b = "b1", c = "ht", e = "e1" } }
C6 = { c = "22p", pins = ["e1", "b2"] }
R5 = { r = "100k", pins = ["b2", "gnd"] }
Q2 = { bjt = "npn", pins = { b = "b2", c = "ht", e = "e2" } }
R7 = { r = "1k", pins = ["e2", "gnd"] }`, "b1", "Q1", "first active part", "e1"},
		{"no active part", `
R1 = { r = "1k", pins = ["a", "gnd"] }`, "", "", "", ""},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			src := "band = \"1k..1M\"\n[nets]\nht = { role = \"supply\", volts = 12 }\n[parts]\n" + tc.parts + "\n"
			c, err := Parse("start.toml", []byte(src))
			if err != nil {
				t.Fatal(err)
			}
			net, p, why := InferredInput(c)
			ref := ""
			if p != nil {
				ref = p.Ref
			}
			if net != tc.net || ref != tc.ref || why != tc.why {
				t.Errorf("InferredInput = %q, %q, %q; want %q, %q, %q", net, ref, why, tc.net, tc.ref, tc.why)
			}
			if net != "" && UpstreamOf(c, net) != tc.upstream {
				t.Errorf("UpstreamOf(%s) = %q, want %q", net, UpstreamOf(c, net), tc.upstream)
			}
		})
	}
}
