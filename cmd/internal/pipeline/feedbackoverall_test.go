package pipeline

import (
	"math"
	"path/filepath"
	"slices"
	"testing"

	"pare/rules"
)

// TestOverallFeedbackNamed: overall feedback into a stage that a pattern
// without the feedback names (review 21's b05: R24 from the speaker to the
// top of the driver's split emitter lead, R18 unbypassed over R19 with
// C21; the driver is named by its transformer) is a stage of its own,
// "overall negative feedback", confirmed by the loop. Check value: the
// closed-loop gain V(spk)/V(q5_b), from the reviewer's ngspice deck
// testdata/review21/spice/b/c05.cir at 1 kHz: ga_1k − g4_1k = 59.08 −
// 33.28 dB = 25.80 dB, ×19.5 (RESULTS.md); pare solves at the band's
// geometric mean, 632 Hz, where the coupling capacitors' loss is small
// (2 %). Where the stage's own pattern holds the feedback (review 21's
// a04, R4 into V1a's cathode with its anode load) it stays there.
func TestOverallFeedbackNamed(t *testing.T) {
	for _, tc := range []struct {
		file, part, topology string
		closed               float64 // 0: not checked
	}{
		{"b05.toml", "R24", "feedback-overall", 19.5},
		{"a04.toml", "R4", "amp-common-feedback", 0},
	} {
		t.Run(tc.file, func(t *testing.T) {
			res, err := Run(Options{Path: filepath.Join("..", "..", "..", "testdata", "review21", tc.file), Level: rules.LevelSignal, Until: PhaseStages})
			if err != nil {
				t.Fatal(err)
			}
			for _, s := range res.Stages {
				if !slices.Contains(s.Parts, tc.part) {
					continue
				}
				if s.Topology != tc.topology {
					t.Fatalf("%s in %s %q, want %s", tc.part, s.Name, s.Topology, tc.topology)
				}
				nfb, ok := s.Figures.Get("nfb")
				if !ok || nfb.Value <= 0 {
					t.Errorf("%s: no feedback the loop confirms: %v", s.Name, s.Figures)
				}
				if tc.closed == 0 {
					return
				}
				g, ok := s.Figures.Get("gain_closed_loop")
				if !ok || math.Abs(math.Abs(g.Value)/tc.closed-1) > 0.02 {
					t.Errorf("%s closed-loop gain %.4g, ngspice %.3g", s.Name, g.Value, tc.closed)
				}
				return
			}
			t.Fatalf("no stage holds %s", tc.part)
		})
	}
}
