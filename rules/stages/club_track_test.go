package stages

import (
	"math"
	"strings"
	"testing"
)

// The club receiver's gang has three sections (aerial, RF, oscillator),
// each reached through a wafer of the wavechange switch. Its tracking is
// paired through the closed contacts (a closed contact is a wire) and
// measured against the RF tank, the one that feeds the mixer. Check
// values: ngspice on testdata/club-track/mw_track.cir (the set's MW front
// end by hand): (osc − 470 kHz) − RF tank peak is −27.4 kHz at gang 80 pF
// and −33.4 kHz at 150 pF, the worst of the settings it samples. The error
// exceeds half the RF tank's loaded bandwidth, so a flag must say so
// (common practice: the station must lie inside the tank's −3 dB band).
func TestClubReceiverTracksThroughWavechange(t *testing.T) {
	full, reduced, log := reduceExample(t, "club-receiver.toml")
	st := find(t, reduced, Options{Full: full, ACGround: log.ACGround})
	mix := stageOf(st, "self-oscillating-mixer")
	if mix == nil {
		t.Fatalf("no self-oscillating mixer: %s", topologies(st))
	}
	e, ok := mix.Figures.Get("track_err_max")
	if !ok {
		t.Fatalf("no tracking figure: the gang's sections were not paired through the switch (figures %v)", mix.Figures)
	}
	// ngspice mw_track.cir: −33.4 kHz worst of its samples; pare walks 33
	// settings, so its worst may lie a little beyond: 1.5 kHz allowed.
	if math.Abs(e.Value-(-33.4e3)) > 1.5e3 {
		t.Errorf("track_err_max = %.0f Hz, want −33.4 kHz ± 1.5 kHz (ngspice mw_track.cir)", e.Value)
	}
	bw, ok := mix.Figures.Get("track_bw")
	if !ok || bw.Value <= 0 || math.Abs(e.Value) < bw.Value/2 {
		t.Fatalf("track_bw = %v (ok %v): want a bandwidth below twice the error", bw.Value, ok)
	}
	flagged := false
	for _, f := range mix.Flags {
		if strings.Contains(f, "tracking is off") && strings.Contains(f, "loaded bandwidth") {
			flagged = true
		}
	}
	if !flagged {
		t.Errorf("mistracking of %.0f Hz against a %.0f Hz tank not flagged: %v", e.Value, bw.Value, mix.Flags)
	}
}
