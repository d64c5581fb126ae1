package dc

import (
	"os"
	"strings"
	"testing"

	"pare/graph"
)

// TestHeaterChainNotTheHTLine: a resistor is in a heater chain only when
// it carries the heaters' current. A directly heated rectifier's filament
// is its cathode and sits on the HT reservoir (the circuit's own wiring:
// V5 k and h1 both on ht_res in review 17's b05), so the smoothing
// resistor from that reservoir carries the HT's DC, not a chain's AC: the
// chart gives it the solve's watts and no heater-chain note (common
// practice: a mains-transformer set's heaters are in parallel on their own
// winding and have no dropper). The AC/DC set's dropper R16 stays in its
// chain.
func TestHeaterChainNotTheHTLine(t *testing.T) {
	for _, tc := range []struct {
		file, ref string
		chain     bool
	}{
		{"../../testdata/review17/b05.toml", "R22", false},
		{"../../testdata/review17/b05.toml", "R23", false},
		{"../../testdata/good/review17-acdc.toml", "R16", true},
	} {
		t.Run(tc.ref, func(t *testing.T) {
			b, err := os.ReadFile(tc.file)
			if err != nil {
				t.Fatal(err)
			}
			c, err := graph.Parse(tc.file, b)
			if err != nil {
				t.Fatal(err)
			}
			pt, err := Solve(c)
			if err != nil {
				t.Fatal(err)
			}
			ch, err := pt.Chart(Meter{})
			if err != nil {
				t.Fatal(err)
			}
			for _, h := range ch.Resistors {
				if h.Ref != tc.ref {
					continue
				}
				if got := strings.Contains(h.Note, "heater chain"); got != tc.chain {
					t.Errorf("%s note %q: in a heater chain %v, want %v", tc.ref, h.Note, got, tc.chain)
				}
				if !tc.chain && !(h.Watts > 0) {
					t.Errorf("%s %g W, want the solve's dissipation", tc.ref, h.Watts)
				}
				return
			}
			t.Fatalf("%s not in the chart", tc.ref)
		})
	}
}
