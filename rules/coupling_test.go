package rules

import (
	"fmt"
	"strings"
	"testing"
)

// A coupling capacitor into a 470 kΩ grid leak, audio band from 20 Hz.
// 10 nF: Xc(20 Hz) = 795.77 kΩ (derived; its corner is 33.86 Hz,
// docs/references.md §4) — kept. 1 µF: 7957.7 Ω ≤ 47 kΩ — a wire in the
// ideal view, never below it.
func couplingFixture(c string) string {
	return fmt.Sprintf(`
band = "20..20k"
inputs = ["g1"]
outputs = ["a2"]
[nets]
ht = { role = "supply", volts = 250 }
[parts]
V1 = { valve = "triode", pins = { a = "a1", g1 = "g1", k = "gnd" }, ra = "10k", mu = 20 }
R1 = { r = "47k", pins = ["a1", "ht"] }
C1 = { c = %q, pins = ["a1", "g2"] }
R2 = { r = "470k", pins = ["g2", "gnd"] }
V2 = { valve = "triode", pins = { a = "a2", g1 = "g2", k = "gnd" }, ra = "10k", mu = 20 }
R3 = { r = "47k", pins = ["a2", "ht"] }
`, c)
}

func TestCouplingShort(t *testing.T) {
	cases := []struct {
		c       string
		level   Level
		shorted bool
		xc      string
	}{
		{"10n", LevelIdeal, false, "795.77 kΩ"},
		{"1u", LevelIdeal, true, "7.9577 kΩ"},
		{"1u", LevelSignal, false, ""},
	}
	for _, tc := range cases {
		t.Run(tc.c+"/"+tc.level.String(), func(t *testing.T) {
			r, log := reduceChecked(t, parse(t, couplingFixture(tc.c)), Options{Level: tc.level})
			if (r.Part("C1") == nil) != tc.shorted {
				t.Fatalf("C1 shorted = %v, want %v\n%s", r.Part("C1") == nil, tc.shorted, logText(log))
			}
			if tc.xc != "" && !strings.Contains(logText(log), tc.xc) {
				t.Errorf("log should show %s:\n%s", tc.xc, logText(log))
			}
			if tc.shorted && r.Part("V2").NetOf("g1") != r.Part("V1").NetOf("a") {
				t.Errorf("V2's grid should now be on V1's anode net\n%s", logText(log))
			}
		})
	}
}

// A capacitor in a tuned circuit between two signal nets is never shorted.
func TestCouplingNotATank(t *testing.T) {
	src := `
band = "455k..485k"
inputs = ["p"]
outputs = ["s"]
[parts]
T1 = { windings = { p = "1m147", s = "1m147" }, k = 0.01, pins = { p1 = "p", p2 = "gnd", s1 = "s", s2 = "cold" } }
C1 = { c = "100p", pins = ["s", "cold"] }
R1 = { r = "1M", pins = ["s", "gnd"] }
R2 = { r = "1M", pins = ["cold", "gnd"] }
`
	r, log := reduceChecked(t, parse(t, src), Options{Level: LevelIdeal})
	if r.Part("C1") == nil {
		t.Fatalf("the secondary tuning capacitor was shorted:\n%s", logText(log))
	}
	// derived from f = 1/(2π√(LC)): 1.147 mH with 100 pF resonates at 469.9 kHz
	if !strings.Contains(logText(log), "469.9 kHz") {
		t.Errorf("near miss should give the resonance 469.9 kHz:\n%s", logText(log))
	}
}

// A capacitor with a resistor directly across it is an R–C network (a
// detector load, a de-emphasis or tone network), not a coupling capacitor:
// the "impedance on either side" would count the resistor as a load to
// ground while the capacitor shorts it. The 1 µF of the fixture, which the
// ten-times rule shorts when alone (7.9577 kΩ ≤ 47 kΩ), stays with 1 MΩ
// across it: shorting it would also short the resistor.
func TestCouplingNotAcrossAResistor(t *testing.T) {
	src := couplingFixture("1u") + `R9 = { r = "1M", pins = ["g2", "a1"] }` + "\n"
	r, log := reduceChecked(t, parse(t, src), Options{Level: LevelIdeal})
	if r.Part("C1") == nil || r.Part("R9") == nil {
		t.Fatalf("C1 with R9 across it was shorted:\n%s", logText(log))
	}
	if !strings.Contains(logText(log), "R9 (1 MΩ, g2–a1) is directly across it") {
		t.Errorf("the near miss should name R9:\n%s", logText(log))
	}
}
