package safety

import (
	"os"
	"path/filepath"
	"reflect"
	"testing"

	"pare/graph"
)

// A switch whose contacts all sit in the power feed is the set's on/off
// switch, not a band switch (common practice: the on/off switch on the
// volume control, an HT standby switch). Cases: the smallest circuits of
// each kind, and the AC/DC set of the blind review whose double-pole
// on/off switch S1 got a second "band" alignment (testdata/review20/
// a05.toml: pole 1 in the line feed, pole 2 tying the chassis to neutral).
func TestPowerSwitches(t *testing.T) {
	const head = "band = \"1k..10k\"\ninputs = [\"in\"]\noutputs = [\"out\"]\n"
	for _, tc := range []struct {
		name, text string
		want       []string
	}{
		{"acdc-double-pole", head + `[parts]
P1 = { port = "230 V mains in, line", pins = ["mains_l"] }
P2 = { port = "230 V mains in, neutral", pins = ["mains_n"] }
F1 = { part = "fuse 500 mA", pins = { a = "mains_l", b = "fused_l" } }
S1 = { switch = 2, set = 2, closes = ["", "c-1 d-2"], pins = { 1 = "sw_l", 2 = "gnd", c = "fused_l", d = "mains_n" } }
R1 = { r = "100R", pins = ["sw_l", "in"] }
C1 = { c = "10n", pins = ["in", "out"] }
R2 = { r = "10k", pins = ["out", "gnd"] }
`, []string{"S1"}},
		{"battery-ht-switch", head + `[nets]
ht = { role = "supply", volts = 90 }
[parts]
S1 = { switch = 2, set = 2, closes = ["", "c-1"], pins = { c = "ht", 1 = "ht_on" } }
R1 = { r = "10k", pins = ["ht_on", "out"] }
C1 = { c = "10n", pins = ["in", "out"] }
`, []string{"S1"}},
		{"band-switch", head + `[parts]
S1 = { switch = 2, set = 1, closes = ["c-1", "c-2"], pins = { c = "in", 1 = "l1", 2 = "l2" } }
L1 = { l = "230u", pins = ["l1", "gnd"] }
L2 = { l = "2m", pins = ["l2", "gnd"] }
C1 = { c = "10n", pins = ["in", "out"] }
R1 = { r = "10k", pins = ["out", "gnd"] }
`, nil},
		// On a live chassis tied to neutral, a tone switch to chassis is
		// still a signal switch: chassis is never counted as the feed.
		{"tone-switch-on-live-chassis", head + `[parts]
P1 = { port = "230 V mains in, line", pins = ["mains_l"] }
P2 = { port = "230 V mains in, neutral", pins = ["mains_n"] }
S1 = { switch = 2, set = 2, closes = ["", "c-1 d-2"], pins = { 1 = "sw_l", 2 = "gnd", c = "mains_l", d = "mains_n" } }
R1 = { r = "100R", pins = ["sw_l", "in"] }
C1 = { c = "10n", pins = ["in", "out"] }
S2 = { switch = 2, set = 1, closes = ["", "c-1"], pins = { c = "tone", 1 = "gnd" } }
C2 = { c = "10n", pins = ["out", "tone"] }
R2 = { r = "10k", pins = ["out", "gnd"] }
`, []string{"S1"}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			c, err := graph.Parse(tc.name+".toml", []byte(tc.text))
			if err != nil {
				t.Fatal(err)
			}
			if got := refs(PowerSwitches(c)); !reflect.DeepEqual(got, tc.want) {
				t.Errorf("power switches %v, want %v", got, tc.want)
			}
		})
	}
	path := filepath.Join(repo, "testdata", "review20", "a05.toml")
	text, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	c, err := graph.Parse(path, text)
	if err != nil {
		t.Fatal(err)
	}
	if got := refs(PowerSwitches(c)); !reflect.DeepEqual(got, []string{"S1"}) {
		t.Errorf("%s: power switches %v, want [S1]", path, got)
	}
}

// refs are a set's keys in the circuit-independent order of their names.
func refs(set map[string]bool) []string {
	var out []string
	for _, r := range []string{"S1", "S2", "S3"} {
		if set[r] {
			out = append(out, r)
		}
	}
	return out
}
