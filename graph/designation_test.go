package graph

import (
	"strings"
	"testing"
)

// A valve, transistor or FET may carry the type it is marked with as free
// text (invented designations here); it survives a write and a reload, and
// anything else is refused with its position: a type on a diode (diodes
// take their kind in `diode`), or text that would not fit beside a ref.
func TestDesignation(t *testing.T) {
	const src = `band = "1k..1M"
[parts]
V1 = { valve = "triode", type = "XV12", pins = { a = "a", g1 = "g", k = "gnd" } }
Q1 = { bjt = "npn", type = "ZT 9", pins = { b = "g", c = "a", e = "gnd" } }
J1 = { fet = "njfet", type = "FQ-3", pins = { g = "g", d = "a", s = "gnd" } }
R1 = { r = "1M", pins = ["g", "gnd"] }
`
	c, err := Parse("d.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	want := map[string]string{"V1": "XV12", "Q1": "ZT 9", "J1": "FQ-3"}
	for _, ref := range []string{"V1", "Q1", "J1"} {
		if got := c.Part(ref).Designation; got != want[ref] {
			t.Errorf("%s designation %q, want %q", ref, got, want[ref])
		}
	}
	back, text := roundTrip(t, c)
	for _, ref := range []string{"V1", "Q1", "J1"} {
		if got := back.Part(ref).Designation; got != want[ref] {
			t.Errorf("%s after a round trip: %q, want %q\n%s", ref, got, want[ref], text)
		}
	}
	bad := []struct{ part, msg string }{
		{`D1 = { diode = "signal", type = "XD1", pins = ["a", "gnd"] }`, "d.toml:3:26: type applies to capacitors"},
		{`V1 = { valve = "triode", type = "a designation far too long", pins = { a = "a", g1 = "g", k = "gnd" } }`, "d.toml:3:33: type \"a designation far too long\""},
	}
	for _, tc := range bad {
		_, err := Parse("d.toml", []byte("band = \"1k..1M\"\n[parts]\n"+tc.part+"\n"))
		if err == nil || !strings.Contains(err.Error(), tc.msg) {
			t.Errorf("%s: error %v, want %q", tc.part, err, tc.msg)
		}
	}
}
