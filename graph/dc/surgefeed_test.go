package dc

import (
	"math"
	"os"
	"strings"
	"testing"

	"pare/graph"
)

// TestFeedResistorHeat: a surge resistor between the mains and the anode
// of a half-wave rectifier into a declared rail carries the charging
// pulses the DC solve cannot see; its heat is their RMS squared times R.
// Check value: ngspice-39 transient of the same supply at the declared
// 226 V and the DC load, testdata/acdc-feed.cir: 111.595 mA RMS, 1.2453 W
// (the blind reviewer's own AC/DC deck at 245 V gave 1.15 W for 45.4 mA).
// A resistor that shares the anode net with another path (a bleed to
// chassis) is no series feed: it keeps the DC solve's figure.
func TestFeedResistorHeat(t *testing.T) {
	for _, tc := range []struct {
		name  string
		extra string // a part added to the fixture
		watts float64
		tol   float64
		note  bool
	}{
		{"half-wave feed", "", 1.2453, 0.02, true},
		{"anode net with a bleed", `R9 = { r = "1M", pins = ["rect_a", "gnd"] }`, 0, 0.01, false},
	} {
		t.Run(tc.name, func(t *testing.T) {
			b, err := os.ReadFile("testdata/acdc-feed.toml")
			if err != nil {
				t.Fatal(err)
			}
			c, err := graph.Parse("acdc-feed.toml", []byte(string(b)+tc.extra+"\n"))
			if err != nil {
				t.Fatal(err)
			}
			pt, err := Solve(c)
			if err != nil {
				t.Fatal(err)
			}
			_, heat := chartHeat(t, pt)
			r1 := heat["R1"]
			if got := strings.Contains(r1.Note, "charging pulses"); got != tc.note {
				t.Errorf("R1 note %q: want the pulses' heat %v", r1.Note, tc.note)
			}
			if math.Abs(r1.Watts-tc.watts) > tc.tol*math.Max(tc.watts, 1) {
				t.Errorf("R1 %.4g W, want %.4g W within %.0f %%", r1.Watts, tc.watts, 100*tc.tol)
			}
		})
	}
}
