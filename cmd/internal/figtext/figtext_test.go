package figtext

import "testing"

// The figure line a person reads: the tracking error with where it peaks as
// one item, the three exact-tracking points as one item, trade words for
// the IF; ranges joined; JSON keys untouched (they are the map's keys).
func TestFigureLine(t *testing.T) {
	cases := []struct {
		figs map[string]float64
		want string
	}{
		{map[string]float64{"track_err_max_hz": -7708, "track_err_at_hz": 1.6e6},
			"track err max -7.708 kHz at 1.6 MHz"},
		{map[string]float64{"track_f1_hz": 591.7e3, "track_f2_hz": 1.053e6, "track_f3_hz": 1.509e6},
			"suggested 3-point design: exact at 591.7 kHz, 1.053 MHz and 1.509 MHz"},
		// the suggested design's parts join its points; the fitted set's points come first
		{map[string]float64{"track_f1_hz": 591.7e3, "track_f2_hz": 1.053e6, "track_f3_hz": 1.509e6,
			"pad_c_f": 366.6e-12, "pad_l_h": 130.8e-6, "pad_trim_f": 39.79e-12, "track_fit1_hz": 620.9e3, "track_fit2_hz": 905.6e3},
			"fitted set tracks exactly at 620.9 kHz and 905.6 kHz, suggested 3-point design: padder 366.6 pF, coil 130.8 µH, trimmer 39.79 pF, exact at 591.7 kHz, 1.053 MHz and 1.509 MHz"},
		{map[string]float64{"track_fit1_hz": 1.573e6}, "fitted set tracks exactly at 1.573 MHz"},
		{map[string]float64{"if_hz": 470e3, "ift_f_hz": 469.9e3}, "IF 470 kHz, IF transformer f 469.9 kHz"},
		{map[string]float64{"load_f_hz": 456.6e3}, "load tuned f 456.6 kHz"},
		{map[string]float64{"f_min_hz": 527.4e3, "f_max_hz": 1.6e6, "c_min_f": 43e-12, "c_max_f": 396e-12}, "f 527.4 kHz–1.6 MHz"},
		{map[string]float64{"f_c_unloaded_hz": 1591.5, "tau_s": 100e-6}, "f c (unloaded) 1.592 kHz, tau 100 µs"},
		// where the error peaks without the error says nothing: left out
		{map[string]float64{"track_err_at_hz": 1.6e6}, ""},
	}
	for _, tc := range cases {
		if got := Line(tc.figs); got != tc.want {
			t.Errorf("Line(%v) = %q, want %q", tc.figs, got, tc.want)
		}
	}
}

func TestFigureLabels(t *testing.T) {
	labels := []struct{ key, want string }{
		{"f_min_hz", "f min"}, {"gain", "gain"}, {"tau_s", "tau"}, {"q_loaded", "q loaded"}, {"_hz", " hz"},
	}
	for _, l := range labels {
		if got := Label(l.key); got != l.want {
			t.Errorf("Label(%q) = %q, want %q", l.key, got, l.want)
		}
	}
}
