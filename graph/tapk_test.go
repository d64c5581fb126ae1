package graph

import (
	"strings"
	"testing"
)

// A coupling key may name a tapped winding whole ("p-s"): both its halves
// (pa, pb) couple to the other winding by that k, as a transformer's tapped
// primary does to its secondary. A name the part does not have is refused
// with the windings it has, as written in the netlist.
func TestTappedWindingCouplingKey(t *testing.T) {
	head := "band = \"500k..1.6M\"\n[parts]\n"
	tail := ", pins = { p1 = \"a\", pt = \"b\", p2 = \"gnd\", s1 = \"c\", s2 = \"gnd\" } }\n"
	tr := `T1 = { windings = { p = ["20u", "180u"], s = "10u" }, k = `
	c, err := Parse("t.toml", []byte(head+tr+`{ "p-s" = 0.6 }`+tail))
	if err != nil {
		t.Fatalf("a tapped winding named whole in a coupling key: %v", err)
	}
	p := c.Part("T1")
	for _, pair := range [][2]string{{"pa", "s"}, {"pb", "s"}, {"pa", "pb"}} {
		want := 0.6
		if pair[0] == "pa" && pair[1] == "pb" {
			want = 1 // the halves of one winding stay fully coupled
		}
		if got := p.K(pair[0], pair[1]); got != want {
			t.Errorf("k(%s, %s) = %g, want %g", pair[0], pair[1], got, want)
		}
	}
	_, err = Parse("t.toml", []byte(head+tr+`{ "p-q" = 0.6 }`+tail))
	if want := `coupling key "p-q" must name two windings of T1 as "A-B" (its windings: p, s)`; err == nil || !strings.Contains(err.Error(), want) {
		t.Errorf("unknown winding in a coupling key: error %v, want %q", err, want)
	}
}
