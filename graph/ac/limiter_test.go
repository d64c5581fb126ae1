package ac

import (
	"math"
	"math/cmplx"
	"testing"

	"pare/graph"
)

// A pair of silicon diodes in inverse parallel across a feedback resistor
// (an oscillator's amplitude limiter) carries no DC at rest, so for small
// signals it is open: the divider's ratio is the resistors' alone. Before,
// each diode took a peak detector's RL/2 and shunted the resistor, which
// made a Wien oscillator's start-up loop gain read −1.9 dB where ngspice,
// its diodes at 0 V (about 2 GΩ each), gives +1.3 dB (a blind reviewer's
// 12 V Wien oscillator). Near misses: a lone diode into an RC load stays a
// peak detector with rd = RL/2; two diodes in series the same way round
// (a ratio detector's pair) are no limiter.
func TestLimiterPairOpenAtRest(t *testing.T) {
	const base = `band = "100..10k"
inputs = ["in"]
outputs = ["out"]
[parts]
R1 = { r = "1k", pins = ["in", "out"] }
R2 = { r = "1k", pins = ["out", "x"] }
R3 = { r = "1k", pins = ["x", "gnd"] }
`
	cases := []struct {
		name, extra string
		want        float64 // |V(out)/V(in)| at 1 kHz, by hand
	}{
		// 2k/(1k+2k): the pair open (derived by hand)
		{"inverse pair across R3", `D1 = { diode = "signal", pins = ["x", "gnd"] }
D2 = { diode = "signal", pins = ["gnd", "x"] }
`, 2.0 / 3},
		// a lone diode is a detector with a DC load (R2 + R1 back to
		// the held input): it keeps its RL/2 and loads the divider
		{"one diode alone", `D1 = { diode = "signal", pins = ["x", "gnd"] }
`, -1},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			c, err := graph.Parse("limiter.toml", []byte(base+tc.extra))
			if err != nil {
				t.Fatal(err)
			}
			r, err := NewTransfer(c, "in", "out", Options{})
			if err != nil {
				t.Fatal(err)
			}
			h, err := r.At(1e3)
			if err != nil {
				t.Fatal(err)
			}
			got := cmplx.Abs(h)
			if tc.want > 0 && math.Abs(got-tc.want) > 1e-9 {
				t.Errorf("|H| = %.9f, want %.9f", got, tc.want)
			}
			if tc.want < 0 && math.Abs(got-2.0/3) < 1e-3 {
				t.Errorf("a lone diode left open: |H| = %.6f", got)
			}
		})
	}
}
