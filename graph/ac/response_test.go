package ac

import (
	"math"
	"math/cmplx"
	"testing"
)

// A current into the top of a parallel tank sees Z = 1/(1/R + jωC +
// 1/(jωL)), and through a series resistor to a second net the same
// voltage: no current flows into an open end (textbook nodal analysis).
// The voltage drive of the same net gives V(b)/V(a) = 1. Each is checked
// against the closed form at resonance and an octave either side.
func TestResponse(t *testing.T) {
	const src = `
band = "100k..1M"
inputs = ["a"]
[parts]
R1 = { r = "10k", pins = ["a", "gnd"] }
L1 = { l = "100u", pins = ["a", "gnd"] }
C1 = { c = "1n", pins = ["a", "gnd"] }
R2 = { r = "1k", pins = ["a", "b"] }
C2 = { c = "10p", pins = ["b", "c"] }
`
	c := mustParse(t, src)
	f0 := 1 / (2 * math.Pi * math.Sqrt(100e-6*1e-9)) // f = 1/(2π√LC), handbook
	zi, err := NewTransimpedance(c, "a", "b", Options{})
	if err != nil {
		t.Fatal(err)
	}
	tr, err := NewTransfer(c, "a", "b", Options{})
	if err != nil {
		t.Fatal(err)
	}
	for _, f := range []float64{f0 / 2, f0, 2 * f0} {
		w := 2 * math.Pi * f
		want := 1 / complex(1/10e3, w*1e-9-1/(w*100e-6)) // parallel RLC, C2 open at its far end
		got, err := zi.At(f)
		if err != nil {
			t.Fatal(err)
		}
		if cmplx.Abs(got-want) > 1e-6*cmplx.Abs(want) {
			t.Errorf("Z at %g Hz = %v, want %v", f, got, want)
		}
		if v, err := tr.At(f); err != nil || cmplx.Abs(v-1) > 1e-9 {
			t.Errorf("V(b)/V(a) at %g Hz = %v (%v), want 1", f, v, err)
		}
	}
	if _, err := zi.At(-1); err == nil {
		t.Error("a negative frequency must be refused")
	}
}
