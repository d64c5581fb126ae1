package graph

import (
	"strings"
	"testing"
)

// The chains below are invented; what a junction joins is read off the
// wiring by hand (common practice: a series chain's order is the order its
// current passes the heaters, mains end first).
const acdcChain = `
title = "chain"
band = "50..5k"
[nets]
gnd = { role = "ground" }
h1 = { role = "heater", label = "heater chain" }
h2 = { role = "heater", label = "heater chain" }
h3 = { role = "heater", label = "heater chain" }
h4 = { role = "heater" }
h5 = { role = "heater", label = "chain V40 to V50" }
h6 = { role = "heater", label = "chain V4-V5" }
[parts]
R1 = { r = "1k", pins = ["mains", "h1"] }
V4 = { valve = "pentode", pins = { a = "a4", g1 = "g4", g2 = "a4", g3 = "k4", k = "k4", h1 = "h1", h2 = "h2" } }
V5 = { valve = "diode", pins = { a = "mains", k = "ht", h1 = "h2", h2 = "h3" } }
V3a = { valve = "double-diode", envelope = "V3", pins = { a1 = "d", a2 = "d", k = "gnd", h1 = "h3", h2 = "h4" } }
V3b = { valve = "triode", envelope = "V3", pins = { a = "a3", g1 = "g3", k = "gnd" } }
LP1 = { part = "dial lamp 6.3 V 0.15 A", pins = { a = "h4", b = "gnd" } }
R2 = { r = "150R", pins = ["h4", "gnd"] }
C1 = { c = "10n", pins = ["h4", "gnd"] }
`

// the chain with its first junction labelled by the user
var (
	acdcChain2 = strings.ReplaceAll(acdcChain, `"h2"`, `"h5"`)
	acdcChain3 = strings.Replace(acdcChain2, `"h5"`, `"h6"`, -1)
)

// two heaters in parallel across a winding: no series chain
const parallelPair = `
title = "pair"
band = "50..5k"
[nets]
gnd = { role = "ground" }
ha = { role = "heater" }
hb = { role = "heater" }
[parts]
T1 = { windings = { p = "1", s = "1m" }, k = 0.99, pins = { p1 = "m1", p2 = "m2", s1 = "ha", s2 = "hb" } }
V1 = { valve = "triode", pins = { a = "a1", g1 = "g1", k = "gnd", h1 = "ha", h2 = "hb" } }
V2 = { valve = "triode", pins = { a = "a2", g1 = "g2", k = "gnd", h1 = "ha", h2 = "hb" } }
`

// two heaters from one supply line to chassis: in parallel, though the
// walk from the line meets each once
const parallelToChassis = `
title = "line"
band = "50..5k"
[nets]
gnd = { role = "ground" }
hx = { role = "heater", label = "6.3 V~" }
[parts]
V1 = { valve = "triode", pins = { a = "a1", g1 = "g1", k = "k1", h1 = "hx", h2 = "gnd" } }
V2 = { valve = "triode", pins = { a = "a2", g1 = "g2", k = "k2", h1 = "hx", h2 = "gnd" } }
`

// a chain with no dropper, its last heater on chassis: the direction comes
// from the chassis end alone
const shortChain = `
title = "short"
band = "50..5k"
[nets]
gnd = { role = "ground" }
[parts]
V1 = { valve = "triode", pins = { a = "a1", g1 = "g1", k = "k1", h1 = "line", h2 = "j" } }
V2 = { valve = "triode", pins = { a = "a2", g1 = "g2", k = "k2", h1 = "j", h2 = "gnd" } }
`

// a chain whose last heater is left open as captured: the fed end (the
// dropper's) comes first
const openChain = `
title = "open"
band = "50..5k"
[nets]
gnd = { role = "ground" }
[parts]
R1 = { r = "1k", pins = ["mains", "x"] }
V1 = { valve = "triode", pins = { a = "a1", g1 = "g1", k = "k1", h1 = "y", h2 = "z" } }
V2 = { valve = "triode", pins = { a = "a2", g1 = "g2", k = "k2", h1 = "x", h2 = "y" } }
`

func TestHeaterJunctions(t *testing.T) {
	cases := []struct {
		name, src, net, want string
		ok                   bool
	}{
		{"dropper to first valve", acdcChain, "h1", "htr R1→V4", true},
		{"between two valves", acdcChain, "h2", "htr V4→V5", true},
		{"an envelope of two sections", acdcChain, "h3", "htr V5→V3", true},
		{"lamp and shunt at the chassis end, bypass left out", acdcChain, "h4", "htr V3→LP1,R2", true},
		{"a label naming a ref only by its prefix", acdcChain2, "h5", "htr V4→V5", true},
		{"a label naming the junction already", acdcChain3, "h6", "", false},
		{"a signal net is no junction", acdcChain, "mains", "", false},
		{"an open end: from the dropper", openChain, "y", "htr V2→V1", true},
		{"parallel heaters", parallelPair, "ha", "", false},
		{"parallel heaters from a line to chassis", parallelToChassis, "hx", "", false},
		{"chain ending on chassis", shortChain, "j", "htr V1→V2", true},
		{"the line end of a chain whose first link is the line", shortChain, "line", "", false},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			c, err := Parse("t.toml", []byte(tc.src))
			if err != nil {
				t.Fatal(err)
			}
			label := ""
			if n := c.Net(tc.net); n != nil {
				label = n.Label
			}
			got, ok := c.JunctionText(tc.net, label)
			if got != tc.want || ok != tc.ok {
				t.Errorf("JunctionText(%s) = %q, %v; want %q, %v", tc.net, got, ok, tc.want, tc.ok)
			}
		})
	}
}
