package pipeline

import (
	"path/filepath"
	"strings"
	"testing"

	"pare/rules"
)

// A base-bias resistor from a decoupled supply line is a bias feed, not
// overall shunt feedback: review21 b05's R16 (47k from the driver's line
// vcc_drv, decoupled by C25 100 µF) had been titled "Overall shunt
// feedback into the base" because the line carries a trace of the driver's
// signal in antiphase. The solver puts the line at 0.05 % of the driver's
// collector signal; a feedback point carries most of it (rules/stages
// minFeedbackShare). The variant is another set of the same class
// (preamplifier, driver transformer with a top cut, both bias feeds from
// one decoupled line). Run as the main job runs, with the full circuit.
func TestBiasFeedFromDecoupledLineIsNoFeedback(t *testing.T) {
	for _, tc := range []struct{ path, bias string }{
		{filepath.Join("..", "..", "..", "testdata", "review21", "b05.toml"), "R16"},
		{filepath.Join("..", "..", "..", "testdata", "feedback", "shunt-bias-decoupled.toml"), "R6"},
	} {
		t.Run(filepath.Base(tc.path), func(t *testing.T) {
			res, err := Run(Options{Path: tc.path, Level: rules.LevelSignal})
			if err != nil {
				t.Fatal(err)
			}
			for _, s := range res.Stages {
				if strings.HasPrefix(s.Topology, "amp-shunt-feedback") {
					t.Errorf("%s named %q with %v: a bias feed from an AC-grounded line", s.Name, s.Title, s.Parts)
				}
			}
		})
	}
}
