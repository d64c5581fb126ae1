package dc

import (
	"bytes"
	"math"
	"strings"
	"testing"

	"pare/graph"
	"pare/internal/reftool"
)

// A conducting transistor with its Vce under 0.5 V or its base forward of
// its collector is at or near saturation (common practice: Vce(sat) 0.1–0.3 V
// for a silicon transistor; the collector–base junction forward biased is
// the saturation region's textbook mark), and the chart says so. The
// handbook's test for a grounded-emitter switch: saturated when β·Ib
// exceeds Vcc/Rc. With 12 V, Rc 10 kΩ (Ic(sat) ≈ 1.2 mA), β 250: a 100 kΩ
// base feed gives Ib ≈ 114 µA, β·Ib ≈ 28 mA: saturated; a 4.7 MΩ feed gives
// Ib ≈ 2.4 µA, Ic ≈ 0.6 mA, Vce ≈ 6 V: active. The PNP mirror reads alike.
func TestSaturationWarning(t *testing.T) {
	circuit := func(typ, rail, rb string) string {
		return `title = "switch"
band = "100..10k"
[nets]
gnd = { role = "ground" }
vcc = { role = "supply", volts = ` + rail + ` }
[parts]
Q1 = { bjt = "` + typ + `", pins = { b = "b", c = "c", e = "gnd" }, beta = 250 }
R1 = { r = "` + rb + `", pins = ["vcc", "b"] }
R2 = { r = "10k", pins = ["vcc", "c"] }
`
	}
	for _, tc := range []struct {
		name, typ, rail, rb string
		want                bool
	}{
		{"npn, base fed hard", "npn", "12", "100k", true},
		{"npn, active", "npn", "12", "4.7M", false},
		{"pnp, base fed hard", "pnp", "-12", "100k", true},
		{"pnp, active", "pnp", "-12", "4.7M", false},
	} {
		t.Run(tc.name, func(t *testing.T) {
			c, err := graph.Parse("switch.toml", []byte(circuit(tc.typ, tc.rail, tc.rb)))
			if err != nil {
				t.Fatal(err)
			}
			_, ch := chartCircuit(t, c)
			got := strings.Contains(strings.Join(ch.Warnings, "\n"), "Q1 rests saturated")
			if got != tc.want {
				t.Errorf("saturation warned %v, want %v: %q", got, tc.want, ch.Warnings)
			}
		})
	}
}

// The blind reviewer's phase-shift oscillator (testdata/review19/b01.toml)
// rests near saturation as captured: its README gives pare's collector
// 1.46 V and emitter 1.01 V, and ngspice-39 .op on the same circuit
// (WriteSpiceOP) gives Vce and Vbc within 10 mV of pare's; the chart warns.
func TestSaturationReview19(t *testing.T) {
	bin := reftool.Find(t, reftool.Ngspice)
	c, err := graph.LoadFile("../../testdata/review19/b01.toml")
	if err != nil {
		t.Fatal(err)
	}
	pt, err := Solve(c)
	if err != nil {
		t.Fatal(err)
	}
	s, ok := pt.Saturated("Q1")
	if !ok {
		t.Fatalf("Q1 not near saturation: %+v", s)
	}
	var deck bytes.Buffer
	if err := WriteSpiceOP(&deck, c); err != nil {
		t.Fatal(err)
	}
	ref := runOP(t, bin, deck.String())
	nodes, _ := SpiceNodes(c)
	v := func(n string) float64 { return ref[nodes[n]] }
	if vce := v("q1_c") - v("q1_e"); math.Abs(vce-s.Vce) > 0.01 {
		t.Errorf("Vce %.3f V, ngspice %.3f V", s.Vce, vce)
	}
	if vbc := v("q1_b") - v("q1_c"); math.Abs(vbc-s.Vbc) > 0.01 || vbc <= 0 {
		t.Errorf("Vbc %.3f V, ngspice %.3f V (want forward biased)", s.Vbc, vbc)
	}
	ch, err := pt.Chart(Meter{})
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(strings.Join(ch.Warnings, "\n"), "Q1 rests near saturation (Vce 450 mV") {
		t.Errorf("no saturation warning: %q", ch.Warnings)
	}
}
