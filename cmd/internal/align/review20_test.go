package align_test

import (
	"path/filepath"
	"testing"

	"pare/cmd/internal/align"
)

// review20 is a fixture of the blind review of session 20's circuits.
func review20(name string) string {
	return filepath.Join("..", "..", "..", "testdata", "review20", name+".toml")
}

// TestPowerSwitchIsNoBand: a switch whose other position is the set
// switched off has no band to align (common practice). The review's AC/DC
// set (review20 a05: double-pole on/off switch S1, pole 2 tying chassis to
// neutral) got four more RF steps for "Band 1 (S1 at position 1)"; the
// club receiver's wavechange wafers (S1a–S1g) still give their second
// band and its mains switch S2 none.
func TestPowerSwitchIsNoBand(t *testing.T) {
	for _, tc := range []struct {
		path  string
		bands int
	}{
		{review20("a05"), 0},
		{example("club-receiver"), 1},
	} {
		t.Run(filepath.Base(tc.path), func(t *testing.T) {
			r, _ := build(t, tc.path)
			sets := align.BandSets(r.Circuit, r.Stages)
			if len(sets) != tc.bands {
				t.Errorf("band runs %v, want %d", sets, tc.bands)
			}
		})
	}
}
