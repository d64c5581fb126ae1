package rules

import (
	"fmt"
	"strings"
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

// The coil of the band a wavechange switch does not select: its ends sit on
// the switch's idle contacts, so no winding carries current and it goes at
// the tidy level, in a step of its own. A tapped coil whose tap alone is open
// still carries current end to end (the tank it forms with C2 stays), and a
// transformer with one winding still closed through the circuit stays too.
// Which coil is idle follows the switch setting (common practice: an open
// winding couples nothing).
func TestPruneIdleBandCoil(t *testing.T) {
	src := `
band = "150k..1.6M"
inputs = ["in"]
outputs = ["out"]
[parts]
S1 = { switch = 2, set = %d, closes = ["c-1", "c-2"], pins = { 1 = "mw", 2 = "lw", c = "in" } }
T1 = { windings = { p = "40u", s = "240u" }, k = 0.15, pins = { p1 = "mw", p2 = "gnd", s1 = "mws", s2 = "gnd" } }
T2 = { windings = { p = "400u", s = "2m3" }, k = 0.15, pins = { p1 = "lw", p2 = "gnd", s1 = "lws", s2 = "gnd" } }
S2 = { switch = 2, set = %d, closes = ["c-1", "c-2"], pins = { 1 = "mws", 2 = "lws", c = "out" } }
R1 = { r = "1M", pins = ["out", "gnd"] }
L1 = { l = "127u", tap = 0.12, pins = ["gnd", "tapx", "hot"] }
C2 = { c = "200p", pins = ["hot", "gnd"] }
T3 = { windings = { p = "1m", s = "1m" }, k = 0.5, pins = { p1 = "in", p2 = "gnd", s1 = "idle", s2 = "gnd" } }
`
	for _, tc := range []struct {
		set        int
		gone, kept string
	}{
		{1, "T2", "T1"},
		{2, "T1", "T2"},
	} {
		r, log := reduceChecked(t, parse(t, fmt.Sprintf(src, tc.set, tc.set)), Options{Level: LevelTidy})
		if r.Part(tc.gone) != nil || !strings.Contains(logText(log), tc.gone+" (transformer") {
			t.Errorf("set %d: %s (idle) should be pruned in a step of its own\n%s", tc.set, tc.gone, logText(log))
		}
		for _, ref := range []string{tc.kept, "L1", "C2", "T3"} {
			if r.Part(ref) == nil {
				t.Errorf("set %d: %s must stay\n%s", tc.set, ref, logText(log))
			}
		}
	}
}
