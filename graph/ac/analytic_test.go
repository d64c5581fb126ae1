package ac

import (
	"math"
	"math/cmplx"
	"strings"
	"testing"

	"pare/graph"
)

// mustParse loads a netlist written inline in a test.
func mustParse(t testing.TB, src string) *graph.Circuit {
	t.Helper()
	c, err := graph.Parse("test.toml", []byte(src))
	if err != nil {
		t.Fatalf("parse: %v", err)
	}
	return c
}

func closeRel(got, want, rel float64) bool {
	return math.Abs(got-want) <= rel*math.Abs(want)
}

func db(v complex128) float64 { return 20 * math.Log10(cmplx.Abs(v)) }

func deg(v complex128) float64 { return cmplx.Phase(v) * 180 / math.Pi }

// zeroCrossing finds f in [lo, hi] where g changes sign, by bisection.
func zeroCrossing(t *testing.T, lo, hi float64, g func(f float64) float64) float64 {
	t.Helper()
	glo := g(lo)
	if glo*g(hi) > 0 {
		t.Fatalf("no sign change between %g and %g", lo, hi)
	}
	for i := 0; i < 200 && hi-lo > 1e-9*hi; i++ {
		mid := math.Sqrt(lo * hi)
		gm := g(mid)
		if gm*glo > 0 {
			lo, glo = mid, gm
		} else {
			hi = mid
		}
	}
	return math.Sqrt(lo * hi)
}

func impedanceAt(t *testing.T, c *graph.Circuit, net string, f float64) complex128 {
	t.Helper()
	z, err := Impedance(c, net, []float64{f}, Options{})
	if err != nil {
		t.Fatal(err)
	}
	return z[0]
}

func transferAt(t *testing.T, c *graph.Circuit, in, out string, f float64) complex128 {
	t.Helper()
	h, err := Transfer(c, in, out, []float64{f}, Options{})
	if err != nil {
		t.Fatal(err)
	}
	return h[0]
}

// Resonance of tanks: the frequency where the driving-point impedance turns
// from inductive to capacitive.
func TestTankResonance(t *testing.T) {
	cases := []struct {
		name string
		src  string
		want float64 // Hz
		why  string
	}{
		{"parallel LC", `band = "500k..2M"
[parts]
L1 = { l = "253u", pins = ["tank", "gnd"] }
C1 = { c = "100p", pins = ["tank", "gnd"] }
R1 = { r = "100k", pins = ["tank", "gnd"] }
`, 1000.599e3, "docs/references.md §1: L 253 µH, C 100 pF, derived from f = 1/(2π√(LC))"},
		{"Hartley, coupled sections", `band = "1M..5M"
[parts]
L1 = { l = ["20u", "5u"], k = 0.5, pins = ["top", "tap", "gnd"] }
C1 = { c = "100p", pins = ["top", "gnd"] }
R1 = { r = "100k", pins = ["top", "gnd"] }
`, 2690.21e3, "docs/references.md §3: L1 20 µH, L2 5 µH, k 0.5, C 100 pF, derived (L = L1+L2+2M)"},
		{"Hartley, k = 0, tap grounded", `band = "500k..2M"
[parts]
L1 = { l = ["80u", "20u"], k = 0, pins = ["top", "gnd", "bot"] }
C1 = { c = "250p", pins = ["top", "bot"] }
R1 = { r = "1M", pins = ["top", "bot"] }
`, 1006.58e3, "docs/references.md §3: 80 µH + 20 µH, k 0, C 250 pF, derived"},
		{"Hartley, k = 1 (one tapped coil)", `band = "500k..2M"
[parts]
L1 = { l = "180u", tap = 0.666666666666667, pins = ["top", "gnd", "bot"] }
C1 = { c = "250p", pins = ["top", "bot"] }
R1 = { r = "1M", pins = ["top", "bot"] }
`, 750.264e3, "docs/references.md §3: 80 µH + 20 µH, k 1 (180 µH), C 250 pF, derived"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			c := mustParse(t, tc.src)
			net := "top"
			if c.Net("tank") != nil {
				net = "tank"
			}
			f0 := zeroCrossing(t, tc.want*0.8, tc.want*1.2, func(f float64) float64 {
				return imag(impedanceAt(t, c, net, f))
			})
			// The tables give six significant figures.
			if !closeRel(f0, tc.want, 5e-6) {
				t.Errorf("resonance %.3f kHz, want %.3f kHz (%s)", f0/1e3, tc.want/1e3, tc.why)
			}
		})
	}
}

