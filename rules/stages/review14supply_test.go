package stages

import (
	"slices"
	"strings"
	"testing"
)

// Review 14's mains amplifier (testdata/review14/a05.toml): R3/C4 take the
// smoothed HT (ht2) down to the line that leaves by P3 for the input
// stage. It is that stage's supply decoupler (common practice: a series
// resistor and a capacitor to chassis between two HT lines), never an "RC
// low-pass section" in the signal path, and the smoothing resistor R2 is
// the smoothing filter's, not the output stage's that draws on its line.
// The near misses keep the signal reading: the same section fed from V1's
// anode (a signal filter off its load) or with its line declared the
// set's output.
func TestReview14DecouplerFeedingAPort(t *testing.T) {
	cases := []struct {
		name      string
		repl      []string
		decoupler bool
	}{
		{"as captured", nil, true},
		{"battery-side port named otherwise", []string{`"HT to the input stage"`, `"line to the preamplifier board"`}, true},
		{"fed from the anode", []string{`pins = ["ht2", "ht3"], note = "input stage decoupling"`, `pins = ["out_a", "ht3"], note = "anode filter"`}, false},
		{"declared output", []string{`outputs = ["spk"]`, `outputs = ["spk", "ht3"]`}, false},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			stages := findBiased(t, reviewCircuit(t, "review14", "a05.toml", tc.repl...))
			var dec *Stage
			for i := range stages {
				s := &stages[i]
				if slices.Contains(s.Parts, "R3") && slices.Contains(s.Parts, "C4") && s.Supply {
					dec = s
				}
				if s.Topology == "rc-low-pass" && tc.decoupler {
					t.Errorf("%s %q %v: a supply decoupler named a signal section", s.Name, s.Title, s.Parts)
				}
			}
			if (dec != nil) != tc.decoupler {
				t.Fatalf("R3/C4 a supply stage: %v, want %v; found %s", dec != nil, tc.decoupler, topologies(stages))
			}
			if !tc.decoupler {
				return
			}
			if dec.Title != "Supply decoupling filter" || !slices.ContainsFunc(dec.Notes, func(n string) bool { return strings.Contains(n, "leaves the circuit by P3") }) {
				t.Errorf("%s %q notes %q: want a decoupler feeding P3", dec.Name, dec.Title, dec.Notes)
			}
			// the corner is the solver's on the circuit as it is; the
			// formula 1/(2π·22k·16µ) = 0.4521 Hz (docs/references.md §4)
			if f, ok := dec.Figures.Get("f_c"); !ok || f.Value < 0.4521*0.98 || f.Value > 0.4521*1.02 {
				t.Errorf("f_c %v (ok %v), formula 0.4521 Hz", f.Value, ok)
			}
			for _, s := range stages {
				if slices.Contains(s.Parts, "R2") && !s.Supply {
					t.Errorf("smoothing resistor R2 in signal stage %s %q %v", s.Name, s.Title, s.Parts)
				}
			}
		})
	}
}

// A phase-shift ladder fed from a collector reaches the supply only
// through the collector load: its sections are no chain of supply
// decouplers (the class fixtures named three "Supply decoupling filter"
// stages over the ladder of bjt-lowpass4-buffer.toml).
func TestLadderIsNoSupplyFilter(t *testing.T) {
	for _, name := range []string{"bjt-lowpass4-buffer.toml", "fet-lowpass3.toml", "valve-highpass4.toml"} {
		for _, s := range findBiased(t, reviewCircuit(t, "phase-shift", name)) {
			if s.Supply {
				t.Errorf("%s: %s %q %v named a supply stage", name, s.Name, s.Title, s.Parts)
			}
		}
	}
}
