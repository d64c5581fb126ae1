package dc

import (
	"strings"
	"testing"
)

// TestStoppedOscillatorCurrent: the chart is figured with the oscillators
// stopped, and a valve biased by its own grid current (grid leak and grid
// capacitor) draws more anode current stopped than running (common
// practice). review19 a01's Hartley reads 6.69 mA against its declared
// 4 mA; the warning sent the repairer to "check the bias network". It now
// says the reading is the stopped one and what a running set should show.
func TestStoppedOscillatorCurrent(t *testing.T) {
	_, ch := chartFile(t, "../../testdata/review19/a01.toml")
	found := false
	for _, w := range ch.Warnings {
		if strings.HasPrefix(w, "V1 anode current") {
			found = true
			if !strings.Contains(w, "with the oscillator stopped") || strings.Contains(w, "check the bias network") {
				t.Errorf("warning %q: want it worded as the stopped oscillator's reading", w)
			}
		}
	}
	if !found {
		t.Errorf("no anode-current warning on V1 (solves well above its declared ia): %q", ch.Warnings)
	}
}
