package stages

import (
	"math"
	"testing"
)

// A series-tuned trap (an IF rejector, blind review 17 item 6b: "not part
// of a known topology") shows its notch and depth from the solver. On a
// net with nothing else but 10 kΩ to chassis the notch is the branch's own
// resonance, handbook f = 1/(2π√(LC)) = 469.94 kHz for 1.147 mH and
// 100 pF, and the depth is 10 kΩ over 10 kΩ ∥ Rs with the coil's loss
// Rs = 2πf·L/Q at Q 60, f where the model refers q: the trap's own
// resonance, 469.94 kHz (docs/netlist.md; the band's centre, 920.9 kHz,
// would give 110.6 Ω and 39.22 dB), Rs = 56.45 Ω: 45.02 dB (handbook series
// resonance: at f0 the branch is Rs alone).
func TestSeriesTrapFigures(t *testing.T) {
	c := circuit(t, "valve", `R1 = { r = "10k", pins = ["in", "gnd"] }
L1 = { l = "1m147", q = 60, pins = ["in", "m"] }
C1 = { c = "100p", pins = ["m", "gnd"] }`)
	s := stageOf(find(t, c, Options{}), "series-trap")
	if s == nil {
		t.Fatal("the trap is not recognised")
	}
	f0 := 1 / (2 * math.Pi * math.Sqrt(1.147e-3*100e-12))
	rs := 2 * math.Pi * f0 * 1.147e-3 / 60
	depth := 20 * math.Log10(10e3/(10e3*rs/(10e3+rs)))
	for _, want := range []struct {
		name string
		v    float64
		tol  float64
	}{{"f_notch", f0, 0.002}, {"notch_depth", depth, 0.01}} {
		f, ok := s.Figures.Get(want.name)
		if !ok || math.Abs(f.Value/want.v-1) > want.tol {
			t.Errorf("%s = %v (present %v), want %v", want.name, f.Value, ok, want.v)
		}
	}
}