func TestTankImpedanceAtResonance(t *testing.T) {
	// At resonance a parallel tank is its shunt resistance alone
	// (docs/references.md §1, derived: f0 = 1/(2π√(253 µH·100 pF))).
	c := mustParse(t, `band = "500k..2M"
[parts]
L1 = { l = "253u", pins = ["tank", "gnd"] }
C1 = { c = "100p", pins = ["tank", "gnd"] }
R1 = { r = "100k", pins = ["tank", "gnd"] }
`)
	f0 := 1 / (2 * math.Pi * math.Sqrt(253e-6*100e-12))
	z := impedanceAt(t, c, "tank", f0)
	if !closeRel(real(z), 100e3, 1e-9) || math.Abs(imag(z)) > 1e-6*100e3 {
		t.Errorf("Z(f0) = %v, want 100 kΩ real", z)
	}
}

func TestRCCorner(t *testing.T) {
	// docs/references.md §4: coupling 10 nF into 470 kΩ, fc = 1/(2πRC) =
	// 33.8628 Hz, where the response is −3.0103 dB and leads by 45°.
	c := mustParse(t, `band = "20..20k"
[parts]
C1 = { c = "10n", pins = ["in", "out"] }
R1 = { r = "470k", pins = ["out", "gnd"] }
`)
	h := transferAt(t, c, "in", "out", 33.8628)
	if math.Abs(db(h)-(-3.0103)) > 1e-4 {
		t.Errorf("|H(fc)| = %.5f dB, want −3.0103 dB", db(h))
	}
	if math.Abs(deg(h)-45) > 1e-3 {
		t.Errorf("phase(fc) = %.4f°, want 45°", deg(h))
	}
}

