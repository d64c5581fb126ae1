package pipeline

import (
	"slices"
	"strings"
	"testing"

	"pare/graph"
)

// TestIdleWindings: a winding with an end on a net nothing else is on
// carries no current (Kirchhoff's current law: one terminal on a node, from
// memory) and leaves the drawn part; a tap's section goes only when the tap
// goes nowhere too; an end on ground, on the circuit's output or shared with
// a kept winding stays; the circuit given is never changed.
func TestIdleWindings(t *testing.T) {
	const loadOut = `R3 = { r = "1k", pins = ["out", "gnd"] }`
	const tapLoad = "\n" + `R2 = { r = "1k", pins = ["tap", "col"] }`
	cases := []struct {
		name, windings, pins, extra string
		want                        string // the drawn part's windings, sorted by name
	}{
		{"open extension winding", `{ p = "170u", f = "8u", w = "55u" }`,
			`{ p1 = "gnd", p2 = "tank", f1 = "col", f2 = "vcc", w1 = "w_end", w2 = "gnd" }`, loadOut, "f p"},
		{"every end wired", `{ p = "170u", f = "8u" }`,
			`{ p1 = "gnd", p2 = "tank", f1 = "col", f2 = "vcc" }`, loadOut, "f p"},
		{"secondary into the output", `{ p = "170u", s = "8u" }`,
			`{ p1 = "gnd", p2 = "tank", s1 = "out", s2 = "gnd" }`, "", "p s"},
		{"tapped coil, far section open", `{ p = "170u", a = "20u", b = "20u" }`,
			`{ p1 = "gnd", p2 = "tank", a1 = "col", a2 = "tap", b1 = "tap", b2 = "far" }`, loadOut + tapLoad, "a p"},
		{"tapped coil, tap and far end open", `{ p = "170u", a = "20u", b = "20u" }`,
			`{ p1 = "gnd", p2 = "tank", a1 = "col", a2 = "tap", b1 = "tap", b2 = "far" }`, loadOut, "p"},
		{"both windings open: one stays", `{ p = "170u", s = "8u" }`,
			`{ p1 = "x", p2 = "gnd", s1 = "y", s2 = "gnd" }`, loadOut, "s"},
	}
	for _, c := range cases {
		src := `title = "idle"
band = "530k..1700k"
inputs = ["tank"]
outputs = ["out"]
[nets]
gnd = { role = "ground" }
vcc = { role = "supply", volts = 9 }
[parts]
C1 = { c = "100p", pins = ["tank", "gnd"] }
R1 = { r = "1k", pins = ["col", "vcc"] }
` + c.extra + `
T1 = { windings = ` + c.windings + `, k = 0.5, pins = ` + c.pins + ` }
`
		circ, err := graph.Parse(c.name+".toml", []byte(src))
		if err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		before := len(circ.Part("T1").Windings)
		drawn := withoutIdleWindings(circ)
		var names []string
		for _, w := range drawn.Part("T1").Windings {
			names = append(names, w.Name)
		}
		if got := strings.Join(slices.Sorted(slices.Values(names)), " "); got != c.want {
			t.Errorf("%s: drawn windings %q, want %q", c.name, got, c.want)
		}
		if len(circ.Part("T1").Windings) != before {
			t.Errorf("%s: the circuit given lost a winding", c.name)
		}
		for _, pn := range drawn.Part("T1").Pins {
			if !windingsUse(drawn.Part("T1").Windings, pn.Name) {
				t.Errorf("%s: pin %s of no drawn winding kept", c.name, pn.Name)
			}
		}
	}
}
