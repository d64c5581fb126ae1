package dc

import (
	"math"
	"testing"

	"pare/graph"
)

// A loudspeaker is a DC path through its voice coil: pare models it as its
// rated resistance at DC as at AC (docs/netlist.md). 12 V through 100 Ω into
// an 8 Ω speaker leaves 12·8/108 = 0.8889 V across it (Ohm's law); with the
// speaker taken as open (as before) the node sat at the full 12 V, and a
// speaker returned straight to a feedback network read 0.5 V off on a
// blind reviewer's ngspice operating point.
func TestSpeakerIsADCPath(t *testing.T) {
	src := `title = "speaker at DC"
band = "20..20k"
[nets]
s = { role = "supply", volts = 12 }
[parts]
R1 = { r = "100", pins = ["s", "x"] }
LS1 = { spk = "8", pins = ["x", "gnd"] }
`
	c, err := graph.Parse("spk.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	pt, err := Solve(c)
	if err != nil {
		t.Fatal(err)
	}
	const want = 12.0 * 8 / 108 // Ohm's law
	for _, n := range pt.Nets {
		if n.Name == "x" && math.Abs(n.Volts-want) > 1e-6 {
			t.Errorf("x at %.6g V, want %.6g V (Ohm's law)", n.Volts, want)
		}
	}
	if i := pt.Current("LS1", "1"); math.Abs(math.Abs(i)-12.0/108) > 1e-9 {
		t.Errorf("LS1 carries %.6g A, want %.6g A", i, 12.0/108)
	}
}
