package rules

import (
	"fmt"
	"os"
	"strings"
	"testing"
)

// TestMergedNoteNeutral: a parallel merge keeps a note only when its
// members say the same thing. In review 17's b05 (the circuit's own
// wiring) seven resistors run from the smoothed HT line ht to nets the
// reduction puts at AC ground: a screen feed R3, the smoothing resistor
// R22, the bleeder R23, decouplers R9/R16/R20 and the IF screen feed R8.
// Common practice: those are different jobs, so the bundle may not carry
// R3's "heptode screen feed, about 90 V". Two halves of one anode load
// with the same note keep it; a member without a note says nothing
// against the other's.
func TestMergedNoteNeutral(t *testing.T) {
	b, err := os.ReadFile("../testdata/review17/b05.toml")
	if err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		name, src, ref, note string
	}{
		{"different jobs from the HT line", string(b), "R3", "%d resistors from ht to AC ground in parallel"},
		{"one job split in two", splitLoad(`, note = "anode load"`, `, note = "anode load"`), "R1", "anode load"},
		{"one member without a note", splitLoad(`, note = "anode load"`, ""), "R1", "anode load"},
		{"a gang section with its trimmer", string(b), "VC1a", "gang, aerial section"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			r, _ := reduceChecked(t, parse(t, tc.src), Options{Level: LevelSignal})
			p := r.Part(tc.ref)
			if p == nil {
				t.Fatalf("%s not on the reduced circuit", tc.ref)
			}
			want := tc.note
			if strings.Contains(want, "%d") {
				want = fmt.Sprintf(want, len(p.From))
			}
			if p.Note != want || len(p.From) < 2 {
				t.Errorf("%s (from %v) note %q, want %q", tc.ref, p.From, p.Note, want)
			}
		})
	}
}

// splitLoad is a common-cathode triode whose anode load is two 100 kΩ
// resistors in parallel, with the notes given.
func splitLoad(n1, n2 string) string {
	return `title = "split load"
inputs = ["in"]
outputs = ["a"]
band = "20..20k"
[nets]
gnd = { role = "ground" }
hv = { role = "supply", volts = 250 }
[parts]
V1 = { valve = "triode", pins = { a = "a", g1 = "in", k = "gnd" }, gm = "2mA/V", mu = 20 }
R1 = { r = "100k", pins = ["hv", "a"]` + n1 + ` }
R2 = { r = "100k", pins = ["hv", "a"]` + n2 + ` }
R3 = { r = "1M", pins = ["in", "gnd"] }
`
}
