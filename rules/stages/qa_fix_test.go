package stages

import (
	"math"
	"slices"
	"testing"
)

// stageWith is the stage that holds part ref, nil when none does.
func stageWith(stages []Stage, ref string) *Stage {
	for i := range stages {
		if slices.Contains(stages[i].Parts, ref) && len(stages[i].Contains) == 0 {
			return &stages[i]
		}
	}
	return nil
}

// A coupling capacitor with a resistor to AC ground on both sides has its
// corner against the resistor it feeds (downstream, away from the driving
// electrode), never against the source's resistor: f = 1/(2πRC)
// (reference-values §4).
func TestCouplingCornerUsesLoadSide(t *testing.T) {
	for _, c := range []struct {
		file, cap, load, source string
		r, c                    float64
	}{
		// FET source follower: R2 1k source resistor, C4 10n, R3 10k load.
		{"fet-colpitts-vfo.toml", "C4", "R3", "R2", 10e3, 10e-9},
		// Triode detector: R2 47k anode load, C3 10n, R3 470k grid leak.
		{"grid-leak-reaction.toml", "C3", "R3", "R2", 470e3, 10e-9},
	} {
		t.Run(c.file, func(t *testing.T) {
			_, st := reduceFixture(t, c.file)
			s := stageWith(st, c.cap)
			if s == nil {
				t.Fatalf("%s is in no stage: %s", c.cap, topologies(st))
			}
			if !slices.Contains(s.Parts, c.load) {
				t.Errorf("%s: stage %s %v lacks the load %s", c.cap, s.Topology, s.Parts, c.load)
			}
			tau := c.r * c.c              // τ = RC
			fc := 1 / (2 * math.Pi * tau) // derived from f = 1/(2πRC)
			if got := s.Figures["tau_s"]; math.Abs(got-tau) > 1e-3*tau {
				t.Errorf("%s: tau %g s, want %g s (%s·%s, not the source's %s)", c.cap, got, tau, c.load, c.cap, c.source)
			}
			if got := s.Figures["f_c_hz"]; math.Abs(got-fc) > 1e-3*fc {
				t.Errorf("%s: f c %g Hz, want %g Hz", c.cap, got, fc)
			}
		})
	}
}
