package stages

import (
	"math"
	"path/filepath"
	"strings"
	"testing"

	"pare/graph"
)

// A resistor from a later point of the signal path back to a control
// electrode fed through a coupling capacitor is overall shunt feedback,
// its own stage titled so: review15 b04's R1 (the output pair's midpoint
// to the driver's base) had been left to no stage and drawn inside the
// "RC coupling" frame. The solver's impedance into the base with the loop
// as wired is checked against Miller's theorem, Rf/(1 + |A|) in parallel
// with the rest (handbook, from memory; docs/references.md §38).
func TestShuntFeedbackThroughCouplingCapacitor(t *testing.T) {
	for _, tc := range []struct{ file, rf string }{
		{filepath.Join("feedback", "shunt-coupled.toml"), "R6"},
		{filepath.Join("review15", "b04.toml"), "R1"},
	} {
		t.Run(tc.file, func(t *testing.T) {
			c, err := graph.LoadFile(filepath.Join("..", "..", "testdata", tc.file))
			if err != nil {
				t.Fatal(err)
			}
			st := findReduced(t, c)
			s := holding(st, tc.rf)
			if s == nil || s.Topology != "amp-shunt-feedback-coupled" || !strings.Contains(s.Title, "feedback") {
				t.Fatalf("%s not a feedback stage: %s", tc.rf, topologies(st))
			}
			z, ok := s.Figures.Get("z_in_fb")
			if !ok || z.Check == nil {
				t.Fatalf("no Zin with feedback and its check: %v", s.Figures)
			}
			if d := math.Abs(z.Value-z.Check.Value) / z.Check.Value; d > 0.02 {
				t.Errorf("Zin %g Ω against Miller's %g Ω: %.1f %% off", z.Value, z.Check.Value, 100*d)
			}
			if n, ok := s.Figures.Get("nfb"); !ok || n.Value <= 0 {
				t.Errorf("no feedback in dB: %v", s.Figures)
			}
		})
	}
}
