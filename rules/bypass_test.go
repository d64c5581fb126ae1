package rules

import (
	"fmt"
	"strings"
	"testing"
)

// gridNet builds a net x holding a resistor R1 and a capacitor C1 to ground
// and a triode grid (an open input), so the impedance the capacitor shunts is
// exactly R1. pinsC lets a test type the capacitor's pins either way round.
func gridNet(band, r, c, pinsC, region string) string {
	return fmt.Sprintf(`
band = %q
inputs = ["in"]
outputs = ["out"]
%s
[nets]
ht = { role = "supply", volts = 250 }
[parts]
R9 = { r = "100k", pins = ["in", "x"] }
R1 = { r = %q, pins = ["x", "gnd"] }
C1 = { c = %q, pins = %s }
V1 = { valve = "triode", pins = { a = "out", g1 = "x", k = "gnd" }, gm = "2mA/V", ra = "10k" }
R2 = { r = "47k", pins = ["out", "ht"] }
`, band, region, r, c, pinsC)
}

func TestBypass(t *testing.T) {
	cases := []struct {
		name    string
		src     string
		grounds bool
		xc      string // |Xc| as the why prints it (5 significant digits)
	}{
		// Xc = 1/(2πfC) (derived): 1 µF at 20 Hz is 7957.7 Ω, far above 1 kΩ/10.
		{"1uF across 1k at 20 Hz is no bypass", gridNet("20..20k", "1k", "1u", `["x", "gnd"]`, "") + "\n" /* R9 100k also on x */, false, "7.9577 kΩ"},
		// docs/references.md §4: 25 µF at 100 Hz = 63.6620 Ω ≤ 1 kΩ/10 … but R9 (100 kΩ) is on x too: 990.1 Ω/10 = 99.0 Ω.
		{"25uF at 100 Hz bypasses 1k", gridNet("100..20k", "1k", "25u", `["x", "gnd"]`, ""), true, "63.662 Ω"},
		// same part, typed the other way round: a symmetric match must still fire.
		{"pins typed gnd first", gridNet("100..20k", "1k", "25u", `["gnd", "x"]`, ""), true, "63.662 Ω"},
		// 63.662 Ω > 0.1 × (600 ∥ 100k = 596.42 Ω): a near miss.
		{"25uF at 100 Hz does not bypass 600R", gridNet("100..20k", "600", "25u", `["x", "gnd"]`, ""), false, "63.662 Ω"},
		// docs/references.md §4: 0.1 µF at 455 kHz = 3.49791 Ω.
		{"100n at 455 kHz", gridNet("455k..485k", "1k", "100n", `["x", "gnd"]`, ""), true, "3.4979 Ω"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			r, log := reduceChecked(t, parse(t, tc.src), Options{Level: LevelSignal})
			got := len(stepsOf(log, "bypass")) == 1
			if got != tc.grounds {
				t.Fatalf("bypass fired = %v, want %v\n%s", got, tc.grounds, logText(log))
			}
			text := logText(log)
			if !strings.Contains(text, tc.xc) {
				t.Errorf("log does not show |Xc| = %s:\n%s", tc.xc, text)
			}
			if tc.grounds {
				if r.Part("C1") != nil || r.Part("R1") != nil {
					t.Errorf("C1 and R1 should be gone once x is at AC ground:\n%s", text)
				}
				if r.Net("x") != nil {
					t.Errorf("net x should have joined ground")
				}
			} else if r.Part("C1") == nil || r.Part("R1") == nil {
				t.Errorf("C1 and R1 must stay:\n%s", text)
			}
		})
	}
}

// The bypass rule of thumb Xc(f_low) ≤ R/10: docs/references.md §4 gives
// C ≥ 53.0516 µF for 1.5 kΩ at 20 Hz. Just above fires, just below does not
// (the grid resistor is made huge so the net sees 1.5 kΩ only).
func TestBypassThreshold(t *testing.T) {
	for _, tc := range []struct {
		c    string
		want bool
	}{{"53.06u", true}, {"53.04u", false}} {
		src := strings.Replace(gridNet("20..20k", "1k5", tc.c, `["x", "gnd"]`, ""), `r = "100k", pins = ["in", "x"]`, `r = "1e15", pins = ["in", "x"]`, 1)
		_, log := reduceChecked(t, parse(t, src), Options{Level: LevelSignal})
		if got := len(stepsOf(log, "bypass")) == 1; got != tc.want {
			t.Errorf("C = %s across 1.5 kΩ at 20 Hz: bypass = %v, want %v\n%s", tc.c, got, tc.want, logText(log))
		}
	}
}

