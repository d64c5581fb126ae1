package rules

import (
	"testing"
)

// A band switch at position 2 joins its common contact to the second coil.
func TestSwitchSet(t *testing.T) {
	src := `
band = "530k..1.6M"
inputs = ["ant"]
outputs = ["g"]
[parts]
S1 = { switch = 2, set = 2, closes = ["c-1", "c-2"], pins = { c = "g", "1" = "lw", "2" = "mw" } }
L1 = { l = "2m", pins = ["lw", "gnd"] }
L2 = { l = "250u", pins = ["mw", "gnd"] }
C1 = { c = "100p", pins = ["ant", "g"] }
V1 = { valve = "triode", pins = { a = "a", g1 = "g", k = "gnd" } }
R1 = { r = "10k", pins = ["a", "gnd"] }
`
	r, log := reduceChecked(t, parse(t, src), Options{Level: LevelTidy})
	if r.Part("S1") != nil {
		t.Fatalf("the switch should be replaced by its connections\n%s", logText(log))
	}
	if got := r.Part("L2").Pins[0].Net; got != "g" {
		t.Errorf("L2 should now be on the grid net g, is on %s\n%s", got, logText(log))
	}
	if r.Part("L1") != nil {
		t.Errorf("L1 (long wave, switched out) is left dangling and should be pruned\n%s", logText(log))
	}
}
