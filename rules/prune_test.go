package rules

import (
	"testing"
)

func TestPrune(t *testing.T) {
	src := `
band = "20..20k"
inputs = ["in"]
outputs = ["out"]
[nets]
spare = { role = "port" }
[parts]
R1 = { r = "10k", pins = ["in", "out"] }
R2 = { r = "10k", pins = ["out", "gnd"] }
R3 = { r = "1k", pins = ["out", "loose"], note = "one end floating" }
R4 = { r = "1k", pins = ["loose", "loose2"] }
C5 = { c = "1n", pins = ["out", "nc"] }
R6 = { r = "1k", pins = ["in", "in"] }
P1 = { port = "to nowhere", pins = ["lone"] }
P2 = { port = "to the tuner", pins = ["spare"] }
`
	r, log := reduceChecked(t, parse(t, src), Options{Level: LevelTidy})
	for _, ref := range []string{"R3", "R4", "C5", "R6", "P1"} {
		if r.Part(ref) != nil {
			t.Errorf("%s should be pruned\n%s", ref, logText(log))
		}
	}
	for _, ref := range []string{"R1", "R2", "P2"} {
		if r.Part(ref) == nil {
			t.Errorf("%s must stay\n%s", ref, logText(log))
		}
	}
	if r.Net("loose") != nil || r.Net("loose2") != nil || r.Net("lone") != nil {
		t.Errorf("empty nets should be gone: %v", r.Nets)
	}
}
