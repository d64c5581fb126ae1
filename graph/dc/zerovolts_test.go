package dc

import (
	"math"
	"strings"
	"testing"

	"pare/graph"
)

// TestBiasLineDeclaredAtZero: review19 b02's AGC line declares volts = 0
// (the line at rest, no signal), as the DC chart's own note asks; 0 V was
// taken for "no volts", the line solved to 4.59 V through the divider and
// the RF stage read 3.87 mA. Held at 0 V, Q1 sits where the Thevenin
// divider puts it (handbook bias formula: R1 82k from the decoupled line,
// R2 15k to the AGC line, Vbe 0.65 V, beta 120, Re 1 kΩ: about 0.62 mA), and
// the line is no fault of the capture for sinking the divider's current.
func TestBiasLineDeclaredAtZero(t *testing.T) {
	c, err := graph.LoadFile("../../testdata/review19/b02.toml")
	if err != nil {
		t.Fatal(err)
	}
	if n := c.Net("agc"); n == nil || !n.HasVolts() {
		t.Fatalf("agc: volts = 0 written, not held as declared")
	}
	pt, err := Solve(c)
	if err != nil {
		t.Fatal(err)
	}
	if v, _ := pt.Volts("agc"); v != 0 {
		t.Errorf("agc solves to %g V, declared 0 V", v)
	}
	vrf, _ := pt.Volts("vcc_rf")
	vth, rth := vrf*15e3/97e3, 82e3*15e3/97e3
	want := 120 * (vth - 0.65) / (rth + 121*1e3) // handbook Thevenin bias
	if ic := pt.Current("Q1", "c"); math.Abs(ic-want) > 0.05*want {
		t.Errorf("Q1 collector %g A, the divider's Thevenin estimate %g A", ic, want)
	}
	for _, n := range pt.Notes {
		if strings.Contains(n, "agc") {
			t.Errorf("note on the AGC line held at its declared 0 V: %s", n)
		}
	}
}
