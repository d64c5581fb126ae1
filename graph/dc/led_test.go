package dc

import (
	"math"
	"testing"
)

// TestIndicatorLED: review18 b01's power-on LED, captured as a generic
// part ("LED, red", pins a and k) behind R11 1 kΩ from the 9 V battery, is
// in the DC model with an LED's default law (vf 1.8 V at 1 mA, n 2; from
// memory), so the battery drain counts it. Check values: ngspice 39 .op of
// the reviewer's deck with that law (testdata/review18-b01-op.cir): battery
// 9.6073 mA, LED 7.0986 mA; before, pare read 2.52 mA (the LED left out);
// the reviewer's own LED law (Is 1e-20, n 2) gives 9.384 mA.
func TestIndicatorLED(t *testing.T) {
	pt, ch := chartFile(t, "../../testdata/review18/b01.toml")
	if len(ch.Rails) != 1 || math.Abs(ch.Rails[0].Amps-9.6073e-3) > 0.01*9.6073e-3 { // ngspice, above
		t.Errorf("rails %+v, want batt drawing 9.607 mA (ngspice)", ch.Rails)
	}
	if led := pt.Current("LED1", "a"); math.Abs(led-7.0986e-3) > 0.01*7.0986e-3 { // ngspice, above
		t.Errorf("LED1 carries %g A, ngspice 7.0986 mA", led)
	}
}