func TestStageGains(t *testing.T) {
	triode := func(extra, k string) string {
		return `band = "20..20k"
[nets]
ht = { role = "supply", volts = 250 }
[parts]
V1 = { valve = "triode", mu = 20, ra = "10k", pins = { a = "a", g1 = "in", k = "` + k + `" } }
` + extra
	}
	cases := []struct {
		name, src, out string
		want           float64
		why            string
	}{
		{"triode CK, Rk bypassed", triode(`R1 = { r = "47k", pins = ["a", "ht"] }`+"\n", "gnd"), "a", -16.4912,
			"docs/references.md §5: −µRL/(ra+RL), textbook solved problem (holooly.com)"},
		{"triode CK, Rk unbypassed", triode(`R1 = { r = "47k", pins = ["a", "ht"] }
R2 = { r = "1k", pins = ["k", "gnd"] }
`, "k"), "a", -12.0513, "docs/references.md §5: −µRL/(ra+RL+(µ+1)Rk), derived"},
		{"cathode follower, Rk 1k", triode(`R2 = { r = "1k", pins = ["k", "gnd"] }
R9 = { r = "0", pins = ["a", "ht"], note = "anode straight to HT: a zero-ohm link joins the nets" }
`, "k"), "k", 0.645161, "docs/references.md §5: µRk/(ra+(µ+1)Rk), derived"},
		{"cathode follower, Rk 10k", triode(`R2 = { r = "10k", pins = ["k", "gnd"] }
R9 = { r = "0", pins = ["a", "ht"] }
`, "k"), "k", 0.909091, "docs/references.md §5: µRk/(ra+(µ+1)Rk), derived"},
		{"BJT CE, ro open", `band = "20..20k"
[nets]
vcc = { role = "supply", volts = 9 }
[parts]
Q1 = { bjt = "npn", beta = 100, ic = "1m", ro = "1T", pins = { b = "in", c = "c", e = "gnd" } }
R1 = { r = "4k7", pins = ["c", "vcc"] }
`, "c", -181.804 * (1 - 4.7e3/1e12), "docs/references.md §5: −gm·RC with gm = Ic/VT, from memory (ro 1 TΩ shunts RC negligibly)"},
		{"BJT CE, default ro", `band = "20..20k"
[nets]
vcc = { role = "supply", volts = 9 }
[parts]
Q1 = { bjt = "npn", beta = 100, ic = "1m", pins = { b = "in", c = "c", e = "gnd" } }
R1 = { r = "4k7", pins = ["c", "vcc"] }
`, "c", -(1e-3 / 0.025852) * (4.7e3 * 100e3 / (4.7e3 + 100e3)), "derived: −gm·(RC ∥ ro), ro = VA/Ic = 100 V/1 mA (documented default)"},
		{"BJT CE, RE unbypassed (pnp)", `band = "20..20k"
[nets]
vee = { role = "supply", volts = -9 }
[parts]
Q1 = { bjt = "pnp", beta = 100, ic = "1m", ro = "1T", pins = { b = "in", c = "c", e = "e" } }
R1 = { r = "4k7", pins = ["c", "vee"] }
R2 = { r = "100", pins = ["e", "gnd"] }
`, "c", -37.0511, "docs/references.md §5: exact −βRC/(rπ+(β+1)RE), from memory"},
		{"emitter follower", `band = "20..20k"
[nets]
vcc = { role = "supply", volts = 9 }
[parts]
Q1 = { bjt = "npn", beta = 100, ic = "1m", ro = "1T", pins = { b = "in", c = "vcc", e = "e" } }
R2 = { r = "1k", pins = ["e", "gnd"] }
`, "e", 101e3 / (2585.20 + 101e3), "derived from hybrid-π: (β+1)RE/(rπ+(β+1)RE); the textbook gmRE/(1+gmRE) = 0.974799 drops base current"},
		{"FET CS", `band = "20..20k"
[nets]
vdd = { role = "supply", volts = 12 }
[parts]
Q1 = { fet = "njfet", gm = "5m", rd = "1T", pins = { g = "in", d = "d", s = "gnd" } }
R1 = { r = "10k", pins = ["d", "vdd"] }
`, "d", -50, "docs/references.md §5: −gm·RD, from memory"},
		{"source follower", `band = "20..20k"
[nets]
vdd = { role = "supply", volts = 12 }
[parts]
Q1 = { fet = "njfet", gm = "5m", rd = "1T", pins = { g = "in", d = "vdd", s = "s" } }
R2 = { r = "1k", pins = ["s", "gnd"] }
`, "s", 0.833333, "docs/references.md §5: gmRS/(1+gmRS), tecnicalc.com"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			c := mustParse(t, tc.src)
			h := transferAt(t, c, "in", tc.out, 1e3)
			if math.Abs(imag(h)) > 1e-9*math.Abs(real(h)) {
				t.Errorf("resistive stage has a phase shift: %v", h)
			}
			if !closeRel(real(h), tc.want, 2e-6) {
				t.Errorf("gain %.6f, want %.6f (%s)", real(h), tc.want, tc.why)
			}
		})
	}
}

// An IF transformer at critical coupling: a pentode (current source) drives
// the tuned primary, the output is the tuned secondary.
func TestCriticalCouplingBandwidth(t *testing.T) {
	// docs/references.md §6: L 1 mH, C 122.354 pF, parallel R 285.885 kΩ,
	// k 0.01: full-circuit simulation gives BW 6.429 kHz (±0.01), peak 454.99 kHz.
	c := mustParse(t, `band = "440k..470k"
[nets]
ht = { role = "supply", volts = 250 }
[parts]
V1 = { valve = "pentode", gm = "1m", ra = "1T", pins = { a = "p", g1 = "in", g2 = "ht", g3 = "gnd", k = "gnd" } }
T1 = { windings = { p = "1m", s = "1m" }, k = 0.01, pins = { p1 = "p", p2 = "ht", s1 = "s", s2 = "gnd" } }
C1 = { c = "122.354p", pins = ["p", "ht"] }
C2 = { c = "122.354p", pins = ["s", "gnd"] }
R1 = { r = "285.885k", pins = ["p", "ht"] }
R2 = { r = "285.885k", pins = ["s", "gnd"] }
`)
	mag := func(f float64) float64 { return cmplx.Abs(transferAt(t, c, "in", "s", f)) }
	// Peak by golden-section search on |H|.
	lo, hi := 450e3, 460e3
	for i := 0; i < 200 && hi-lo > 1e-3; i++ {
		m1, m2 := hi-(hi-lo)/1.618034, lo+(hi-lo)/1.618034
		if mag(m1) < mag(m2) {
			lo = m1
		} else {
			hi = m2
		}
	}
	fp := (lo + hi) / 2
	peak := mag(fp)
	half := func(f float64) float64 { return mag(f) - peak/math.Sqrt2 }
	f1 := zeroCrossing(t, 440e3, fp, half)
	f2 := zeroCrossing(t, fp, 470e3, half)
	if bw := f2 - f1; math.Abs(bw-6.429e3) > 10 {
		t.Errorf("bandwidth %.4f kHz, want 6.429 ± 0.01 kHz", bw/1e3)
	}
	if math.Abs(fp-454.99e3) > 10 {
		t.Errorf("peak %.3f kHz, want 454.99 ± 0.01 kHz", fp/1e3)
	}
}

