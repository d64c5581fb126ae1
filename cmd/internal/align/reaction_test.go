package align_test

import (
	"path/filepath"
	"testing"
)

// A self-oscillating converter whose oscillator feedback comes through a
// separate reaction winding (a heptode's oscillator anode, a transistor's
// collector) is a mixer to pare, so the procedure has its oscillator
// tracking steps: the trimmer at the high tracking point and the padder at
// the low one (common practice, docs/references.md §19), not "tracking
// steps not generated". The bench heptode (set D) is one too: its reaction
// winding is connected the wrong way round as captured, which the stage
// flags, and the tanks still track as they are.
func TestReactionWindingConverterTracks(t *testing.T) {
	cases := []struct{ path, trimmer, padder string }{
		{filepath.Join("..", "..", "..", "testdata", "osc", "mixer-heptode-reaction.toml"), "TC2", ""},
		{filepath.Join("..", "..", "..", "testdata", "osc", "mixer-bjt-reaction.toml"), "TC2", ""},
		{filepath.Join("..", "..", "..", "testdata", "good", "review-align-c4-heptode.toml"), "TC2", "TC3"},
	}
	for _, tc := range cases {
		t.Run(filepath.Base(tc.path), func(t *testing.T) {
			_, g := build(t, tc.path)
			if g.TrackNote != "" {
				t.Fatalf("tracking note %q: want steps", g.TrackNote)
			}
			seen := map[string]bool{}
			for _, s := range g.Steps {
				if s.Phase == "oscillator" {
					seen[s.Part] = true
				}
			}
			if !seen[tc.trimmer] || tc.padder != "" && !seen[tc.padder] {
				t.Errorf("oscillator steps turn %v, want %s and %q", seen, tc.trimmer, tc.padder)
			}
		})
	}
}
