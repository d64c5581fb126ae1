package device

import (
	"math"
	"testing"

	"pare/graph"
)

// TestZenerReverse: the breakdown law against its straight line. Past the
// knee Ir = (Vr − Vz)/rz, the handbook's zener as a battery Vz behind rz
// (from memory, common practice), the rounding adding Vk·ln(1 + e^−x)/rz;
// at the knee it is Vk·ln 2/rz; below it the current falls as e^((Vr −
// Vz)/Vk). The slope is the derivative: 1/rz past the knee, half at it.
func TestZenerReverse(t *testing.T) {
	z := Zener{Vz: 8.2, Rz: 10}
	for _, tc := range []struct {
		name      string
		vr        float64
		i, g, rel float64
	}{
		{"well past the knee: (Vr − Vz)/rz", 8.4, 0.2 / 10, 1.0 / 10, 0.001},
		{"far past: no overflow", 1e4, (1e4 - 8.2) / 10, 1.0 / 10, 1e-12},
		{"at the knee: Vk·ln 2/rz", 8.2, VT * math.Ln2 / 10, 0.5 / 10, 1e-12},
		{"0.3 V below: e^(−0.3/Vk)·Vk/rz", 7.9, VT / 10 * math.Exp(-0.3/VT), 1.0 / 10 * math.Exp(-0.3/VT), 1e-4},
		{"forward: none", -0.7, 0, 0, 0},
	} {
		i, g := z.Reverse(tc.vr)
		if math.Abs(i-tc.i) > tc.rel*tc.i+1e-30 || math.Abs(g-tc.g) > tc.rel*tc.g+1e-30 {
			t.Errorf("%s: Ir %.6g A, slope %.6g S; want %.6g A, %.6g S", tc.name, i, g, tc.i, tc.g)
		}
	}
}

// TestZenerRd: the AC model's zener, before the operating point says
// better: rz when it declares its breakdown (held in breakdown by its
// circuit: that is its work), open without vz (as the DC solve takes it),
// and the part's own rd or off first.
func TestZenerRd(t *testing.T) {
	for _, tc := range []struct {
		name    string
		params  map[string]float64
		rd      float64
		assumed bool
	}{
		{"vz, default rz", map[string]float64{"vz": 8.2}, 10, true},
		{"vz and rz", map[string]float64{"vz": 5.6, "rz": 40}, 40, false},
		{"no vz: open", nil, 0, true},
		{"rd given wins", map[string]float64{"vz": 8.2, "rd": 25}, 25, false},
		{"off", map[string]float64{"vz": 8.2, "off": 1}, 0, false},
	} {
		rd, assumed := DiodeRd(part(graph.Diode, "zener", tc.params), math.Inf(1))
		if rd != tc.rd || assumed != tc.assumed {
			t.Errorf("%s: rd %g (assumed %v), want %g (%v)", tc.name, rd, assumed, tc.rd, tc.assumed)
		}
	}
	if _, ok := ZenerOf(part(graph.Diode, "signal", map[string]float64{"vz": 8.2})); ok {
		t.Error("a signal diode has no breakdown model")
	}
}
