package rules

import (
	"errors"
	"strings"
	"testing"

	"pare/graph"
)

// Odd but loadable circuits reduce without an internal error, and what they
// reduce to loads back.
func TestOddCircuits(t *testing.T) {
	cases := map[string]string{
		"only a port":             `[parts]` + "\n" + `P1 = { port = "x", pins = ["a"] }`,
		"everything on nc":        `[parts]` + "\n" + `R1 = { r = "1k", pins = ["nc", "nc"] }` + "\n" + `V1 = { valve = "triode", pins = { a = "nc", g1 = "nc", k = "nc" } }`,
		"valve all at ground":     `[parts]` + "\n" + `V1 = { valve = "pentode", pins = { a = "gnd", g1 = "gnd", g2 = "gnd", g3 = "gnd", k = "gnd" } }`,
		"zero ohms":               `inputs = ["a"]` + "\n" + `[parts]` + "\n" + `R1 = { r = "0", pins = ["a", "b"] }` + "\n" + `C1 = { c = "1n", pins = ["b", "gnd"] }`,
		"pot at an end":           `inputs = ["a"]` + "\n" + `[parts]` + "\n" + `RV1 = { pot = "10k", set = 0, pins = ["a", "w", "gnd"] }` + "\n" + `C1 = { c = "10u", pins = ["w", "gnd"] }`,
		"winding on one net":      `[parts]` + "\n" + `T1 = { windings = { p = "1m", s = "1m" }, k = 0.5, pins = { p1 = "a", p2 = "a", s1 = "b", s2 = "gnd" } }`,
		"loop of series parts":    `[parts]` + "\n" + `R1 = { r = "1k", pins = ["a", "m"] }` + "\n" + `R2 = { r = "1k", pins = ["m", "a"] }`,
		"switch with no contacts": `[parts]` + "\n" + `S1 = { switch = 2, set = 2, closes = ["", "a-b"], pins = { a = "x", b = "y" } }` + "\n" + `R1 = { r = "1k", pins = ["x", "y"] }`,
		"choke alone":             `outputs = ["a"]` + "\n" + `[parts]` + "\n" + `L1 = { l = "1m", type = "choke", pins = ["a", "gnd"] }`,
		"crystal and generic":     `inputs = ["a"]` + "\n" + `[parts]` + "\n" + `X1 = { xtal = "1M", pins = ["a", "b"] }` + "\n" + `C1 = { c = "1n", pins = ["b", "gnd"] }` + "\n" + `M1 = { part = "meter", pins = { p = "b", n = "gnd" } }`,
	}
	for name, body := range cases {
		t.Run(name, func(t *testing.T) {
			c := parse(t, "band = \"20..20k\"\n"+body+"\n")
			for _, lvl := range levels {
				r, _, err := Reduce(c, Options{Level: lvl})
				if err != nil {
					var list graph.ErrorList
					if !errors.As(err, &list) || !strings.Contains(err.Error(), "nothing is left") {
						t.Fatalf("%s: want a clear message, got %v", lvl, err)
					}
					continue
				}
				if err := invariants(r); err != nil {
					t.Fatalf("%s: %v", lvl, err)
				}
				if _, err := graph.Parse("odd.toml", []byte(written(t, r))); err != nil {
					t.Errorf("%s: result does not load: %v\n%s", lvl, err, written(t, r))
				}
			}
		})
	}
}
