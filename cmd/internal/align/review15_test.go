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
		// review17 b02's trimmer is already at its top: the range comes
		// before the verdict (its reviewer read the old order as garbled)
		{filepath.Join("..", "..", "..", "testdata", "review17", "b02.toml"), []string{"TC2 must go from 30 pF to about 32.7 pF (beyond its range of 3 pF to 30 pF, so the coil or the gang section is suspect;"}},
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
// preset RV2) may be a preset or a control (a tone control is wired so
// too): an injection row that moves with it says the netlist does not tell
// which, and never calls its setting a knob's rotation on a log law;
// captured with type = "preset" it is an adjustment to set first. The
// volume control RV1, a divider, stays a control (common practice).
func TestReview15PresetIsNoControl(t *testing.T) {
	src := filepath.Join("..", "..", "..", "testdata", "review15", "b05.toml")
	text, err := os.ReadFile(src)
	if err != nil {
		t.Fatal(err)
	}
	const was = `RV2 = { pot = "100R", set = 0.3,`
	if !strings.Contains(string(text), was) {
		t.Fatalf("%s no longer holds %s", src, was)
	}
	preset := filepath.Join(t.TempDir(), "b05-preset.toml")
	if err := os.WriteFile(preset, []byte(strings.Replace(string(text), was, was+` type = "preset",`, 1)), 0o644); err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct{ path, want string }{
		{src, "RV2 at 30 % of its track as captured (wired as a variable resistor, its wiper strapped to an end; the netlist does not say"},
		{preset, "RV2 at 30 % of its track as captured (a preset, set on the bench and left"},
	} {
		_, g := build(t, tc.path)
		seen := map[string]bool{}
		for _, in := range g.Inject {
			if strings.Contains(in.Caveat, "RV2 with its wiper") {
				t.Errorf("%s: row at %s calls RV2 a control: %q", filepath.Base(tc.path), in.Net, in.Caveat)
			}
			seen["RV2"] = seen["RV2"] || strings.Contains(in.Caveat, tc.want)
			seen["RV1"] = seen["RV1"] || strings.Contains(in.Caveat, "RV1 with its wiper at 50 %") && strings.Contains(in.Caveat, "log-law control")
		}
		if !seen["RV2"] || !seen["RV1"] {
			t.Errorf("%s: rows naming RV2 as %q / the control RV1: %v, want both", filepath.Base(tc.path), tc.want, seen)
		}
	}
}