func TestErrors(t *testing.T) {
	cases := []struct{ name, src, in, out, want string }{
		{"floating secondary", `band = "400k..500k"
[parts]
T1 = { windings = { p = "1m", s = "1m" }, k = 0.1, pins = { p1 = "in", p2 = "gnd", s1 = "x", s2 = "y" } }
R1 = { r = "1k", pins = ["x", "y"] }
`, "in", "x", "floating: net(s) x, y"},
		{"grid with no return", `band = "1k..2k"
[nets]
ht = { role = "supply" }
[parts]
C1 = { c = "10n", pins = ["in", "g"] }
V1 = { valve = "triode", pins = { a = "a", g1 = "g2x", k = "gnd" } }
R1 = { r = "100k", pins = ["a", "ht"] }
R2 = { r = "1M", pins = ["g", "gnd"] }
`, "in", "a", "floating: net(s) g2x"},
		{"unknown output", `band = "1k..2k"
[parts]
R1 = { r = "1k", pins = ["in", "gnd"] }
`, "in", "nowhere", `no net "nowhere"`},
		{"driving ground", `band = "1k..2k"
[nets]
ht = { role = "supply" }
[parts]
R1 = { r = "1k", pins = ["ht", "out"] }
R2 = { r = "1k", pins = ["out", "gnd"] }
`, "ht", "out", "AC ground"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			c := mustParse(t, tc.src)
			_, err := Transfer(c, tc.in, tc.out, []float64{1.5e3}, Options{})
			if err == nil || !strings.Contains(err.Error(), tc.want) {
				t.Fatalf("error %v, want one containing %q", err, tc.want)
			}
		})
	}
}

// TestInconsistentValveRefused: the loader refuses a valve whose gm·ra and
// µ disagree (graph.ValveAgreement), but a circuit changed in code can
// still carry one; the solver refuses it too rather than pick one of them.
// 2 mA/V × 10 kΩ = 20 against µ = 50 (µ = gm·ra, any valve text).
func TestInconsistentValveRefused(t *testing.T) {
	c := mustParse(t, `band = "1k..2k"
[parts]
V1 = { valve = "triode", gm = "2m", ra = "10k", mu = 20, pins = { a = "a", g1 = "in", k = "gnd" } }
R1 = { r = "1k", pins = ["a", "gnd"] }
`)
	c.Part("V1").Params["mu"] = 50
	_, err := Transfer(c, "in", "a", []float64{1.5e3}, Options{})
	if want := "test.toml:3:1: valve V1: gm·ra = 20 but mu = 50"; err == nil || !strings.Contains(err.Error(), want) {
		t.Fatalf("error %v, want one containing %q", err, want)
	}
}

func TestDocumentedDefaults(t *testing.T) {
	// A triode with no parameters takes gm 2 mA/V, ra 20 kΩ (µ 40): with a
	// 20 kΩ load the gain is −µRL/(ra+RL) = −20 (docs/references.md §5
	// formula with the documented defaults, derived).
	c := mustParse(t, `band = "1k..2k"
[nets]
ht = { role = "supply" }
[parts]
V1 = { valve = "triode", pins = { a = "a", g1 = "in", k = "gnd" } }
R1 = { r = "20k", pins = ["a", "ht"] }
`)
	if h := transferAt(t, c, "in", "a", 1e3); !closeRel(real(h), -20, 1e-9) {
		t.Errorf("default triode gain %v, want −20", h)
	}
	// A 1 MHz crystal with the default cm 20 fF and Q 50 000 and no holder
	// capacitance is its motional resistance at fs: Lm = 1/((2π·1 MHz)²·20 fF)
	// = 1.26651 H, Rm = 2π·1 MHz·Lm/Q = 159.155 Ω (derived from the
	// four-element equivalent).
	x := mustParse(t, `band = "999k..1001k"
[parts]
X1 = { xtal = "1M", c0 = 0, pins = ["in", "gnd"] }
`)
	z := impedanceAt(t, x, "in", 1e6)
	if !closeRel(real(z), 159.155, 1e-5) || math.Abs(imag(z)) > 1e-6 {
		t.Errorf("crystal at fs: %v, want 159.155 Ω", z)
	}
	// A signal diode conducting at 1 mA is VT/1 mA = 25.852 Ω (Shockley,
	// ideality 1; VT from SI 2019 constants).
	d := mustParse(t, `band = "1k..2k"
[parts]
D1 = { diode = "signal", pins = ["in", "gnd"] }
`)
	if z := impedanceAt(t, d, "in", 1e3); !closeRel(real(z), 25.8520, 1e-5) {
		t.Errorf("diode: %v, want 25.852 Ω", z)
	}
}

