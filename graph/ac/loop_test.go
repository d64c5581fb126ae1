package ac

import (
	"math"
	"testing"

	"pare/graph"
)

// An RC phase-shift oscillator driven from a stiff source: a FET with a
// 10 Ω drain resistance (rd) into three 100 kΩ/1 nF high-pass sections, the
// last into the gate. The ladder's phase is 180° at f0 = 1/(2π·√6·RC) =
// 649.747 Hz, where it passes 1/29 (derived; the handbook phase-shift
// oscillator, e.g. any electronics text's ladder analysis), and the device
// inverts, so L = gm·rd/29 there: 2.79 dB for gm·rd = 40.
func TestLoopPhaseShiftHandbook(t *testing.T) {
	src := `title = "phase-shift check"
band = "100..5k"
[nets]
gnd = { role = "ground" }
[parts]
Q1 = { fet = "njfet", pins = { g = "g", s = "gnd", d = "d" }, gm = "4", rd = "10" }
C1 = { c = "1n", pins = ["d", "n1"] }
R1 = { r = "100k", pins = ["n1", "gnd"] }
C2 = { c = "1n", pins = ["n1", "n2"] }
R2 = { r = "100k", pins = ["n2", "gnd"] }
C3 = { c = "1n", pins = ["n2", "g"] }
R3 = { r = "100k", pins = ["g", "gnd"] }
`
	c, err := graph.Parse("ps.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	l, err := FindLoop(c, "Q1", LoopOptions{})
	if err != nil {
		t.Fatal(err)
	}
	f0 := 1 / (2 * math.Pi * math.Sqrt(6) * 100e3 * 1e-9) // 649.747 Hz, derived
	m0 := 20 * math.Log10(40.0/29)                        // 2.7932 dB, derived
	// The 10 Ω source against a ladder of about 100 kΩ: loading below 0.1 %.
	if math.Abs(l.F/f0-1) > 1e-3 || math.Abs(l.MarginDB-m0) > 0.01 {
		t.Errorf("loop: %.6g Hz at %.4f dB, want %.6g Hz at %.4f dB", l.F, l.MarginDB, f0, m0)
	}
	if len(l.Crossings) != 1 {
		t.Errorf("crossings %v, want one", l.Crossings)
	}
}

// Bode's identity Δ = Δ0·(1 − L) holds for the source of every device: the
// natural frequency found through V1's loop and through V2's is the same
// root of the circuit's determinant, although the two loops' 0° frequencies
// and margins differ (each loop holds the other device inside it).
func TestLoopPoleSameFromEveryDevice(t *testing.T) {
	c := load(t, "../../testdata/osc/wien-valve.toml")
	var poles []complex128
	for _, ref := range []string{"V1", "V2"} {
		l, err := FindLoop(c, ref, LoopOptions{})
		if err != nil || l.F == 0 {
			t.Fatalf("%s: %v, %+v", ref, err, l)
		}
		p, err := Pole(c, ref, l.F, Options{})
		if err != nil {
			t.Fatal(err)
		}
		poles = append(poles, p)
	}
	if d := poles[0] - poles[1]; math.Hypot(real(d), imag(d)) > 1e-6*math.Hypot(real(poles[0]), imag(poles[0])) {
		t.Errorf("poles through V1 %v and V2 %v differ", poles[0], poles[1])
	}
}

// A part with no controlled source, or an unknown ref, is a clear error.
func TestLoopErrors(t *testing.T) {
	c := load(t, "../../testdata/osc/wien-valve.toml")
	for _, ref := range []string{"R1", "X9"} {
		if _, err := FindLoop(c, ref, LoopOptions{}); err == nil {
			t.Errorf("%s: no error", ref)
		}
	}
	if _, err := FindLoop(c, "V1", LoopOptions{From: 10, To: 5}); err == nil {
		t.Error("a reversed search range: no error")
	}
}
