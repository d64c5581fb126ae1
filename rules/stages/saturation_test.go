package stages

import (
	"strings"
	"testing"
)

// A stage whose transistor rests at or near saturation says its figures
// rest on that point: review19 b01's oscillator (Vce 0.45 V, its base
// 0.2 V above its collector; ngspice-39 .op agrees, graph/dc
// TestSaturationReview19) still reads a loop margin of some +11 dB, a
// linear model's at that point, and the flag says the margin rests on it.
// A phase-shift oscillator biased in its active region (testdata/osc) and
// review17 b01's are not flagged.
func TestSaturationFlagged(t *testing.T) {
	cases := []struct {
		dir, file, dev string
		want           string // the flag's words; "" none
	}{
		{"review19", "b01.toml", "Q1", "Q1 rests near saturation (Vce 450 mV"},
		{"osc", "phase-shift-bjt.toml", "Q1", ""},
		{"review17", "b01.toml", "Q1", ""},
	}
	for _, tc := range cases {
		_, sts := findFixture(t, tc.dir, tc.file)
		var got string
		for _, s := range sts {
			for _, f := range s.Flags {
				if strings.HasPrefix(f, tc.dev+" rests ") {
					got = f
				}
			}
		}
		switch {
		case tc.want == "" && got != "":
			t.Errorf("%s/%s flagged: %s", tc.dir, tc.file, got)
		case tc.want != "" && (!strings.HasPrefix(got, tc.want) || !strings.Contains(got, "the loop margin rests on that point")):
			t.Errorf("%s/%s: flag %q, want %q… and the loop margin resting on it", tc.dir, tc.file, got, tc.want)
		}
	}
}