// Odd values that the loader refuses (it checks every parameter's range)
// can still be set by code: the models give clear errors, never a panic or
// a NaN. Each part loads with a good value, then the edit makes it odd.
func TestOddValues(t *testing.T) {
	cases := []struct {
		name, parts string
		edit        func(p *graph.Part)
		want        string
	}{
		{"crystal with q 0", `X1 = { xtal = "1M", q = 50, pins = ["in", "gnd"] }`, func(p *graph.Part) { p.Params["q"] = 0 }, "q must be a positive number"},
		{"valve with gm 0 and mu", `V1 = { valve = "triode", gm = 1, mu = 20, pins = { a = "in", g1 = "gnd", k = "gnd" } }`, func(p *graph.Part) { p.Params["gm"] = 0 }, "do not make a model"},
		{"winding with no inductance", `T1 = { windings = { p = "1m", s = "1m" }, k = 0.1, pins = { p1 = "in", p2 = "gnd", s1 = "gnd", s2 = "gnd" } }`, func(p *graph.Part) { p.Windings[0].L = 0 }, "has no inductance"},
		{"bjt with beta 0", `Q1 = { bjt = "npn", beta = 100, pins = { b = "in", c = "gnd", e = "gnd" } }`, func(p *graph.Part) { p.Params["beta"] = 0 }, "must be positive"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			c := mustParse(t, "band = \"1k..2k\"\n[parts]\n"+tc.parts+"\nR9 = { r = \"1k\", pins = [\"in\", \"gnd\"] }\n")
			for _, p := range c.Parts {
				if p.Ref != "R9" {
					tc.edit(p)
				}
			}
			_, err := Impedance(c, "in", []float64{1e3}, Options{})
			if err == nil || !strings.Contains(err.Error(), tc.want) {
				t.Errorf("error %v, want %q", err, tc.want)
			}
		})
	}
	c := mustParse(t, highPass)
	if _, err := Transfer(c, "in", "out", []float64{1e3}, Options{VarFrac: 1.5, VarSet: true}); err == nil {
		t.Error("a gang setting of 1.5 was accepted")
	}
	if _, err := Transfer(c, "in", "out", []float64{-5}, Options{}); err == nil {
		t.Error("a negative frequency was accepted")
	}
}

// Two inputs into a two-grid mixer model: driving one, the other is held at
// 0 V by its own source, so the result is the one stage's gain alone
// (superposition; docs/references.md §5 formula −µRL/(ra+RL), derived).
func TestOtherInputsHeld(t *testing.T) {
	c := mustParse(t, `band = "1k..2k"
inputs = ["in1", "in2"]
outputs = ["a"]
[nets]
ht = { role = "supply" }
[parts]
V1 = { valve = "triode", mu = 20, ra = "10k", pins = { a = "a", g1 = "in1", k = "gnd" } }
V2 = { valve = "triode", mu = 20, ra = "10k", pins = { a = "a", g1 = "in2", k = "gnd" } }
R1 = { r = "47k", pins = ["a", "ht"] }
`)
	// Two anodes in parallel on R1: each sees RL ∥ the other's ra.
	rl := 47e3 * 10e3 / (47e3 + 10e3)
	want := -20 * rl / (10e3 + rl)
	if h := transferAt(t, c, "in1", "a", 1e3); !closeRel(real(h), want, 1e-9) {
		t.Errorf("V(a)/V(in1) = %v, want %.6f", h, want)
	}
}
