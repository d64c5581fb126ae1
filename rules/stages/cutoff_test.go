package stages

import (
	"strings"
	"testing"
)

// TestCutOffAtRestFlagged: a device whose netlist states no working
// current takes its small-signal figures from the operating point, so one
// captured without its bias feed is figured at cut-off (review-bjt-if's
// IF transistor, its base returned only to an AGC line without volts: a
// gain of 1.7e-07) and the stage says so; one that states its current is
// figured at that and is not flagged here (pare dc warns on the current).
// A BJT at cut-off passes its leakage, femtoamps to picoamps (Ebers–Moll's
// saturation current; handbook device physics, from memory), far under the
// microamp threshold.
func TestCutOffAtRestFlagged(t *testing.T) {
	cases := []struct {
		dir, file, dev string
		flagged        bool
	}{
		{"good", "review-bjt-if.toml", "Q1", true},     // no ic, base on an AGC line without volts
		{"warn", "collector-no-dc.toml", "Q1", true},   // no ic, no DC path to its collector
		{"osc", "clapp-bjt.toml", "Q1", false},         // ic stated: figured at it
		{"good", "review17-battery.toml", "V4", false}, // ia and gm stated
	}
	for _, tc := range cases {
		_, sts := findFixture(t, tc.dir, tc.file)
		got := false
		for _, s := range sts {
			for _, f := range s.Flags {
				if strings.HasPrefix(f, tc.dev+" is cut off at rest") {
					got = true
				}
			}
		}
		if got != tc.flagged {
			t.Errorf("%s/%s: %s flagged cut off at rest %v, want %v", tc.dir, tc.file, tc.dev, got, tc.flagged)
		}
	}
}
