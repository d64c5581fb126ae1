package pipeline

import (
	"strings"
	"testing"

	"pare/graph"
	"pare/render"
)

// Only ground nets get the earth symbol (docs/netlist.md): a terminal that
// returned to a supply line the reduction tied to AC ground is drawn with
// that line's tag, also where the line is undeclared (the reservoir pare
// estimates from the rectifier, and the lines fed from it) and carries a
// bleeder and a dummy load to chassis, which made it look like a divider's
// tap. a05's and c08's anode loads were drawn to a chassis symbol. The tag
// names the line it is fed from and the part between, with its own DC
// voltage ("HT via R2 +238.7 V"; c08: "HT2 via R2 +275.4 V", against the
// reviewer's ngspice .op 275.4 V, testdata/review12/spice/c08.cir).
func TestSupplyReturnsAreTaggedNotEarthed(t *testing.T) {
	cases := []struct {
		file, part, prefix string
	}{
		{"../../../testdata/review13/a05.toml", "R6", "HT via R2 +"},
		{"../../../testdata/review12/c08.toml", "R5", "HT2 via R2 +"},
	}
	for _, tc := range cases {
		t.Run(tc.part, func(t *testing.T) {
			res, err := stagesRun(tc.file)
			if err != nil {
				t.Fatal(err)
			}
			c := res.Sheet(render.Reduced).Circuit
			p := c.Part(tc.part)
			if p == nil {
				t.Fatalf("%s not on the reduced sheet", tc.part)
			}
			tagged := false
			for _, pn := range p.Pins {
				ret := c.ReturnOf(pn)
				if ret == nil || ret.Role == graph.Ground {
					continue
				}
				if ret.Role.IsRail() {
					tagged = true
					if !strings.HasPrefix(ret.Label, tc.prefix) || !strings.HasSuffix(ret.Label, " V") {
						t.Errorf("%s.%s tagged %q, want %q… V", tc.part, pn.Name, ret.Label, tc.prefix)
					}
				}
			}
			if !tagged {
				t.Errorf("%s returns to chassis on the reduced sheet, not to its supply line: pins %+v", tc.part, p.Pins)
			}
		})
	}
}

// A line's tag prints its DC voltage rounded as the chart does, never in
// exponent form, and none where the voltage is zero to rounding (a03's AGC
// line at rest solved to 5.785e-28 V and was tagged with it).
func TestTagVolts(t *testing.T) {
	cases := []struct {
		v    float64
		want string
		ok   bool
	}{
		{5.785e-28, "", false},
		{-3e-4, "", false},
		{0, "", false},
		{242.68, "242.7", true},
		{-6.3, "-6.3", true},
		{12345.6, "12350", true},
		{0.01234, "0.01234", true},
	}
	for _, tc := range cases {
		got, ok := tagVolts(tc.v)
		if got != tc.want || ok != tc.ok {
			t.Errorf("tagVolts(%g) = %q, %v; want %q, %v", tc.v, got, ok, tc.want, tc.ok)
		}
	}
}

// a03's AGC line is tagged by name alone on the reduced sheet.
func TestAGCLineAtRestHasNoExponent(t *testing.T) {
	res, err := stagesRun("../../../testdata/review13/a03.toml")
	if err != nil {
		t.Fatal(err)
	}
	c := res.Sheet(render.Reduced).Circuit
	for _, n := range append(c.Nets, c.Rails...) {
		if strings.Contains(n.Label, "e-") || strings.Contains(n.Label, "e+") {
			t.Errorf("%s tagged %q", n.Name, n.Label)
		}
	}
}
