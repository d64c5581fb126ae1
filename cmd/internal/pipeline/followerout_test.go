package pipeline

import (
	"math"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"pare/rules"
)

// A follower's output resistance is cross-checked by the formula of its
// own device: review22 b01's emitter follower Q2 had been checked by the
// valve's ra/(µ+1), 83.7 % off the solver. The emitter follower's
// (re + Rs/(β+1)) ∥ RE (handbook, from memory) counts what drives the
// base; a cathode follower (the near miss) keeps ra/(µ+1) ∥ Rk. Run as the
// main job runs, where the solver gives the figure the check sits beside.
func TestFollowerROutFormulaFitsDevice(t *testing.T) {
	for _, tc := range []struct {
		file, dev, formula string
		within             float64 // of the solver's figure: the formula leaves ro and capacitances out
	}{
		{filepath.Join("review22", "b01.toml"), "Q2", "(re + Rs/(β+1)) ∥ RE", 0.15},
		{filepath.Join("good", "review-vfo.toml"), "", "ra/(µ+1) ∥ Rk", math.Inf(1)},
	} {
		t.Run(tc.file, func(t *testing.T) {
			res, err := Run(Options{Path: filepath.Join("..", "..", "..", "testdata", tc.file), Level: rules.LevelSignal})
			if err != nil {
				t.Fatal(err)
			}
			n := 0
			for _, s := range res.Stages {
				if s.Topology != "amp-follower" || (tc.dev != "" && !slices.Contains(s.Parts, tc.dev)) {
					continue
				}
				r, ok := s.Figures.Get("r_out")
				if !ok || r.Check == nil {
					t.Fatalf("%s: no r_out with its check: %v", s.Name, s.Figures)
				}
				if !strings.Contains(r.Check.Origin.Name, tc.formula) {
					t.Errorf("%s: r_out checked by %q, want %q", s.Name, r.Check.Origin.Name, tc.formula)
				}
				if d := math.Abs(r.Value-r.Check.Value) / r.Value; d > tc.within {
					t.Errorf("%s: r_out %g Ω, formula %g Ω: %.1f %% off", s.Name, r.Value, r.Check.Value, 100*d)
				}
				n++
			}
			if n == 0 {
				t.Fatal("no follower found")
			}
		})
	}
}
