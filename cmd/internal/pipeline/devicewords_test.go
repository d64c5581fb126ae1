package pipeline

import (
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"pare/graph"
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

// A power switch's line in the information block says on or off, a band
// switch's its position (common practice: the on/off switch has no
// position a technician would set for a band; review20 a05's legend read
// "Switch S1 at position 2 of 2" for the mains switch).
func TestSwitchLines(t *testing.T) {
	const mains = `band = "1k..10k"
inputs = ["in"]
outputs = ["out"]
[parts]
P1 = { port = "230 V mains in, line", pins = ["mains_l"] }
P2 = { port = "230 V mains in, neutral", pins = ["mains_n"] }
R1 = { r = "100R", pins = ["sw_l", "in"] }
C1 = { c = "10n", pins = ["in", "out"] }
R2 = { r = "10k", pins = ["out", "gnd"] }
`
	const band = `band = "1k..10k"
inputs = ["in"]
outputs = ["out"]
[parts]
L1 = { l = "230u", pins = ["l1", "gnd"] }
L2 = { l = "2m", pins = ["l2", "gnd"] }
C1 = { c = "10n", pins = ["in", "out"] }
R1 = { r = "10k", pins = ["out", "gnd"] }
`
	for _, tc := range []struct {
		name, text, want string
	}{
		{"mains on", mains + `S1 = { switch = 2, set = 2, closes = ["", "c-1 d-2"], pins = { 1 = "sw_l", 2 = "gnd", c = "mains_l", d = "mains_n" } }`, "On/off switch S1 on"},
		{"mains off", mains + `S1 = { switch = 2, set = 1, closes = ["", "c-1 d-2"], pins = { 1 = "sw_l", 2 = "gnd", c = "mains_l", d = "mains_n" } }`, "On/off switch S1 off"},
		{"band", band + `S1 = { switch = 2, set = 2, closes = ["c-1", "c-2"], pins = { c = "in", 1 = "l1", 2 = "l2" } }`, "Switch S1 at position 2 of 2"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			c, err := graph.Parse(tc.name+".toml", []byte(tc.text+"\n"))
			if err != nil {
				t.Fatal(err)
			}
			lines := Furniture(c, nil, rules.LevelSignal)
			if !slices.Contains(lines, tc.want) {
				t.Errorf("furniture %q lacks %q", lines, tc.want)
			}
		})
	}
}
