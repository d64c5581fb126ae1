package rules

import (
	"fmt"
	"strings"
	"testing"
)

// A 2.5 mH choke from a net to AC ground: XL at 530 kHz = 2π·530k·2.5m =
// 8325.2 Ω (derived from XL = 2πfL). Against 470 Ω it is more than ten times
// larger and opens; against 1 kΩ it is not, and stays at signal level but
// opens in the ideal view (8.3 kΩ ≥ 1 kΩ).
func chokeFixture(r string) string {
	return fmt.Sprintf(`
band = "530k..1.6M"
inputs = ["in"]
outputs = ["n"]
[parts]
C1 = { c = "1n", pins = ["in", "n"] }
L1 = { l = "2m5", type = "choke", pins = ["gnd", "n"] }
R1 = { r = %q, pins = ["n", "gnd"] }
`, r)
}

func TestRFChoke(t *testing.T) {
	cases := []struct {
		r      string
		level  Level
		opened bool
	}{
		{"470", LevelSignal, true},
		{"1k", LevelSignal, false},
		{"1k", LevelIdeal, true},
		{"10k", LevelIdeal, false},
		{"470", LevelTidy, false},
	}
	for _, tc := range cases {
		t.Run(tc.r+"/"+tc.level.String(), func(t *testing.T) {
			r, log := reduceChecked(t, parse(t, chokeFixture(tc.r)), Options{Level: tc.level})
			if (r.Part("L1") == nil) != tc.opened {
				t.Fatalf("choke opened = %v, want %v\n%s", r.Part("L1") == nil, tc.opened, logText(log))
			}
			if tc.level > LevelTidy && !strings.Contains(logText(log), "8.3252 kΩ") {
				t.Errorf("the log should show XL = 8.3252 kΩ:\n%s", logText(log))
			}
		})
	}
}

// A choke in series between two signal nets stays: it may carry audio or DC.
func TestSeriesChokeStays(t *testing.T) {
	src := `
band = "455k..485k"
inputs = ["in"]
outputs = ["out"]
[parts]
L1 = { l = "2m5", type = "choke", pins = ["in", "out"] }
R1 = { r = "100k", pins = ["out", "gnd"] }
`
	r, log := reduceChecked(t, parse(t, src), Options{Level: LevelIdeal})
	if r.Part("L1") == nil {
		t.Fatalf("series choke removed:\n%s", logText(log))
	}
	if !strings.Contains(logText(log), "in series between two signal nets") {
		t.Errorf("the near miss should say why:\n%s", logText(log))
	}
}
