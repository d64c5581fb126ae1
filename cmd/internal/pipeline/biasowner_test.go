package pipeline

import (
	"math"
	"slices"
	"testing"
)

// TestBiasResistorWithItsDevice: a resistor from a decoupled supply line
// down to a base bias node held by its own capacitor carries no supply
// forward: it is the device's bias, not a "supply decoupling filter" with
// the line's bypass (review22 b02, reviewer B: "R2 is the RF amp's upper
// base-bias resistor, and the decoupler is R4 330R with C3"), and the
// AGC feed into the same node is none either. The reduction merges the
// bias resistor with the line's decoupler (both run from the line to AC
// ground), and the device stage owns the merged part, so the faded sheet
// frames the bias resistor with its transistor (review13 b02 drawn in one
// piece, TestSmallSetsInOnePiece). The line's real decoupler keeps its
// name; its corner in circuit against ngspice-39 on the reviewer's
// circuit (testdata/review22/spice/b/c02-decoupler.cir: c02-base.inc with
// VCC given AC 1 and the battery bypass C7 left out, -3 dB of v(vcc_rf)):
// 11.466 kHz (the formula's 1/(2π·330 Ω·47 nF) is 10.26 kHz);
// docs/references.md §51.
func TestBiasResistorWithItsDevice(t *testing.T) {
	cases := []struct {
		review          string
		bias, notFilter []string // the base bias resistor; parts no supply filter may hold
		decoupler       string
		fc              float64 // in-circuit corner, 0: not checked
	}{
		{"review22", []string{"R2"}, []string{"R1", "R2", "C1"}, "R4", 11.466e3},
		{"review13", []string{"R1"}, []string{"R1", "R2", "C1"}, "R4", 0},
	}
	for _, tc := range cases {
		t.Run(tc.review, func(t *testing.T) {
			res := runFixture(t, tc.review, "b02")
			var dec bool
			for _, s := range res.Stages {
				if !s.Supply {
					continue
				}
				for _, ref := range tc.notFilter {
					if slices.Contains(s.Parts, ref) {
						t.Errorf("%s %q holds %s: it feeds the base bias node, no supply line", s.Name, s.Title, ref)
					}
				}
				if slices.Contains(s.Parts, tc.decoupler) {
					dec = true
					fc, ok := s.Figures.Lookup("f_c_hz")
					if tc.fc > 0 && (!ok || math.Abs(fc-tc.fc) > 0.01*tc.fc) {
						t.Errorf("%s corner %g Hz, ngspice %g Hz", s.Name, fc, tc.fc)
					}
				}
			}
			if !dec {
				t.Errorf("%s named in no supply filter", tc.decoupler)
			}
			dev := stageHolding(res.Stages, "Q1")
			if dev == nil {
				t.Fatal("no stage holds Q1")
			}
			for _, ref := range tc.bias {
				owned := false
				for _, p := range dev.Parts {
					if rp := res.Reduced.Part(p); rp != nil && slices.Contains(rp.Origins(), ref) {
						owned = true
					}
				}
				if !owned {
					t.Errorf("%s %q (parts %v) does not stand for the bias resistor %s", dev.Name, dev.Title, dev.Parts, ref)
				}
			}
		})
	}
}

// TestBleederStaysWithItsSupply: the near miss. A bleeder from HT to
// chassis runs from the line to AC ground as the smoothing resistor does
// once the reservoir is AC ground, so the reduction merges the two; the
// bleeder feeds no electrode (no bias node at either end), so the merged
// part stays the supply filter's and never joins the output stage that
// draws on the line (four valve sets whose bleeder the reduction merged;
// the merged refs read from their reduced.toml, "from = [...]").
func TestBleederStaysWithItsSupply(t *testing.T) {
	cases := []struct {
		review, name string
		merged       string // the merged part standing for the smoothing resistor and bleeder
		bleeder      string
	}{
		{"review16", "a05", "R1", "R2"},
		{"review17", "a05", "R2", "R3"},
		{"review18", "a05", "R2", "R3"},
		{"review21", "a04", "R6", "R21"},
	}
	for _, tc := range cases {
		t.Run(tc.review+"/"+tc.name, func(t *testing.T) {
			res := runFixture(t, tc.review, tc.name)
			p := res.Reduced.Part(tc.merged)
			if p == nil || !slices.Contains(p.Origins(), tc.bleeder) {
				t.Fatalf("%s does not stand for the bleeder %s in the reduced circuit", tc.merged, tc.bleeder)
			}
			for _, s := range res.Stages {
				if !s.Supply && slices.Contains(s.Parts, tc.merged) {
					t.Errorf("%s %q holds %s (merged with the bleeder %s): it is the supply filter's", s.Name, s.Title, tc.merged, tc.bleeder)
				}
			}
		})
	}
}
