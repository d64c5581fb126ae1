package stages

import (
	"math"
	"os"
	"strings"
	"testing"
)

// TestHalfWaveRipple: the ripple frequency follows the rectifier's wiring,
// not the count of a valve diode's pins. review17-acdc.toml rectifies the
// mains through one anode of V5 (its heater pins are no path): half-wave,
// so the ripple is at the mains' 50 Hz (handbook: one pulse per cycle) and
// the smoothing section's attenuation is the one at 50 Hz, checked by
// ngspice .ac on testdata/good/review17/acdc-smoothing.cir (25.545 dB at
// 50 Hz; 31.545 dB at 100 Hz, the 6 dB the full-wave reading gave away).
func TestHalfWaveRipple(t *testing.T) {
	_, st := reduceGood(t, "review17-acdc.toml")
	deck, err := os.ReadFile("../../testdata/good/review17/acdc-smoothing.cir")
	if err != nil {
		t.Fatal(err)
	}
	want := -20 * math.Log10(valueAt(t, string(deck), 50))
	found := false
	for _, s := range st {
		if !strings.Contains(" "+strings.Join(s.Parts, " ")+" ", " R15 ") {
			continue
		}
		found = true
		if got := fig(s.Figures, "f_ripple_hz"); got != 50 {
			t.Errorf("ripple at %g Hz, want 50 Hz (half-wave on 50 Hz mains)", got)
		}
		if got := fig(s.Figures, "atten_ripple_db"); math.Abs(got-want) > 0.1 {
			t.Errorf("attenuation at the ripple %.3f dB, ngspice %.3f dB at 50 Hz", got, want)
		}
		if notes := strings.Join(s.Notes, " "); !strings.Contains(notes, "half-wave rectifier V5") {
			t.Errorf("notes %q do not name the half-wave rectifier V5", notes)
		}
	}
	if !found {
		t.Fatal("no smoothing stage holding R15")
	}
}
