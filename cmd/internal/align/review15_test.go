package align_test

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// Two signal-frequency tanks on one gang that part at the dial's top by
// more than their bandwidth are worth a warning before anyone aligns
// (review15 b02: the aerial circuit tops out at 1.582 MHz, the RF
// transformer at 1.721 MHz). The hint's trimmer setting is an estimate by
// the tank formula C ∝ 1/f² (f = 1/(2π√(LC)), handbook); set to it, the
// solver's tanks meet within their bandwidth and the warning goes.
func TestReview15SignalTanksPart(t *testing.T) {
	src := filepath.Join("..", "..", "..", "testdata", "review15", "b02.toml")
	text, err := os.ReadFile(src)
	if err != nil {
		t.Fatal(err)
	}
	trimmed := filepath.Join(t.TempDir(), "b02-trimmed.toml")
	const was = `TC2 = { c = "3p..30p", set = "10p"`
	if !strings.Contains(string(text), was) {
		t.Fatalf("%s no longer holds %s", src, was)
	}
	fixed := strings.Replace(string(text), was, `TC2 = { c = "3p..30p", set = "13.3p"`, 1)
	if err := os.WriteFile(trimmed, []byte(fixed), 0o644); err != nil {
		t.Fatal(err)
	}
	cases := []struct {
		path string
		want []string // empty: no parting warning
	}{
		{src, []string{"S2 (VC1a) tunes 500 kHz to 1.582 MHz", "S3.1 (VC1b) 504 kHz to 1.721 MHz", "139 kHz apart at the high end", "TC2 must go from 10 pF to about 13.3 pF (within its range"}},
		{trimmed, nil},
		{filepath.Join("..", "..", "..", "examples", "club-receiver.toml"), nil},
	}
	for _, tc := range cases {
		_, g := build(t, tc.path)
		var got string
		for _, w := range g.Warnings {
			if strings.Contains(w, "do not track") {
				got = w
			}
		}
		if len(tc.want) == 0 && got != "" {
			t.Errorf("%s: unexpected parting warning %q", filepath.Base(tc.path), got)
		}
		for _, w := range tc.want {
			if !strings.Contains(got, w) {
				t.Errorf("%s: parting warning %q lacks %q", filepath.Base(tc.path), got, w)
			}
		}
	}
}

// A pot whose wiper is strapped to an end (review15 b05's quiescent-current
// preset RV2) is an adjustment: an injection row that depends on it says
// so, and never calls its setting a knob's rotation on a log law; the
// volume control RV1 still is one (common practice).
func TestReview15PresetIsNoControl(t *testing.T) {
	_, g := build(t, filepath.Join("..", "..", "..", "testdata", "review15", "b05.toml"))
	seen := map[string]bool{}
	for _, in := range g.Inject {
		switch {
		case strings.Contains(in.Caveat, "RV2 with its wiper"):
			t.Errorf("row at %s calls the preset RV2 a control: %q", in.Net, in.Caveat)
		case strings.Contains(in.Caveat, "RV2 at 30 % of its track as captured (a preset"):
			seen["RV2"] = true
		}
		if strings.Contains(in.Caveat, "RV1 with its wiper at 50 %") && strings.Contains(in.Caveat, "log-law control") {
			seen["RV1"] = true
		}
	}
	if !seen["RV2"] || !seen["RV1"] {
		t.Errorf("rows naming the preset RV2 / the control RV1: %v, want both", seen)
	}
}
