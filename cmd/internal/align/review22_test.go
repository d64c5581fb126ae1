package align_test

import (
	"math"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"
)

func review22(name string) string {
	return filepath.Join("..", "..", "..", "testdata", "review22", name+".toml")
}

// A delayed AGC's line does not move with the low generator level the IF
// steps ask for, so the IF steps watch the output meter or the detector's
// DC, and say the carrier that passes the delay: review22 a03 (reviewer A:
// "the line does not move until the IF exceeds the 0.8 V delay") watched
// "the AGC line for its most negative reading". The carrier is the delay
// (the stage's DC figure) over √2 times the gain from the generator's net
// to the AGC diode with the diode off: ngspice ×298.76 at 470 kHz
// (testdata/review22/spice/a/c03_delay.cir, the reviewer's deck with the
// AGC diode's resistor Rd2 lifted), 0.5 %. review22 a05's AGC is not
// delayed: its steps still watch the AGC line.
func TestDelayedAGCWatchesTheOutput(t *testing.T) {
	for _, tc := range []struct {
		name    string
		delayed bool
	}{{"a03", true}, {"a05", false}} {
		t.Run(tc.name, func(t *testing.T) {
			r, g := build(t, review22(tc.name))
			if len(g.Steps) == 0 || g.Steps[0].Phase != "IF" {
				t.Fatalf("no IF step: %+v", g.Steps)
			}
			w := g.Steps[0].Watch
			if !tc.delayed {
				if !strings.HasPrefix(w, "watch the DC on the AGC line") {
					t.Errorf("plain AGC: %s", w)
				}
				return
			}
			if !strings.HasPrefix(w, "watch the output meter") || !strings.Contains(w, "not the AGC line (agc)") {
				t.Errorf("delayed AGC still watched on its line: %s", w)
			}
			var delay float64
			for _, st := range r.Stages {
				if f, ok := st.Figures.Get("delay"); ok && st.Topology == "agc-diode-delayed" {
					delay = f.Value
				}
			}
			m := regexp.MustCompile(`about ([0-9.]+) mV RMS of unmodulated carrier at mix_a`).FindStringSubmatch(w)
			if m == nil || delay == 0 {
				t.Fatalf("no carrier level (delay %g): %s", delay, w)
			}
			got, _ := strconv.ParseFloat(m[1], 64)
			want := delay / (math.Sqrt2 * 298.76) * 1e3
			if math.Abs(got-want) > 0.005*want+0.005 {
				t.Errorf("carrier %.3g mV, ngspice's gain gives %.3g mV", got, want)
			}
		})
	}
}
