package stages

import (
	"math"
	"testing"
)

// Figures taken with the wrong source or load (review16's blind review):
// each corner is the solver's on the side the signal really leaves by,
// and ngspice on a deck of the same small-signal circuit gives the value
// beside it (decks in testdata/review16/spice/b/, named per row; ngspice
// 42, Debian). Before: b03's decoupler 315.7 Hz (the mixer's collector
// held at 0 V), b04's C14 48.54 kHz into 3.28 Ω (the loudspeaker taken as
// its load), b04's C9 paired with the DC feedback resistor R11a on its own
// driven side (4.258 Hz beside a formula of 19.41 mHz).
func TestCornersOnTheirRealLoad(t *testing.T) {
	cases := []struct {
		file, part string
		topology   string
		fc         float64 // ngspice, Hz
		deck       string
	}{
		// R10 into C13, C14, the IF rail's loads as drawn, mix_c open, the
		// AGC line free (held at AC ground: 7.637 Hz)
		{"b03.toml", "R10", "supply-filter-section", 8.119, "c03_dec_open.cir"},
		// C14 from the loudspeaker into R14 and the driver's base
		{"b04.toml", "C14", "coupling-capacitor", 3.267, "c04_c14.cir"},
		// C9 from the midpoint into the loudspeaker and Zobel
		{"b04.toml", "C9", "speaker-coupling", 19.89, "c04_c9.cir"},
	}
	for _, tc := range cases {
		t.Run(tc.file+"/"+tc.part, func(t *testing.T) {
			_, st := findFixture(t, "review16", tc.file)
			s := holding(st, tc.part)
			if s == nil || s.Topology != tc.topology {
				t.Fatalf("%s not in a %s: %s", tc.part, tc.topology, topologies(st))
			}
			f, ok := s.Figures.Get("f_c")
			if !ok {
				t.Fatalf("%s: no f_c: %v", s.Name, s.Figures)
			}
			// 1 %: the decks take the reviewer's device values, pare its own
			// DC point (within 0.1 % of each other)
			if math.Abs(f.Value-tc.fc) > 0.01*tc.fc {
				t.Errorf("%s f_c %.4g Hz, ngspice (%s) %.4g Hz", s.Name, f.Value, tc.deck, tc.fc)
			}
		})
	}
}

// An RC pair whose resistor has a winding across it is that winding's
// load, and its capacitor holds the winding's cold end at AC ground: the
// signal never runs through the resistor into the capacitor, so it is no
// "RC low-pass section" (review16 b02: R5, C7 on T2's link to the mixer).
// Behaviour, not a formula: ngspice on testdata/review16/spice/b/c02_ac.cir
// carries the link's signal to mix_b with mix_bias at 22 nF to chassis.
func TestNoLowPassAcrossAWinding(t *testing.T) {
	_, st := findFixture(t, "review16", "b02.toml")
	for _, ref := range []string{"R5", "C7"} {
		if s := holding(st, ref); s != nil && (s.Topology == "rc-low-pass" || s.Topology == "rc-low-pass-bypassed-return") {
			t.Errorf("%s named %q: %s", ref, s.Title, topologies(st))
		}
	}
}
