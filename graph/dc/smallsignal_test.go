package dc

import (
	"bytes"
	"math"
	"path/filepath"
	"testing"

	"pare/graph"
	"pare/internal/reftool"
)

// TestBiasedAgainstNgspice: the JFET's gm and the PNP's collector current
// and rπ that Biased fills in agree with ngspice 39's own linearisation at
// its .op (@j…[gm], @q…[ic], 1/@q…[gpi], with VAF on the transistor: its
// β at the bias is βF·(1 + Vcb/VA)) within 0.5 %, and the AC model's
// gm = Ic/VT then follows (hybrid-π, common practice).
func TestBiasedAgainstNgspice(t *testing.T) {
	bin := reftool.Find(t, reftool.Ngspice)
	pt, err := Solve(load(t, "testdata/fet-pnp.toml"))
	if err != nil {
		t.Fatal(err)
	}
	biased, origins := pt.Biased()
	if len(origins) != 3 {
		t.Fatalf("want gm of Q1, ic and rpi of Q2 from the operating point, got %+v", origins)
	}
	var deck bytes.Buffer
	// Device instances are named by index and ref in the deck: J0_q1, Q1_q2.
	ctl := "option numdgt=12\nop\nprint @j0_q1[gm]\nprint @q1_q2[ic]\nprint @q1_q2[gpi]\n"
	if err := pt.m.writeSpice(&deck, nil, ctl); err != nil {
		t.Fatal(err)
	}
	got := runOPList(t, bin, deck.String())
	if len(got) != 3 {
		t.Fatalf("ngspice printed %v", got)
	}
	gm, _ := biased.Part("Q1").Param("gm")
	ic, _ := biased.Part("Q2").Param("ic")
	rpi, _ := biased.Part("Q2").Param("rpi")
	// ngspice gives the pnp's collector current as flowing into the collector: negative.
	for _, c := range []struct {
		name       string
		pare, spic float64
	}{{"Q1 gm", gm, got[0]}, {"Q2 ic", ic, math.Abs(got[1])}, {"Q2 rpi", rpi, 1 / got[2]}} {
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

// TestFillsOnlyDevices holds Fills to what Biased does: on every example
// and fixture netlist of the repository whose operating point is found, a
// circuit Fills calls bare of devices has no figure filled, and every
// device the solver built for Biased to look at is a part of a kind Fills
// counts. Both answers occur (the test cannot pass on one side alone).
func TestFillsOnlyDevices(t *testing.T) {
	var files []string
	for _, pat := range []string{"../../examples/*.toml", "../../testdata/*/*.toml", "../../testdata/*/*/*.toml", "testdata/*.toml"} {
		m, err := filepath.Glob(pat)
		if err != nil {
			t.Fatal(err)
		}
		files = append(files, m...)
	}
	bare, filled := 0, 0
	for _, f := range files {
		c, err := graph.LoadFile(f)
		if err != nil {
			continue // the bad-input fixtures
		}
		pt, err := Solve(c)
		if err != nil {
			continue
		}
		for _, d := range pt.m.devices {
			if d.kind != devBJT && d.kind != devFET && d.kind != devValve && d.kind != devDiode {
				continue
			}
			// An indicator LED captured as a generic part (led.go) is a
			// junction Biased never fills (restDiode takes diodes only).
			if k := c.Part(d.ref).Kind; k != graph.BJT && k != graph.FET && k != graph.Valve && k != graph.Diode && !(k == graph.Generic && !restDiode(c.Part(d.ref))) {
				t.Errorf("%s: %s is a device Biased reads, of kind %v", f, d.ref, k)
			}
		}
		_, origins := pt.Biased()
		switch {
		case !Fills(c) && len(origins) > 0:
			t.Errorf("%s: Fills says no device, Biased filled %+v", f, origins)
		case !Fills(c):
			bare++
		case len(origins) > 0:
			filled++
		}
	}
	if bare == 0 || filled == 0 {
		t.Errorf("%d circuits without devices, %d with figures filled: want some of each", bare, filled)
	}
}
