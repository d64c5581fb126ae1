package synth

import (
	"bytes"
	"testing"

	"pare/graph"
)

// The bank loads without errors or warnings at every size, has about the
// parts asked for, one input and one output per channel, and the same size
// and seed give the same bytes. At 10,000 parts the chassis holds more
// terminals than a signal net may (graph.MaxTerminalsPerNet): a net at AC
// ground may hold a terminal per part, so the whole set loads.
func TestBankLoadsAndRepeats(t *testing.T) {
	for _, n := range []int{100, 1000, 10000} {
		a, err := Bank(n, 1)
		if err != nil {
			t.Fatal(err)
		}
		b, _ := Bank(n, 1)
		if !bytes.Equal(a, b) {
			t.Fatalf("%d parts: two runs with seed 1 differ", n)
		}
		c, err := graph.Parse("bank.toml", a)
		if err != nil {
			t.Fatalf("%d parts: %v", n, err)
		}
		if w := graph.Check(c); len(w) > 0 {
			t.Errorf("%d parts: %d warnings, first %v", n, len(w), w[0])
		}
		// At most one channel (50 parts, the larger template) past the target.
		if len(c.Parts) < n || len(c.Parts) > n+50 {
			t.Errorf("asked for %d parts, got %d", n, len(c.Parts))
		}
		if len(c.Inputs) != len(c.Outputs) || len(c.Inputs) < n/50 {
			t.Errorf("%d parts: %d inputs, %d outputs", n, len(c.Inputs), len(c.Outputs))
		}
		// Channels share no signal net: every part connected to another
		// through signal nets carries the same channel number (R304: 3).
		for _, comp := range graph.Components(c, true) {
			for _, ref := range comp[1:] {
				if channelOf(ref) != channelOf(comp[0]) {
					t.Fatalf("%d parts: %s and %s are connected across channels", n, comp[0], ref)
				}
			}
		}
	}
	a, _ := Bank(1000, 1)
	b, _ := Bank(1000, 2)
	if bytes.Equal(a, b) {
		t.Error("seeds 1 and 2 give the same bank")
	}
}

// The RC ladder of bench/run.sh's pairing with ngspice loads at its size,
// 10,000 sections: its ground holds a capacitor of every section.
func TestLadderLoads(t *testing.T) {
	src, err := Ladder(10000)
	if err != nil {
		t.Fatal(err)
	}
	c, err := graph.Parse("ladder.toml", src)
	if err != nil {
		t.Fatal(err)
	}
	if len(c.Parts) != 20000 || len(c.ConnsOf("gnd")) != 10000 {
		t.Errorf("%d parts, %d terminals on gnd; want 20000 and 10000", len(c.Parts), len(c.ConnsOf("gnd")))
	}
}

func channelOf(ref string) string {
	m := refForm.FindStringSubmatch(ref)
	return m[2][:len(m[2])-2]
}

// jitter moves along the E12 series (IEC 60063), across decades too.
func TestJitter(t *testing.T) {
	cases := []struct {
		v    float64
		up   bool
		want float64
	}{
		{47e3, true, 56e3}, {47e3, false, 39e3}, // IEC 60063 E12
		{82e3, true, 100e3}, {100e3, false, 82e3}, // across the decade
		{1e6, true, 1.2e6},
	}
	for _, c := range cases {
		if got := jitter(c.v, c.up); got < c.want*0.999 || got > c.want*1.001 {
			t.Errorf("jitter(%g, %v) = %g, want %g", c.v, c.up, got, c.want)
		}
	}
}

func TestCopies(t *testing.T) {
	src, err := templates.ReadFile("templates/portable.toml")
	if err != nil {
		t.Fatal(err)
	}
	out, err := Copies(src, 5)
	if err != nil {
		t.Fatal(err)
	}
	c, err := graph.Parse("copies.toml", out)
	if err != nil {
		t.Fatal(err)
	}
	// 32 parts per copy (templates/portable.toml, as examples/transistor-front-end.toml)
	if len(c.Parts) != 5*32 || len(c.Inputs) != 5 {
		t.Errorf("5 copies: %d parts, %d inputs", len(c.Parts), len(c.Inputs))
	}
}
