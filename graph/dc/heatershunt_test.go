package dc

import (
	"math"
	"os"
	"strings"
	"testing"

	"pare/graph"
)

// TestHeaterChainShunt: a resistor across a part of the heater chain (a
// dial lamp's shunt) carries the share of the chain's current the current
// divider gives it, not the whole: review21 a05's R23 (150 Ω across the
// 6.3 V 0.15 A dial lamp LP1, 42 Ω hot by Ohm's law at its rating) was
// charted at 0.1² · 150 = 1.5 W. By hand (current divider, handbook):
// I = 0.1 · 42 / (42 + 150) = 21.875 mA, P = I² · 150 = 71.78 mW. A lamp
// with no rating in its label leaves the share unknown, said so; the chain's
// dropper R22, in series, keeps the whole chain current.
func TestHeaterChainShunt(t *testing.T) {
	b, err := os.ReadFile("../../testdata/review21/a05.toml")
	if err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		name, from, to string
		watts          float64
		note           string
	}{
		{"lamp rated in its label", "", "", 0.02187500 * 0.02187500 * 150, "across LP1 (42 Ω hot)"},
		{"lamp with no rating", `part = "dial lamp 6.3 V 0.15 A"`, `part = "dial lamp"`, 0, "share of the chain's 0.1 A is not known"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			text := string(b)
			if tc.from != "" {
				text = strings.Replace(text, tc.from, tc.to, 1)
			}
			c, err := graph.Parse("a05.toml", []byte(text))
			if err != nil {
				t.Fatal(err)
			}
			pt, err := Solve(c)
			if err != nil {
				t.Fatal(err)
			}
			_, heat := chartHeat(t, pt)
			r23 := heat["R23"]
			if math.Abs(r23.Watts-tc.watts) > 1e-6 || !strings.Contains(r23.Note, tc.note) {
				t.Errorf("R23 %g W, note %q; want %g W and %q", r23.Watts, r23.Note, tc.watts, tc.note)
			}
			if r22 := heat["R22"]; math.Abs(r22.Watts-0.1*0.1*1000) > 1e-6 {
				t.Errorf("the dropper R22 %g W (%q): want the whole chain's 0.1 A through 1 kΩ, 10 W", r22.Watts, r22.Note)
			}
		})
	}
}
