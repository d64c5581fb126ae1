package align_test

import (
	"math"
	"testing"
)

// TestFirstAudioRowAtItsFrequency: review20 a03's first audio row (a
// generator on V2b's grid, 400 Hz) gives the stage's gain on the whole
// circuit as captured, its cathode bypass C14 (25 µF beside R9 2k2, 15.9 Ω
// at 400 Hz) among it. ngspice-39 on the blind reviewer's own deck,
// testdata/review20/spice/a/c03.cir, with its source moved to the grid
// (Vin pre_g, `ac lin 3 300 500`), gives V(audio_out)/V(pre_g) 50.315 at
// 400 Hz; driven from the top of the volume control (vol_top) 50.316; with
// C14 made 25 F (a short) 50.338, so the bypass's reactance is worth
// 0.05 % and is in the solve. The review's 49.47 is the deck's ratio with
// its source left on the mixer anode (the IF input) and read at 400 Hz,
// where what reaches the grid also reaches the cathode through the supply
// and detector returns: another measurement, not a missing part
// (docs/references.md §45).
func TestFirstAudioRowAtItsFrequency(t *testing.T) {
	_, g := build(t, "../../../testdata/review20/a03.toml")
	found := false
	for _, in := range g.Inject {
		if in.Net != "pre_g" || in.GainTo != "audio_out" {
			continue
		}
		found = true
		if in.Freq != 400 {
			t.Errorf("row at %g Hz, want the trade's 400 Hz", in.Freq)
		}
		if want := 50.315; math.Abs(in.Gain-want) > 0.002*want { // ngspice-39, c03.cir driven at pre_g
			t.Errorf("gain %g, ngspice %g", in.Gain, want)
		}
	}
	if !found {
		t.Fatal("no row injecting at V2b's grid (pre_g) with its gain to audio_out")
	}
}