// A 100 pF detector-load capacitor across 470 kΩ: at 455 kHz its reactance
// (1/(2π·455k·100p) = 3497.9 Ω, derived) is far below 47 kΩ, an IF bypass;
// at 20 Hz (79.577 MΩ, derived) it is nothing of the sort. The region decides,
// and so does any audio part on the same net.
func TestBypassRegionDecides(t *testing.T) {
	base := `
band = "455k..485k"
inputs = ["sec"]
outputs = ["out"]
[regions]
%s
[parts]
D1 = { diode = "signal", pins = ["sec", "det"] }
R5 = { r = "470k", pins = ["det", "gnd"] }
C8 = { c = "100p", pins = ["det", "gnd"] }
V1 = { valve = "triode", pins = { a = "out", g1 = "det", k = "gnd" } }
R2 = { r = "100k", pins = ["out", "gnd"] }
%s
`
	cases := []struct {
		name, regions, extra string
		want                 bool
		xc                   string
	}{
		{"IF region", `if = { band = "455k..485k", parts = ["C8", "R5", "D1"] }`, "", true, "3.4979 kΩ"},
		{"audio region", `audio = { band = "20..20k", parts = ["C8", "R5", "D1", "V1"] }`, "", false, "79.577 MΩ"},
		{"IF capacitor, but the net also feeds an audio coupling capacitor",
			`if = { band = "455k..485k", parts = ["C8", "R5", "D1"] }` + "\n" + `audio = { band = "20..20k", parts = ["C9"] }`,
			`C9 = { c = "10n", pins = ["det", "out"] }`, false, "79.577 MΩ"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			_, log := reduceChecked(t, parse(t, fmt.Sprintf(base, tc.regions, tc.extra)), Options{Level: LevelSignal})
			got := false
			for _, s := range stepsOf(log, "bypass") {
				if len(s.Removed) == 1 && s.Removed[0] == "C8" {
					got = true
				}
			}
			if got != tc.want {
				t.Fatalf("C8 bypass = %v, want %v\n%s", got, tc.want, logText(log))
			}
			if !strings.Contains(logText(log), tc.xc) {
				t.Errorf("log does not show %s:\n%s", tc.xc, logText(log))
			}
		})
	}
}

// A capacitor across a coil to ground is a tank, not a bypass: 100 pF with
// 253 µH resonates at 1000.6 kHz (docs/references.md §1), inside the band.
// 10 nF with a 2.5 mH choke resonates at 31.8 kHz, far below 530 kHz: a
// decoupling filter, and there the capacitor is a bypass.
func TestBypassNotATank(t *testing.T) {
	src := `
band = "530k..1.6M"
inputs = ["in"]
outputs = ["out"]
[parts]
C9 = { c = "10p", pins = ["in", "tank"] }
L1 = { l = "253u", pins = ["tank", "gnd"] }
C1 = { c = "100p", pins = ["tank", "gnd"] }
V1 = { valve = "pentode", pins = { a = "out", g1 = "tank", g2 = "gnd", g3 = "gnd", k = "gnd" } }
L2 = { l = "2m5", type = "choke", pins = ["feed", "gnd"] }
C2 = { c = "10n", pins = ["feed", "gnd"] }
R1 = { r = "10k", pins = ["out", "feed"] }
`
	r, log := reduceChecked(t, parse(t, src), Options{Level: LevelSignal})
	if r.Part("C1") == nil || r.Part("L1") == nil {
		t.Fatalf("the tank C1–L1 must stay:\n%s", logText(log))
	}
	if !strings.Contains(logText(log), "resonates at 1.001 MHz") {
		t.Errorf("the near miss should give the resonance (1000.6 kHz):\n%s", logText(log))
	}
	if r.Part("C2") != nil || r.Part("L2") != nil {
		t.Errorf("C2 decouples the feed (f0 = 31.8 kHz, far below the band): C2 and L2 should go\n%s", logText(log))
	}
}

