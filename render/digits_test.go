package render

import (
	"bytes"
	"regexp"
	"strings"
	"testing"

	"pare/graph"
)

// digitsSheet carries numbers with more digits than a sheet shows: a band,
// a region, a named frequency, a rail voltage, a coupling factor and
// electrode voltages (invented values).
const digitsSheet = `title = "digits"
band = "33.86..20.04k"
inputs = ["in"]
outputs = ["s"]

[freqs]
if = "472.35k"

[regions]
audio = { band = "33.86..15.55k", parts = ["V1"] }

[nets]
ht = { role = "supply", volts = 233.46 }

[parts]
C1 = { c = "22.37n", pins = ["in", "g"] }
R1 = { r = "1.234M", pins = ["g", "gnd"] }
R3 = { r = "1k5", pins = ["k", "gnd"] }
T1 = { windings = { p = "10.07", s = "0.1234" }, k = 0.98765, pins = { p1 = "ht", p2 = "a", s1 = "s", s2 = "gnd" } }
V1 = { valve = "triode", mu = 100, ra = "62k5", pins = { a = "a", g1 = "g", k = "k" } }
`

// decimal is a number written with a decimal point.
var decimal = regexp.MustCompile(`[0-9]+\.[0-9]+`)

// significant counts a decimal's significant digits: leading zeros do not
// count, trailing ones do.
func significant(s string) int {
	s = strings.TrimLeft(strings.ReplaceAll(s, ".", ""), "0")
	return len(s)
}

// TestSheetNumbersThreeFigures: every number a sheet writes (part values,
// rail tags, coupling factors, the band, regions and named frequencies in
// the furniture, electrode voltages) carries at most three significant
// figures, as a part's marking does (IEC 60062 gives values three figures;
// graph/figure's Sheet medium is the one formatter that does it). "33.86
// Hz" on a sheet is the complaint this answers.
func TestSheetNumbersThreeFigures(t *testing.T) {
	c, err := graph.Parse("digits.toml", []byte(digitsSheet))
	if err != nil {
		t.Fatal(err)
	}
	c.JoinNets(c.GroundNet(), "ht") // the rail tied to AC ground: a rail tag
	for _, v := range []View{Reduced, Full} {
		s := &Sheet{Circuit: c, View: v, Furniture: []string{"Region audio: 33.9 Hz–15.6 kHz"},
			PinVolts: map[string]map[string]string{"V1": {"a": "233", "k": "1.57"}}}
		var b bytes.Buffer
		if err := (Config{}).Fprint(&b, s); err != nil {
			t.Fatal(err)
		}
		svg := b.String()
		for _, m := range regexp.MustCompile(`>([^<]*)<`).FindAllStringSubmatch(svg, -1) {
			for _, d := range decimal.FindAllString(m[1], -1) {
				if significant(d) > 3 {
					t.Errorf("%s: %q writes %s with %d significant figures", v, m[1], d, significant(d))
				}
			}
		}
		for _, want := range []string{"33.9 Hz", "k=0.988", "233 V"} {
			if !strings.Contains(svg, want) {
				t.Errorf("%s: the sheet does not write %q", v, want)
			}
		}
	}
}
