package dc

import (
	"math"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"
	"time"

	"pare/graph"
	"pare/internal/reftool"
)

// acdcWithIH is the blind review's AC/DC set with the heater current its
// note states (0.1 A, the chain's rated current) declared on every valve
// whose heater is in the chain, or on the valves listed.
func acdcWithIH(t *testing.T, ih map[string]string) *graph.Circuit {
	t.Helper()
	b, err := os.ReadFile("../../testdata/good/review17-acdc.toml")
	if err != nil {
		t.Fatal(err)
	}
	text := string(b)
	for ref, v := range ih {
		re := regexp.MustCompile(`(?m)^(` + ref + ` = \{ valve = .*) \}$`)
		text = re.ReplaceAllString(text, `${1}, ih = "`+v+`" }`)
	}
	c, err := graph.Parse("acdc.toml", []byte(text))
	if err != nil {
		t.Fatal(err)
	}
	return c
}

// TestHeaterChainDropper: a resistor in series with a heater chain carries
// the heaters' AC, which the DC solve never sees; its dissipation is
// I_rms²·R with I the heaters' rated current (handbook P = I²R; the
// heaters are resistive, so the current is a sine of that RMS). The
// AC/DC set's dropper R16 (1k) at 0.1 A: 10 W, as ngspice's transient on
// testdata/good/review17/acdc-psu.cir gives (10.000 W, TestACDCSupplyAgainstNgspice).
// Without ih the chart says why it has no figure; valves that disagree
// on ih leave it unknown too; a resistor on no heater gets the solve's.
func TestHeaterChainDropper(t *testing.T) {
	for _, tc := range []struct {
		name  string
		ih    map[string]string
		watts float64
		note  string
	}{
		{"ih on every valve", map[string]string{"V1": "100mA", "V2": "100mA", "V3b": "100mA", "V4": "100mA", "V5": "100mA"}, 10, "0.1 A RMS"},
		{"ih on one valve of the chain", map[string]string{"V2": "100mA"}, 10, "ih of V2"},
		{"no ih", nil, 0, "give the valves' heater current ih"},
		{"ih differ", map[string]string{"V4": "100mA", "V5": "300mA"}, 0, "ih differ"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			pt, err := Solve(acdcWithIH(t, tc.ih))
			if err != nil {
				t.Fatal(err)
			}
			_, heat := chartHeat(t, pt)
			r16 := heat["R16"]
			if math.Abs(r16.Watts-tc.watts) > 1e-9 || !strings.Contains(r16.Note, tc.note) {
				t.Errorf("R16 %g W, note %q; want %g W and %q", r16.Watts, r16.Note, tc.watts, tc.note)
			}
			if !strings.Contains(r16.Note, "V5, V4, V1, V2 and V3b") && tc.watts == 0 {
				t.Errorf("note %q does not name the chain's valves in order", r16.Note)
			}
			if r15 := heat["R15"]; r15.Note != "" || !(r15.Watts > 0) {
				t.Errorf("R15, on no heater, got %+v", r15)
			}
		})
	}
}

// TestACDCSupplyAgainstNgspice: the transient on acdc-psu.cir gives the
// half-wave rectifier's mean anode current equal to the load's DC and the
// dropper's I_rms²·R, the two figures pare's chart takes from the rail's
// draw and the heater current; both are compared with the chart's.
func TestACDCSupplyAgainstNgspice(t *testing.T) {
	bin := reftool.Find(t, reftool.Ngspice)
	path, err := filepath.Abs("../../testdata/good/review17/acdc-psu.cir")
	if err != nil {
		t.Fatal(err)
	}
	out := runNgspice(t, bin, t.TempDir(), path, 2*time.Minute).String()
	meas := map[string]float64{}
	for _, m := range regexp.MustCompile(`(?m)^(\w+)\s*=\s*(\S+)`).FindAllStringSubmatch(out, -1) {
		if v, err := strconv.ParseFloat(m[2], 64); err == nil {
			meas[m[1]] = v
		}
	}
	pt, err := Solve(acdcWithIH(t, map[string]string{"V5": "100mA"}))
	if err != nil {
		t.Fatal(err)
	}
	ch, err := pt.Chart(Meter{})
	if err != nil {
		t.Fatal(err)
	}
	found := 0
	for _, c := range ch.Currents {
		if c.Ref == "V5" {
			found++
		}
		if c.Ref == "V5" && math.Abs(c.Amps-meas["ianode"]) > 0.002*meas["ianode"] {
			t.Errorf("V5 mean anode %g A, ngspice %g A", c.Amps, meas["ianode"])
		}
	}
	for _, h := range ch.Resistors {
		if h.Ref == "R16" {
			found++
		}
		if h.Ref == "R16" && math.Abs(h.Watts-meas["pdropper"]) > 0.002*meas["pdropper"] {
			t.Errorf("R16 %g W, ngspice %g W", h.Watts, meas["pdropper"])
		}
	}
	if found != 2 || meas["ianode"] == 0 || meas["pdropper"] == 0 {
		t.Fatalf("chart rows found %d of 2; ngspice said:\n%s", found, out)
	}
}
