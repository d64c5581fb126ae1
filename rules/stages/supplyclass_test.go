package stages

import (
	"math"
	"slices"
	"strings"
	"testing"

	"pare/graph/dc"
)

// The club receiver's supply filter sections, each read by its wiring: the
// choke section L3 behind the rectifier feeds every stage's line (the main
// smoothing filter: ripple figures, no one stage's frequency, C38 the
// reservoir); R4 feeds V1's anode alone (a decoupler: the attenuation at
// its stage's lowest frequency, C6 its decoupling capacitor); R3 feeds
// V1's screen straight (a screen feed: its DC drop and its bypass). Check
// values: X_C = 1/(2πfC) of C5 100 nF at the MW band's low end 530 kHz =
// 3.003 Ω (handbook formula), R3 33 kΩ to AC ground without it (netlist:
// the screen itself draws no signal current in the solver's pentode); the
// screen's DC voltage is the chart's (graph/dc, the same operating point
// `pare dc` prints).
func TestSupplyFilterClasses(t *testing.T) {
	full, reduced, log := reduceExample(t, "club-receiver.toml")
	op, err := dc.Solve(full)
	if err != nil {
		t.Fatal(err)
	}
	st := find(t, reduced, Options{Full: full, ACGround: log.ACGround, DC: op})
	// (the reservoir's ripple, 16.8 V p-p, is graph/dc's estimate, checked
	// against an ngspice transient there: docs/references.md §18)
	cases := []struct {
		series, title string
		has, hasNot   []string
	}{
		{"L3", "Smoothing filter", []string{"c_reservoir_f", "c_smoothing_f", "atten_ripple_db"}, []string{"atten_feed_db", "f_feed_hz"}},
		{"R4", "Supply decoupling filter", []string{"c_decoupling_f", "atten_feed_db"}, []string{"c_reservoir_f", "c_smoothing_f"}},
		{"R3", screenFeedTitle, []string{"c_screen_bypass_f", "z_screen_ohm", "screen_drop_v"}, []string{"c_reservoir_f", "atten_feed_db", "atten_ripple_db"}},
	}
	for _, tc := range cases {
		s := stageWith(st, tc.series)
		if s == nil || s.Title != tc.title {
			t.Fatalf("%s: %v, want %q", tc.series, s, tc.title)
		}
		if tc.title == screenFeedTitle && s.Topology != "screen-feed" {
			t.Errorf("%s: topology %q, want screen-feed", tc.series, s.Topology)
		}
		for _, k := range tc.has {
			if _, ok := s.Figures.Lookup(k); !ok {
				t.Errorf("%s (%s): no %s in %v", tc.series, s.Title, k, s.Figures)
			}
		}
		for _, k := range tc.hasNot {
			if _, ok := s.Figures.Lookup(k); ok {
				t.Errorf("%s (%s): %s has no meaning here, got it", tc.series, s.Title, k)
			}
		}
	}
	main := stageWith(st, "L3")
	if got := fig(main.Figures, "c_reservoir_f"); got != 32e-6 {
		t.Errorf("reservoir %g F, want C38 32 µF (on the rectifier)", got)
	}
	if !slices.Contains(main.Parts, "C38") {
		t.Errorf("main filter parts %v: want its reservoir C38", main.Parts)
	}
	// hum left on HT: the fundamental of the estimate's ripple at the
	// reservoir passed by the section as the solver gives it at 100 Hz; a
	// fundamental's p-p lies between a sawtooth's 2/π of the swing (Fourier
	// series, handbook) and the whole swing (a sine's)
	rip := fig(main.Figures, "ripple_in_v")
	h := math.Pow(10, -fig(main.Figures, "atten_ripple_db")/20)
	if got := fig(main.Figures, "hum_out_v"); rip < 10 || got < rip*2/math.Pi*h*0.999 || got > rip*h {
		t.Errorf("hum %g V from ripple %g V: want its fundamental, %g to %g V", got, rip, rip*2/math.Pi*h, rip*h)
	}
	if !strings.Contains(strings.Join(main.Notes, " "), "6 stages (V1, V2, V3, V4, V6 and V7)") {
		t.Errorf("main filter notes %q: want the six stages it feeds", main.Notes)
	}
	scr := stageWith(st, "R3")
	xc := 1 / (2 * math.Pi * 540e3 * 100e-9) // handbook X_C = 1/(2πfC), at the band's low end
	if got := fig(scr.Figures, "z_screen_ohm"); math.Abs(got/xc-1) > 0.01 {
		t.Errorf("screen |Z| %g Ω, want about X_C %g Ω", got, xc)
	}
	if got := fig(scr.Figures, "z_screen_unbypassed_ohm"); math.Abs(got/33e3-1) > 0.01 {
		t.Errorf("screen |Z| unbypassed %g Ω, want R3 33 kΩ", got)
	}
	vht, _ := op.Volts("ht")
	vscr, _ := op.Volts("rf_scr")
	if got := fig(scr.Figures, "screen_drop_v"); math.Abs(got-(vht-vscr)) > 1e-6 || got < 50 {
		t.Errorf("screen drop %g V, want the chart's %g V", got, vht-vscr)
	}
}
