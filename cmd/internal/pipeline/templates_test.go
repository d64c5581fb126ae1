package pipeline

import (
	"testing"

	"pare/graph"
	"pare/rules/stages"
)

// TestTransistorTemplateOnFullSheets: an untuned common-emitter stage's
// template is kept on the full and faded sheets (its collector load above,
// its emitter parts below, so the two leads cannot cross: review22 b01
// "Q3's collector crosses its own emitter lead"), except where the device
// returns its output to its own base through resistors and capacitors (a
// phase-shift ladder, a collector-to-base bias resistor: the template's
// fixed slots wrapped the return wire round the device) or where its
// common electrode is the chassis itself (no emitter lead to cross). The
// circuits are invented, the wiring common practice.
func TestTransistorTemplateOnFullSheets(t *testing.T) {
	const head = `title = "t"
band = "100..10k"
[nets]
gnd = { role = "ground" }
vcc = { role = "supply", volts = 9 }
[parts]
`
	cases := []struct {
		name, parts string
		want        bool
	}{
		{"divider bias, emitter resistor", `Q1 = { bjt = "npn", pins = { b = "b", e = "e", c = "c" } }
R1 = { r = "4k7", pins = ["c", "vcc"] }
R2 = { r = "47k", pins = ["vcc", "b"] }
R3 = { r = "10k", pins = ["b", "gnd"] }
R4 = { r = "1k", pins = ["e", "gnd"] }
`, true},
		{"phase-shift ladder collector to base", `Q1 = { bjt = "npn", pins = { b = "b", e = "e", c = "c" } }
R1 = { r = "4k7", pins = ["c", "vcc"] }
C1 = { c = "10n", pins = ["c", "n1"] }
R2 = { r = "10k", pins = ["n1", "gnd"] }
C2 = { c = "10n", pins = ["n1", "b"] }
R3 = { r = "22k", pins = ["b", "gnd"] }
R4 = { r = "220", pins = ["e", "gnd"] }
`, false},
		{"collector-to-base bias resistor", `Q1 = { bjt = "npn", pins = { b = "b", e = "e", c = "c" } }
R1 = { r = "4k7", pins = ["c", "vcc"] }
R2 = { r = "470k", pins = ["c", "b"] }
R4 = { r = "1k", pins = ["e", "gnd"] }
`, false},
		{"source on the chassis", `Q1 = { fet = "njfet", pins = { g = "b", s = "gnd", d = "c" } }
R1 = { r = "4k7", pins = ["c", "vcc"] }
R3 = { r = "1M", pins = ["b", "gnd"] }
`, false},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			c, err := graph.Parse("t.toml", []byte(head+tc.parts))
			if err != nil {
				t.Fatal(err)
			}
			s := stages.Stage{Topology: "amp-common-degenerated", Draw: []stages.Place{{Part: "Q1"}}}
			if got := transistorTemplate(s, c, c); got != tc.want {
				t.Errorf("template kept on the full sheet: %v, want %v", got, tc.want)
			}
		})
	}
}