// A declared signal input or output is never grounded, however big the
// capacitor on it.
func TestBypassNeverGroundsAnEnd(t *testing.T) {
	src := gridNet("20..20k", "1k", "1000u", `["x", "gnd"]`, "")
	src = strings.Replace(src, `outputs = ["out"]`, `outputs = ["out", "x"]`, 1)
	r, log := reduceChecked(t, parse(t, src), Options{Level: LevelSignal})
	if r.Part("C1") == nil || r.Net("x") == nil {
		t.Fatalf("x is a declared output and must keep its capacitor:\n%s", logText(log))
	}
}

// keep = true protects a capacitor from every rule.
func TestBypassKeep(t *testing.T) {
	src := strings.Replace(gridNet("100..20k", "1k", "25u", `["x", "gnd"]`, ""), `c = "25u", pins = ["x", "gnd"] }`, `c = "25u", pins = ["x", "gnd"], keep = true }`, 1)
	r, log := reduceChecked(t, parse(t, src), Options{Level: LevelSignal})
	if r.Part("C1") == nil {
		t.Fatalf("C1 is marked keep:\n%s", logText(log))
	}
}

// The ratio is an option: with 0.5 instead of 0.1, 63.662 Ω against 596 Ω passes.
func TestBypassRatioOption(t *testing.T) {
	src := gridNet("100..20k", "600", "25u", `["x", "gnd"]`, "")
	_, log := reduceChecked(t, parse(t, src), Options{Level: LevelSignal, BypassRatio: 0.5})
	if len(stepsOf(log, "bypass")) != 1 {
		t.Fatalf("with ratio 0.5 the bypass should fire:\n%s", logText(log))
	}
}

// A capacitor at the cold end of a tuned winding (the winding returned to a
// feed, an AGC line say, through a resistor, with the capacitor to chassis)
// is in series with the tank: the tuning capacitance goes from the hot end to
// chassis, so the tank's loop closes through it. At resonance the loop's
// reactances cancel and what is left is the coil's loss, R = ω0·L/Q
// (derived: ω0 = 2π·√(150 kHz × 285 kHz), 2.3 mH, Q 60: 49.799 Ω), so the
// capacitor's reactance at the band's low edge is judged against that, not
// against ωL (2.1677 kΩ at 150 kHz, which took 10 nF as a bypass and
// detuned the tank). Xc = 1/(2πfC) at 150 kHz (derived): 10 nF 106.10 Ω,
// 200 nF 5.3052 Ω, 250 nF 4.2441 Ω, against 0.1 × 49.799 Ω ∥ 470 kΩ.
func TestBypassColdEndOfTank(t *testing.T) {
	cases := []struct {
		c       string
		grounds bool
		xc      string
	}{
		{"10n", false, "106.1 Ω"},
		{"200n", false, "5.3052 Ω"},
		{"250n", true, "4.2441 Ω"},
	}
	for _, tc := range cases {
		t.Run(tc.c, func(t *testing.T) {
			src := fmt.Sprintf(`
band = "150k..285k"
inputs = ["in"]
outputs = ["out"]
[nets]
ht = { role = "supply", volts = 250 }
[parts]
C9 = { c = "10p", pins = ["in", "hot"] }
L1 = { windings = { s = "2m3" }, q = 60, pins = { s1 = "hot", s2 = "cold" } }
VC1 = { c = "12p..365p", pins = ["hot", "gnd"] }
R1 = { r = "470k", pins = ["cold", "gnd"] }
C1 = { c = %q, pins = ["cold", "gnd"] }
V1 = { valve = "triode", pins = { a = "out", g1 = "hot", k = "gnd" }, gm = "2mA/V", ra = "10k" }
R2 = { r = "47k", pins = ["out", "ht"] }
`, tc.c)
			_, log := reduceChecked(t, parse(t, src), Options{Level: LevelSignal})
			text := logText(log)
			var fired bool
			for _, s := range stepsOf(log, "bypass") {
				fired = fired || strings.Contains(s.Why, "C1 ")
			}
			if fired != tc.grounds {
				t.Fatalf("bypass of C1 = %v, want %v\n%s", fired, tc.grounds, text)
			}
			if !strings.Contains(text, tc.xc) || !strings.Contains(text, "loss R 49.799 Ω") {
				t.Errorf("the why should give |Xc| = %s against the loss R 49.799 Ω:\n%s", tc.xc, text)
			}
		})
	}
}
