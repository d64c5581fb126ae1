package rules

import (
	"strings"
	"testing"
)

// An unbypassed cathode resistor carries signal and stays; the screen feed
// and decoupling parts go; a power supply joined only through the HT rail goes.
func TestDCFeedAndNoSignal(t *testing.T) {
	src := `
band = "20..20k"
inputs = ["g"]
outputs = ["a"]
[nets]
ht = { role = "supply", volts = 250 }
[parts]
V1 = { valve = "triode", pins = { a = "a", g1 = "g", k = "k" }, mu = 20, ra = "10k" }
R1 = { r = "1M", pins = ["g", "gnd"] }
R2 = { r = "1k", pins = ["k", "gnd"], note = "cathode resistor, no bypass" }
R3 = { r = "47k", pins = ["a", "dec"] }
R4 = { r = "22k", pins = ["dec", "ht"] }
C4 = { c = "8u", type = "electrolytic", pins = ["dec", "gnd"] }
T9 = { windings = { p = "10", s = "10" }, k = 0.99, pins = { p1 = "mains_l", p2 = "mains_n", s1 = "sec", s2 = "gnd" } }
D9 = { diode = "rectifier", pins = ["sec", "ht"] }
C9 = { c = "50u", type = "electrolytic", pins = ["ht", "gnd"] }
`
	r, log := reduceChecked(t, parse(t, src), Options{Level: LevelSignal})
	if r.Part("R2") == nil || r.Part("V1").NetOf("k") != "k" {
		t.Errorf("the unbypassed cathode resistor R2 must stay (it sets the gain, docs/references.md §5)\n%s", logText(log))
	}
	for _, ref := range []string{"R4", "C4", "C9", "T9", "D9"} {
		if r.Part(ref) != nil {
			t.Errorf("%s should be gone\n%s", ref, logText(log))
		}
	}
	ns := stepsOf(log, "no-signal")
	if len(ns) != 1 || strings.Join(ns[0].Removed, ",") != "D9,T9" {
		t.Errorf("want one no-signal step removing D9,T9, got %+v\n%s", ns, logText(log))
	}
	// R3 now runs from the anode to AC ground: it is the anode load and stays
	if r.Part("R3") == nil {
		t.Errorf("R3 is the anode load and must stay")
	}
}

// Without declared inputs or outputs the no-signal rule cannot know where the
// signal is and does nothing.
func TestNoSignalNeedsEnds(t *testing.T) {
	src := `
band = "20..20k"
[parts]
V1 = { valve = "triode", pins = { a = "a1", g1 = "g1", k = "gnd" } }
R1 = { r = "1M", pins = ["g1", "gnd"] }
R2 = { r = "47k", pins = ["a1", "gnd"] }
V2 = { valve = "triode", pins = { a = "a2", g1 = "g2", k = "gnd" } }
R3 = { r = "1M", pins = ["g2", "gnd"] }
R4 = { r = "47k", pins = ["a2", "gnd"] }
`
	_, log := reduceChecked(t, parse(t, src), Options{Level: LevelSignal})
	if len(stepsOf(log, "no-signal")) != 0 {
		t.Fatalf("no-signal fired without any declared end:\n%s", logText(log))
	}
}
