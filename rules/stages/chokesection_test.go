package stages

import (
	"math"
	"strings"
	"testing"

	"pare/graph"
)

// TestChokeSectionModel: the textbook model of a choke section (its
// winding's copper in series, its load across the capacitor as V/I),
// the check beside the solver's figures, against ngspice-39 on review23
// a05's field-coil section alone (docs/references.md §52): L2 6 H with
// 1.2 kΩ into C27 16 µF, unloaded (the set's load as the DC current
// sources of the reviewer's c05_supply.cir, open at AC:
// testdata/review23/spice/a/c05_section_ac.cir) and loaded by RL =
// 255.95 V / 24.5 mA = 10447 Ω (c05_section_rl.cir). The near miss is
// the undamped resonance 1/(2π√(LC2)) = 16.24 Hz taken for the corner:
// the section falls 3 dB well below it.
func TestChokeSectionModel(t *testing.T) {
	for _, tc := range []struct {
		name                string
		rl                  float64
		fc, f0, q, atten100 float64 // ngspice-39, ac dec 2000
	}{
		{"field coil, unloaded", math.Inf(1), 10.76042, 16.24369, 0.5104261, 31.78139},
		{"field coil, RL 10447 Ω", 10447, 11.76826, 17.15125, 0.4693041 / 0.8969440, 31.78247},
	} {
		t.Run(tc.name, func(t *testing.T) {
			k := chokeSection{l: 6, rdc: 1200, c2: 16e-6, rl: tc.rl}
			for _, c := range []struct {
				what      string
				got, want float64
				tol       float64
			}{
				{"corner", k.corner(), tc.fc, 2e-4}, // ngspice reads its corner off 2000 points a decade
				{"resonance", k.resonance(), tc.f0, 1e-4},
				{"Q", k.q(), tc.q, 5e-4}, // the deck reads |H| at 16.24 and 17.15 Hz, a hair off its −90° point
				{"attenuation at 100 Hz", k.atten(100), tc.atten100, 1e-4},
			} {
				if math.Abs(c.got-c.want) > c.tol*math.Abs(c.want) {
					t.Errorf("%s %.6g, ngspice %.6g", c.what, c.got, c.want)
				}
			}
			if undamped := resonance(6, 16e-6); k.corner() > 0.8*undamped {
				t.Errorf("corner %.4g Hz not well below the undamped resonance %.4g Hz", k.corner(), undamped)
			}
		})
	}
}

// TestChokeWords: the words read the figures as they are: a section
// damped under Q = 1/√2 (Butterworth, handbook) falls from DC, its
// corner below its resonance; a lighter one stands 20·log10(Q) dB above
// its DC level at its resonance, its corner above it (the flagship's choke:
// f0 9.009 Hz, Q 1.86, fc 13.15 Hz, as pare solves it).
func TestChokeWords(t *testing.T) {
	for _, tc := range []struct {
		name        string
		fc, f0, q   float64
		has, hasNot []string
	}{
		{"damped", 10.40, 16.77, 0.486, []string{"10.4 Hz", "16.77 Hz", "Q 0.486", "no peak", "below its resonance"}, []string{"stands", "above"}},
		{"light", 13.15, 9.009, 1.86, []string{"13.15 Hz", "9.009 Hz", "Q 1.86", "stands 5.4 dB above", "falls past it"}, []string{"no peak", "below its resonance"}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			got := chokeWords("L2", tc.fc, tc.f0, tc.q, "")
			for _, w := range tc.has {
				if !strings.Contains(got, w) {
					t.Errorf("%q lacks %q", got, w)
				}
			}
			for _, w := range tc.hasNot {
				if strings.Contains(got, w) {
					t.Errorf("%q says %q", got, w)
				}
			}
		})
	}
}

// TestFieldCoilSection: review23 a05's field-coil smoothing as solved in
// the set. The reviewer's ngspice transient (testdata/review23/spice/a/
// c05_supply.cir, RESULTS.md) leaves about 0.50 V p-p of ripple on the HT
// after the field coil; the section alone on the bench of c05_section_ac.cir
// falls 3 dB at 10.76 Hz, lags 90° at 16.24 Hz and is 31.78 dB down at
// 100 Hz (ngspice-39). In circuit the valves' small-signal loads move
// these a little (within 5 %, 0.5 dB); the note's words give the same
// figures and call the section damped, its corner below its resonance
// (where the twelfth review read 10.42 Hz beside words that put it above
// 25 Hz).
func TestFieldCoilSection(t *testing.T) {
	c, err := graph.LoadFile("../../testdata/review23/a05.toml")
	if err != nil {
		t.Fatal(err)
	}
	st := findBiased(t, c)
	h := holding(st, "L2")
	if h == nil || h.Topology != "smoothing-filter" {
		t.Fatalf("L2 in no smoothing filter: %s", topologies(st))
	}
	for _, w := range []struct {
		key       string
		want, tol float64
	}{
		{"f_c_hz", 10.76, 0.05},
		{"f_res_hz", 16.24, 0.05},
		{"q_section", 0.5104, 0.06},
		{"hum_out_v", 0.50, 0.10},
	} {
		got, ok := h.Figures.Lookup(w.key)
		if !ok || math.Abs(got-w.want) > w.tol*w.want {
			t.Errorf("%s %.4g, want %.4g within %.0f %% (%v)", w.key, got, w.want, 100*w.tol, h.Figures)
		}
	}
	if a, ok := h.Figures.Lookup("atten_ripple_db"); !ok || math.Abs(a-31.78) > 0.5 {
		t.Errorf("attenuation at 100 Hz %.2f dB, ngspice 31.78 dB", a)
	}
	fc, _ := h.Figures.Get("f_c")
	f0, _ := h.Figures.Get("f_res")
	words := strings.Join(h.Notes, "\n")
	for _, w := range []string{hz(fc.Value), hz(f0.Value), "no peak", "below its resonance", "dB down at the 100 Hz ripple"} {
		if !strings.Contains(words, w) {
			t.Errorf("notes lack %q:\n%s", w, words)
		}
	}
	if strings.Contains(words+fc.Why, "only above") {
		t.Errorf("words put the corner above the resonance:\n%s\n%s", words, fc.Why)
	}
}
