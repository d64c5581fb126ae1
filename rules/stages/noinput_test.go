package stages

import (
	"math"
	"strings"
	"testing"

	"pare/graph"
	"pare/rules"
)

// noInputChain is a triode stage and a cathode follower with an output
// coupling capacitor, captured without declaring an input or output (an
// invented board): the stages must still come in signal order, and each
// coupling corner must take the resistance the capacitor feeds.
const noInputChain = `title = "no declared input (invented)"
band = "20..20k"
[nets]
ht = { role = "supply", volts = 250 }
[parts]
C1 = { c = "22n", pins = ["src", "g1"] }
R1 = { r = "470k", pins = ["g1", "gnd"] }
V1 = { valve = "triode", pins = { a = "a1", g1 = "g1", k = "gnd" }, mu = 20, ra = "10k" }
R2 = { r = "47k", pins = ["ht", "a1"] }
V2 = { valve = "triode", pins = { a = "ht", g1 = "a1", k = "k2" }, mu = 20, ra = "10k" }
R3 = { r = "10k", pins = ["k2", "gnd"] }
C2 = { c = "100n", pins = ["k2", "out"] }
R4 = { r = "100k", pins = ["out", "gnd"] }
P1 = { port = "from source", pins = ["src"] }
`

func TestStagesWithoutDeclaredInput(t *testing.T) {
	c, err := graph.Parse("noin.toml", []byte(noInputChain))
	if err != nil {
		t.Fatal(err)
	}
	r, log, err := rules.Reduce(c, rules.Options{Level: rules.LevelSignal})
	if err != nil {
		t.Fatal(err)
	}
	st := find(t, r, Options{ACGround: log.ACGround})
	var order []string
	for _, s := range st {
		order = append(order, strings.Join(s.Parts, "+"))
	}
	// The signal runs C1/R1 → V1 → V2 → C2 into R4.
	if got, want := strings.Join(order, " "), "C1+R1 R2+V1 R3+V2 C2+R4"; got != want {
		t.Errorf("stage order %s, want %s (%s)", got, want, topologies(st))
	}
	// Corners f = 1/(2πRC) with the resistance fed (docs/references.md §4):
	// C1 into R1 470 kΩ → 15.392 Hz; C2 into R4 100 kΩ → 15.915 Hz.
	for _, w := range []struct {
		cap  string
		want float64
	}{{"C1", 15.392}, {"C2", 15.915}} {
		var got float64
		for _, s := range st {
			if strings.Contains(" "+strings.Join(s.Parts, " ")+" ", " "+w.cap+" ") {
				got, _ = s.Figures.Lookup("f_c_hz")
			}
		}
		if math.Abs(got/w.want-1) > 1e-3 {
			t.Errorf("%s corner %g Hz, want %g Hz", w.cap, got, w.want)
		}
	}
}
