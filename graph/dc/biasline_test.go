package dc

import (
	"path/filepath"
	"strings"
	"testing"

	"pare/graph"
)

// TestOpenBiasLineNoted: a bias line without volts that comes in at a port
// from off the sheet (an AGC line from a detector elsewhere) is noted as
// solved drawing no current, with its solved volts and what to give; one a
// detector on the sheet feeds is not. review17 b02's reviewer read 714 µA of
// collector current where ngspice, the line held at 0 V, gives 519 µA
// (testdata/review17/spice/b), and nothing said the chart rested on it.
func TestOpenBiasLineNoted(t *testing.T) {
	cases := []struct {
		file string
		want string // "" = no such note
	}{
		{"../../testdata/review17/b02.toml", "bias line agc declares no volts and comes in at P2 from off this sheet"},
		{"../../examples/if-detector-audio.toml", ""}, // the detector here feeds the line it exports
	}
	for _, c := range cases {
		ckt, err := graph.LoadFile(c.file)
		if err != nil {
			t.Fatal(err)
		}
		pt, err := Solve(ckt)
		if err != nil {
			t.Fatal(err)
		}
		var got string
		for _, n := range pt.Notes {
			if strings.HasPrefix(n, "bias line ") {
				got = n
			}
		}
		switch {
		case c.want == "" && got != "":
			t.Errorf("%s: unexpected note %q", filepath.Base(c.file), got)
		case c.want != "" && !strings.Contains(got, c.want):
			t.Errorf("%s: note %q, want one containing %q", filepath.Base(c.file), got, c.want)
		}
	}
}
