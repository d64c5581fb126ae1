package pipeline

import (
	"path/filepath"
	"strings"
	"testing"

	"pare/rules"
)

// Notes speak of the electrodes of the devices the circuit has (common
// practice: a transistor has a base, a valve a grid). The blind review's
// transistor superhet (testdata/review20/b03.toml) read "the grid filters'
// capacitors" on its AGC filter; the club receiver (valves) keeps "grid".
func TestAGCFilterWordsFollowTheDevices(t *testing.T) {
	for _, tc := range []struct {
		path, want, not string
	}{
		{filepath.Join("..", "..", "..", "testdata", "review20", "b03.toml"), "the base filters' capacitors", "grid filters"},
		{filepath.Join("..", "..", "..", "examples", "club-receiver.toml"), "the grid filters' capacitors", "base filters"},
	} {
		t.Run(filepath.Base(tc.path), func(t *testing.T) {
			res, err := Run(Options{Path: tc.path, Level: rules.LevelSignal})
			if err != nil {
				t.Fatal(err)
			}
			var text strings.Builder
			for _, s := range res.Stages {
				for _, f := range s.Figures {
					text.WriteString(f.Why + "\n")
				}
			}
			if !strings.Contains(text.String(), tc.want) || strings.Contains(text.String(), tc.not) {
				t.Errorf("want %q and no %q in the stages' figures", tc.want, tc.not)
			}
		})
	}
}
