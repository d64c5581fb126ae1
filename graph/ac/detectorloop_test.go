package ac

import (
	"math"
	"testing"

	"pare/graph"
)

// TestLoopDetectorLoad: a diode whose current returns only through other
// diodes takes its share of the loop's load (docs/references.md §50; a
// ratio detector's input resistance is half its total load, common
// practice). Before, each of a ratio detector's diodes had no DC load and
// fell to VT/Id, 26 Ω, damping its secondary to a Q of 0.19.
func TestLoopDetectorLoad(t *testing.T) {
	const head = `title = "loop"
band = "10.6M..10.8M"
inputs = ["p"]
[nets]
gnd = { role = "ground" }
[parts]
T1 = { windings = { p = "2u2", s = ["1u1", "1u1"] }, k = 0.2, q = 70, pins = { p1 = "p", p2 = "gnd", s1 = "s1", st = "ct", s2 = "s2" } }
C1 = { c = "50p", pins = ["s1", "s2"] }
`
	cases := []struct {
		name, parts string
		ref         string
		want        float64 // derived from the netlist by hand
	}{
		// ratio detector: D1 and D2 in series round the secondary, loads
		// R1 + R2 = 2k to chassis: 2k over two diodes
		{"ratio", `D1 = { diode = "signal", pins = ["s1", "o1"] }
D2 = { diode = "signal", pins = ["o2", "s2"] }
R1 = { r = "1k", pins = ["o1", "gnd"] }
R2 = { r = "1k", pins = ["gnd", "o2"] }
C2 = { c = "5u", pins = ["o1", "o2"] }
`, "D1", 1e3},
		// one load across the pair: the same loop, 10k over two
		{"across", `D1 = { diode = "signal", pins = ["s1", "o1"] }
D2 = { diode = "signal", pins = ["o2", "s2"] }
R1 = { r = "10k", pins = ["o1", "o2"] }
`, "D2", 5e3},
		// a path of its own wins: the centre tap returned, as a
		// Foster–Seeley's, each diode into its own 100k
		{"own", `D1 = { diode = "signal", pins = ["s1", "o1"] }
D2 = { diode = "signal", pins = ["s2", "o2"] }
R1 = { r = "100k", pins = ["o1", "ct"] }
R2 = { r = "100k", pins = ["o2", "ct"] }
`, "D1", 100e3},
		// the loop closes only through a rectifier: no detector loop
		{"rectifier", `D1 = { diode = "signal", pins = ["s1", "o1"] }
D2 = { diode = "rectifier", pins = ["o2", "s2"] }
R1 = { r = "1k", pins = ["o1", "gnd"] }
R2 = { r = "1k", pins = ["gnd", "o2"] }
`, "D1", math.Inf(1)},
	}
	for _, tc := range cases {
		c, err := graph.Parse(tc.name+".toml", []byte(head+tc.parts))
		if err != nil {
			t.Fatalf("%s: %v", tc.name, err)
		}
		l := DetectorLoad(c, c.Part(tc.ref))
		if math.IsInf(tc.want, 1) != math.IsInf(l, 1) || !math.IsInf(l, 1) && math.Abs(l/tc.want-1) > 1e-6 {
			t.Errorf("%s: %s's load %g Ω, want %g Ω", tc.name, tc.ref, l, tc.want)
		}
	}
}
