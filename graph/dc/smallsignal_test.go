package dc

import (
	"bytes"
	"math"
	"testing"

	"pare/internal/reftool"
)

// TestBiasedAgainstNgspice: the JFET's gm and the PNP's collector current
// that Biased fills in agree with ngspice 39's own linearisation at its .op
// (@j…[gm], @q…[ic]) within 0.5 %, and the AC model's gm = Ic/VT then
// follows (hybrid-π, common practice).
func TestBiasedAgainstNgspice(t *testing.T) {
	bin := reftool.Find(t, reftool.Ngspice)
	pt, err := Solve(load(t, "testdata/fet-pnp.toml"))
	if err != nil {
		t.Fatal(err)
	}
	biased, origins := pt.Biased()
	if len(origins) != 2 {
		t.Fatalf("want gm of Q1 and ic of Q2 from the operating point, got %+v", origins)
	}
	var deck bytes.Buffer
	// Device instances are named by index and ref in the deck: J0_q1, Q1_q2.
	ctl := "option numdgt=12\nop\nprint @j0_q1[gm]\nprint @q1_q2[ic]\n"
	if err := pt.m.writeSpice(&deck, nil, ctl); err != nil {
		t.Fatal(err)
	}
	got := runOPList(t, bin, deck.String())
	if len(got) != 2 {
		t.Fatalf("ngspice printed %v", got)
	}
	gm, _ := biased.Part("Q1").Param("gm")
	ic, _ := biased.Part("Q2").Param("ic")
	// ngspice gives the pnp's collector current as flowing into the collector: negative.
	for _, c := range []struct {
		name       string
		pare, spic float64
	}{{"Q1 gm", gm, got[0]}, {"Q2 ic", ic, math.Abs(got[1])}} {
		if math.Abs(c.pare-c.spic) > 0.005*math.Abs(c.spic) {
			t.Errorf("%s: pare %.6g, ngspice 39 %.6g", c.name, c.pare, c.spic)
		}
	}
	// Given figures are never replaced (the examples give them all).
	for _, f := range []string{"../../examples/frequency-changer.toml", "../../examples/if-detector-audio.toml", "../../examples/transistor-front-end.toml"} {
		pt, err := Solve(load(t, f))
		if err != nil {
			t.Fatal(err)
		}
		if _, o := pt.Biased(); len(o) != 0 {
			t.Errorf("%s: figures filled although given: %+v", f, o)
		}
	}
}
