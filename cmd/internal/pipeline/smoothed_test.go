package pipeline

import (
	"os"
	"strings"
	"testing"

	"pare/graph"
)

// TestSmoothedLineNote: review 17's b05 (the circuit's own wiring) feeds
// its HT line ht from the reservoir ht_res through the smoothing resistor
// R22 and holds it with C31 (32 µF); declaring only the mains side left ht
// a signal net that no note mentioned. Common practice: a series R or L
// from the reservoir into a microfarad capacitor to chassis is the
// smoothed HT, a supply rail. A line with only a nanofarad bypass is not
// read as smoothed, and a declared line needs no note.
func TestSmoothedLineNote(t *testing.T) {
	b, err := os.ReadFile("../../../testdata/review17/b05.toml")
	if err != nil {
		t.Fatal(err)
	}
	src := string(b)
	for _, tc := range []struct {
		name, src, want string
	}{
		{"as captured", src, "ht looks like a supply rail: fed from the reservoir ht_res through R22 and smoothed by C31 (32 µF to chassis)"},
		{"only an RF bypass", strings.Replace(src, `C31 = { c = "32u", type = "electrolytic", pins = ["ht", "gnd"]`, `C31 = { c = "32u", type = "electrolytic", pins = ["ht_res", "gnd"]`, 1), ""},
		{"declared", strings.Replace(src, "[nets]\n", "[nets]\nht = { role = \"supply\" }\n", 1), ""},
	} {
		t.Run(tc.name, func(t *testing.T) {
			c, err := graph.Parse("b05.toml", []byte(tc.src))
			if err != nil {
				t.Fatal(err)
			}
			got := strings.Join(smoothedLineNotes(c, "ht_res"), "\n")
			if tc.want == "" && got != "" || !strings.Contains(got, tc.want) {
				t.Errorf("notes %q, want %q", got, tc.want)
			}
		})
	}
}
