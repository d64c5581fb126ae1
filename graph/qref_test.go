package graph_test

import (
	"math"
	"strings"
	"testing"

	"pare/graph"
)

// TestReferQ: a coil whose tank tunes wholly outside its band has its q
// referred to the resonance of that tank: f = 1/(2π√(LC))
// (docs/references.md §1) with C the capacitance across the coil through the
// capacitors alone (series and parallel capacitors, §4), over the gang's
// travel its geometric centre; a declared q_at wins; a coil tuning inside
// its band, or with nothing under 10 nF (a choke on its decoupler), keeps
// its band's centre (0 here).
func TestReferQ(t *testing.T) {
	f := func(l, c float64) float64 { return 1 / (2 * math.Pi * math.Sqrt(l*c)) }
	ser := func(a, b float64) float64 { return a * b / (a + b) }
	const head = "title = \"q\"\ninputs = [\"in\"]\n[nets]\ngnd = { role = \"ground\" }\nht = { role = \"supply\", volts = 250 }\n[parts]\nP1 = { port = \"aerial\", pins = [\"in\"] }\n"
	for _, tc := range []struct {
		band, name, parts, ref string
		want                   float64
	}{
		{"530k..1.6M", "series trap from the input", `L1 = { l = "1m147", q = 60, pins = ["in", "m"] }
C1 = { c = "100p", pins = ["m", "gnd"] }`, "L1", f(1.147e-3, 100e-12)}, // 469.94 kHz
		{"530k..1.6M", "series trap beside islands of capacitors reaching one end only", `L1 = { l = "1m147", q = 60, pins = ["in", "m"] }
C1 = { c = "80p", pins = ["m", "gnd"] }
C5 = { c = "1n", pins = ["m", "x"] }
C6 = { c = "2n", pins = ["x", "y"] }
C7 = { c = "100n", pins = ["gnd", "z"] }
C8 = { c = "47n", pins = ["z", "zz"] }
C9 = { c = "40p", pins = ["m", "w"] }
C10 = { c = "40p", pins = ["w", "gnd"] }`, "L1", f(1.147e-3, 80e-12+ser(40e-12, 40e-12))},
		{"530k..1.6M", "declared q_at", `L1 = { l = "1m147", q = 60, q_at = "455k", pins = ["in", "m"] }
C1 = { c = "100p", pins = ["m", "gnd"] }`, "L1", 455e3},
		{"150k..300k", "gang through a padder, tapped coil", `L1 = { l = "127u", tap = 0.12, q = 90, pins = ["gnd", "k", "t"] }
C2 = { c = "380p", pins = ["t", "p"] }
VC1 = { c = "12p..365p", pins = ["p", "gnd"], gang = "g" }
TC1 = { c = "5p..50p", set = "35p", pins = ["p", "gnd"] }
R1 = { r = "10k", pins = ["in", "t"] }`, "L1", math.Sqrt(f(127e-6, ser(380e-12, 47e-12)) * f(127e-6, ser(380e-12, 400e-12)))},
		{"530k..1.6M", "secondary behind a wafer in its position, cold end decoupled", `T1 = { windings = { p = "40u", s = "2m3" }, k = 0.15, q = 60, pins = { p1 = "in", p2 = "gnd", s1 = "lw", s2 = "cold" } }
C1 = { c = "92p", pins = ["lw", "cold"] }
S1 = { switch = 2, closes = ["c-1", "c-2"], pins = { 1 = "mw", 2 = "lw", c = "g" } }
C9 = { c = "500p", pins = ["mw", "gnd"] }
VC1 = { c = "12p..365p", pins = ["g", "gnd"], gang = "g" }
C3 = { c = "250n", pins = ["cold", "gnd"] }
R3 = { r = "470k", pins = ["cold", "gnd"] }`, "T1", math.Sqrt(f(2.3e-3, 92e-12+ser(12e-12, 250e-9)) * f(2.3e-3, 92e-12+ser(365e-12, 250e-9)))},
		{"530k..1.6M", "choke on its decoupler", `L1 = { l = "2m5", q = 50, pins = ["a", "ht"] }
C1 = { c = "100n", pins = ["a", "gnd"] }
R1 = { r = "10k", pins = ["in", "a"] }`, "L1", 0},
		{"530k..1.6M", "tank inside its band", `L1 = { l = "250u", q = 80, pins = ["in", "gnd"] }
VC1 = { c = "12p..365p", pins = ["in", "gnd"], gang = "g" }`, "L1", 0},
	} {
		c, err := graph.Parse(tc.name+".toml", []byte("band = \""+tc.band+"\"\n"+head+tc.parts))
		if err != nil {
			t.Fatalf("%s: %v", tc.name, err)
		}
		for _, w := range c.Part(tc.ref).Windings {
			if math.Abs(w.QAt-tc.want) > 1e-9*tc.want+1e-9 {
				t.Errorf("%s: %s %s q referred to %.6g Hz, want %.6g Hz", tc.name, tc.ref, w.Name, w.QAt, tc.want)
			}
		}
	}
}

// TestQAtRoundTrip: q_at is written back canonically (after q, a frequency
// in the letter code) and reads back to the same referred frequency.
func TestQAtRoundTrip(t *testing.T) {
	src := "band = \"530k..1.6M\"\n[nets]\ngnd = { role = \"ground\" }\n[parts]\nL1 = { q_at = 455000, q = 60, l = \"1m147\", pins = [\"in\", \"m\"] }\nC1 = { c = \"100p\", pins = [\"m\", \"gnd\"] }\n"
	c, err := graph.Parse("q_at.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	text, err := graph.Marshal(c)
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(text), `q = 60, q_at = "455k"`) {
		t.Errorf("q_at not written canonically:\n%s", text)
	}
	back, err := graph.Parse("back.toml", text)
	if err != nil {
		t.Fatal(err)
	}
	if got := back.Part("L1").Windings[0].QAt; got != 455e3 {
		t.Errorf("q_at reads back as %g Hz, want 455 kHz", got)
	}
}
