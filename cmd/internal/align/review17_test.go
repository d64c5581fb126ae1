package align_test

import (
	"path/filepath"
	"strings"
	"testing"
)

// An aerial coil fed from the aerial through an isolating capacitor (an
// AC/DC set keeps its live chassis off the aerial so) tunes the aerial
// circuit: in a set with no RF stage its trimmer is the aerial trimmer
// (common practice). The circuit is review 17's AC/DC set, copied under
// rules/stages/testdata/review17.
func TestReview17AerialTrimmerThroughIsolatingCapacitor(t *testing.T) {
	_, g := build(t, filepath.Join("..", "..", "..", "rules", "stages", "testdata", "review17", "acdc-superhet.toml"))
	var whats []string
	for _, s := range g.Steps {
		if s.Part == "TC1" {
			whats = append(whats, s.What)
		}
	}
	if len(whats) != 1 || whats[0] != "aerial trimmer TC1" {
		t.Errorf("TC1 steps %q, want one \"aerial trimmer TC1\"", whats)
	}
	for _, r := range g.Repeat {
		if strings.Contains(r, "RF trimmer") {
			t.Errorf("repeat line calls the aerial trimmer an RF trimmer: %q", r)
		}
	}
}
