package stages

import (
	"path/filepath"
	"testing"

	"pare/graph"
)

// TestFeedbackWithPhaseAdvance: an amplifier taking overall feedback into
// the unbypassed part of its cathode lead, with a phase-advance capacitor
// across the feedback resistor (review18 a04, a blind reviewer's push-pull
// amplifier: R6 3k3 with C3 220 pF from the speaker winding to V1a's
// cathode over R4 100 Ω, R5 bypassed by C2). Without the capacitor in the
// pattern the driver was an unnamed "V1a stage" and its cathode network an
// "RC low-pass section" with a formula corner. The phase-advance capacitor
// across the feedback resistor is the trade's usual stabiliser (common
// practice).
func TestFeedbackWithPhaseAdvance(t *testing.T) {
	_, sts := findFixture(t, "review18", "a04.toml")
	var amp *Stage
	for i := range sts {
		s := &sts[i]
		if s.Topology == "rc-low-pass" {
			t.Errorf("%s %s holds %v: a cathode lead named a filter", s.Name, s.Title, s.Parts)
		}
		if s.Topology == "amp-common-feedback" {
			amp = s
		}
	}
	if amp == nil {
		t.Fatal("V1a is not named an amplifier with overall feedback")
	}
	for _, want := range []string{"V1a", "R4", "R6", "C3"} {
		if !contains(amp.Parts, want) {
			t.Errorf("%s lacks %s: %v", amp.Name, want, amp.Parts)
		}
	}
}

// TestTurnedWindingOnTheOutput: a loop through the transformer that
// carries the set's output is an amplifier's overall feedback, worded as
// such when turned over; a loop through any other winding is an
// oscillator's reaction.
func TestTurnedWindingOnTheOutput(t *testing.T) {
	cases := []struct{ file, ref string }{
		{"review18/a04.toml", "T1"},                     // output transformer into LS1
		{"loops/superhet-reaction-reversed.toml", "T5"}, // T5 into the speaker; T2 the reaction coil is not
	}
	for _, tc := range cases {
		c, err := graph.LoadFile(filepath.Join("..", "..", "testdata", tc.file))
		if err != nil {
			t.Fatal(err)
		}
		for _, p := range c.Parts {
			if p.Kind != graph.Transformer {
				continue
			}
			if got := feedsOutput(c, p.Ref); got != (p.Ref == tc.ref) {
				t.Errorf("%s: feedsOutput(%s) = %v", tc.file, p.Ref, got)
			}
		}
	}
}
