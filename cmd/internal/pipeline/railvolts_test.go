package pipeline

import (
	"fmt"
	"strings"
	"testing"

	"pare/render"
)

// On the club receiver's reduced sheet each decoupled line is tagged with
// its own DC voltage, the operating point's as the DC chart prints it
// (four figures), not the voltage in the label of the rail that feeds it
// ("HT +250 V"): R11 drops the HT to 241.2 V on ht_if1 (graph/dc, checked
// against ngspice .op in graph/dc's tests, docs/dc.md).
func TestDecoupledLinesCarryTheirOwnVolts(t *testing.T) {
	res, err := stagesRun("../../../examples/club-receiver.toml")
	if err != nil {
		t.Fatal(err)
	}
	c := res.Sheet(render.Reduced).Circuit
	tagged := 0
	for _, name := range []string{"ht_if1", "ht_if2", "ht_rf", "ht_mix", "ht_pre"} {
		var label string
		for _, n := range append(c.Nets, c.Rails...) {
			if n.Name == name {
				label = n.Label
			}
		}
		if label == "" {
			continue // joined away without a tag on this sheet
		}
		tagged++
		v, ok := res.DC.Volts(name)
		// named by the rail it is fed from and the part it comes through
		// ("HT via R11"), never as the rail itself, with its own voltage
		if want := fmt.Sprintf(" +%.4g V", v); !ok || !strings.HasPrefix(label, "HT via R") || !strings.HasSuffix(label, want) {
			t.Errorf("%s tagged %q, want \"HT via R…%s\" (its own DC voltage)", name, label, want)
		}
	}
	if tagged == 0 {
		t.Fatal("no decoupled line on the reduced sheet")
	}
	if n := res.Reduced.Net("ht_if1"); n != nil && n.Label != "HT" {
		t.Errorf("the reduced circuit itself changed: ht_if1 label %q", n.Label)
	}
}
