package rules

import (
	"fmt"
	"strings"
	"testing"

	"pare/graph"
)

// smoothedLine is a two-valve audio amplifier whose HT2 line (not declared)
// is fed from the declared HT through a smoothing resistor R21 (1.2 kΩ) and
// held by C27: the first stage's anode load and the output pentode's screen
// stopper (100 Ω, the screen behind it) hang on it. cathode puts the first
// valve's cathode on a net of its own fed from HT through 100 kΩ and held
// by C27 instead (a cathode, never a supply line).
func smoothedLine(c27 string, cathode bool) string {
	k, line := "gnd", "ht2"
	if cathode {
		k, line = "k1", "k1"
	}
	return fmt.Sprintf(`
band = "50..10k"
inputs = ["in"]
outputs = ["out"]
[nets]
ht = { role = "supply", volts = 250, label = "HT +250 V" }
[parts]
R21 = { r = "1k2", pins = ["ht", "ht2"] }
C27 = { c = %q, pins = [%q, "gnd"] }
R5 = { r = "100k", pins = ["ht", "k1"] }
R6 = { r = "1k5", pins = ["k1", "gnd"] }
V1 = { valve = "triode", pins = { a = "a1", g1 = "in", k = %q }, gm = "1.2mA/V", mu = 70 }
R15 = { r = "220k", pins = ["ht2", "a1"] }
C22 = { c = "10n", pins = ["a1", "g2"] }
R16 = { r = "470k", pins = ["g2", "gnd"] }
V2 = { valve = "pentode", pins = { a = "out", g1 = "g2", g2 = "scr", g3 = "gnd", k = "gnd" }, gm = "9mA/V", ra = "20k" }
R19 = { r = "100R", pins = ["ht2", "scr"] }
R7 = { r = "3k", pins = ["ht", "out"] }
`, c27, line, k)
}

// TestSupplyLine: the smoothed line is a supply rail where its capacitor,
// not its feed, sets its impedance over the band; the bypass bound (which
// counts the feed and the screen stopper as what the capacitor must swamp)
// leaves it.
func TestSupplyLine(t *testing.T) {
	for _, tc := range []struct {
		name  string
		src   string
		fires bool
		why   string // in the step's or near miss's why; "" for no match at all
	}{
		// Xc = 1/(2πfC) (derived): 50 µF at 50 Hz = 63.662 Ω ≤ 0.5 × 1.2 kΩ;
		// the bypass bound is R21 ∥ R15 ∥ R19 ≈ 91.6 Ω, a tenth of which is below 63.7 Ω.
		{"50uF smoothing", smoothedLine("50u", false), true, "|Xc| at 50 Hz (the default band) = 63.662 Ω ≤ 0.5 × 1.2 kΩ"},
		// 4 µF at 50 Hz = 795.77 Ω (derived): above half the feed, within it: a near miss.
		{"4uF is a near miss", smoothedLine("4u", false), false, "795.77 Ω > 0.5 × 1.2 kΩ"},
		// 1 µF at 50 Hz = 3.1831 kΩ (derived), above the feed: no section at all.
		{"1uF is no section", smoothedLine("1u", false), false, ""},
		// a cathode fed from HT and held by 5 µF (636.62 Ω at 50 Hz, derived: no bypass
		// of the cathode by the bypass bound, yet below half its 100 kΩ feed) is the
		// cathode's, never a supply line
		{"a cathode is never a line", smoothedLine("5u", true), false, ""},
	} {
		t.Run(tc.name, func(t *testing.T) {
			r, log := reduceChecked(t, parse(t, tc.src), Options{Level: LevelSignal})
			steps := stepsOf(log, "supply-line")
			text := logText(log)
			if got := len(steps) == 1; got != tc.fires {
				t.Fatalf("supply-line fired = %v, want %v\n%s", got, tc.fires, text)
			}
			if tc.why != "" && !strings.Contains(text, tc.why) {
				t.Errorf("log does not say %q:\n%s", tc.why, text)
			}
			if !tc.fires {
				for _, d := range log.Declined {
					if d.Rule == "supply-line" && tc.why == "" {
						t.Errorf("near miss where no section was: %s", d.Why)
					}
				}
				return
			}
			if r.Part("C27") != nil || r.Part("R21") != nil {
				t.Errorf("the smoothing capacitor and its feed stay in the reduced circuit:\n%s", text)
			}
			// the feed is a supply part: never merged with what hangs on the line
			for _, p := range r.Parts {
				if o := p.Origins(); len(o) > 1 && strings.Contains(strings.Join(o, " "), "R21") {
					t.Errorf("%s merges the feed with %v", p.Ref, o)
				}
			}
			// the line is a rail of its own, named after its feed
			if n := reducedRailNamed(r.Rails, "ht2"); n == nil || n.Label != "HT via R21" {
				t.Errorf("ht2 is not kept as the rail 'HT via R21': %+v", n)
			}
		})
	}
}

func reducedRailNamed(rails []*graph.Net, name string) *graph.Net {
	for _, n := range rails {
		if n.Name == name {
			return n
		}
	}
	return nil
}
