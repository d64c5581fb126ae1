package align_test

import (
	"math"
	"path/filepath"
	"strings"
	"testing"
)

// TestIFReadPastTheInjection: review19 b02's capture declares its output
// at the mixer's base (mix_b), where the IF generator also goes; the IF
// step said to inject at mix_b and watch mix_b, and the injection table
// "1 V at mix_b gives 1 V at mix_b, ×1". The IF is read where the
// mixer's IF can passes it on (T3's link winding, if_out), as the trade
// reads an IF stage's output (common practice).
func TestIFReadPastTheInjection(t *testing.T) {
	_, g := build(t, filepath.Join("..", "..", "..", "testdata", "review19", "b02.toml"))
	for _, s := range g.Steps {
		if s.Phase == "IF" && !strings.Contains(s.Watch, "if_out") {
			t.Errorf("IF step %d watches %q, want the IF at if_out", s.N, s.Watch)
		}
	}
	for _, in := range g.Inject {
		if in.Net == in.RefNet {
			t.Errorf("injection at %s read at the same net (%s)", in.Net, in.RefWhat)
		}
	}
}

// TestHeptodeConversionCountedOnce: a frequency-changer valve's gm is its
// conversion conductance in the device model (docs/devices.md, hexode,
// heptode, octode: 0.5 mA/V), so the mixer row's gain at the IF is already
// its conversion gain; review19 a02's RF rows took a quarter of it again
// (the conversion loss counted twice). A transistor mixer's gm is its
// amplifier transconductance, and its RF rows keep the quarter (a handbook
// rule, from memory).
func TestHeptodeConversionCountedOnce(t *testing.T) {
	cases := []struct {
		file    string
		quarter bool
	}{
		{"review19/a02.toml", false},
		{"review18/b02.toml", true},
	}
	for _, tc := range cases {
		_, g := build(t, filepath.Join("..", "..", "..", "testdata", tc.file))
		var mixerLevel float64
		for _, in := range g.Inject {
			if in.Band == "IF" && strings.Contains(in.GainNote, "RF rows take") {
				mixerLevel = in.Level
			}
		}
		if mixerLevel == 0 {
			t.Fatalf("%s: no mixer row", tc.file)
		}
		n := 0
		for _, in := range g.Inject {
			if in.Band != "RF" || !strings.Contains(in.RefWhat, "mixer's") {
				continue
			}
			n++
			if q := strings.Contains(in.RefWhat, "a quarter"); q != tc.quarter {
				t.Errorf("%s: RF row at %s refers to %q: quarter %v, want %v", tc.file, in.Net, in.RefWhat, q, tc.quarter)
			}
			want := mixerLevel
			if tc.quarter {
				want = mixerLevel / 0.25
			}
			if math.Abs(in.RefLevel/want-1) > 1e-9 {
				t.Errorf("%s: RF row at %s refers to %g V at the mixer, want %g", tc.file, in.Net, in.RefLevel, want)
			}
		}
		if n == 0 {
			t.Errorf("%s: no RF row referred to the mixer", tc.file)
		}
	}
}
