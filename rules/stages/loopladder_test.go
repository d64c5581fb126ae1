package stages

import (
	"math"
	"slices"
	"testing"

	"pare/graph"
)

// An oscillator found by its loop whose feedback is a phase-shift ladder
// (three C-R sections in cascade from the collector back to the base:
// handbook analysis, one section gives under 90°, three are the fewest that
// give 180°) is named an RC phase-shift oscillator and holds the whole
// ladder, however far it runs from the device: b01's third resistor is R6
// in series with the bias network (the ladder's C3 sat in a stage of its
// own), c02's second shunt is a preset and a resistor in series (R6 was in
// no stage). b01's buffer coupling C5 and base bias R11 ≡ R11, R12 lead to
// Q2, not back to Q1's base: they are not the oscillator's. The loop runs
// where ngspice finds it: .ac on testdata/review13/spice/b01_loop_values.cir
// gives 0° at 586.777 Hz, +1.932 dB (the reviewer's b01_loop.cir read "5k6"
// as 5 kΩ and gave 604.4 Hz); on testdata/review12/spice/c02loop.cir
// 677.83 Hz, +7.25 dB (review 12); on testdata/review19/spice/b/c01_loop.cir
// 255.0 Hz, +11.06 dB (review 19: its base bias hangs from a decoupled line,
// so the divider's tap, where the ladder's last capacitor and the series
// base resistor meet, is a bias point, not part of the line; its buffer's
// C5 and bias R8 ≡ R8, R9 are Q2's); within 5 % (pare's DC point differs a
// little from the deck's).
func TestPhaseShiftLadderByLoop(t *testing.T) {
	for _, tc := range []struct {
		file, device string
		spiceHz      float64
		holds, not   []string
	}{
		{"../../testdata/review13/b01.toml", "Q1", 586.777,
			[]string{"C1", "C2", "C3", "R6", "R7", "R8", "R3"}, []string{"C5", "R11", "Q2"}},
		{"../../testdata/review12/c02.toml", "TR1", 677.83,
			[]string{"C2", "C3", "C4", "R5", "RV2", "R6"}, nil},
		{"../../testdata/review19/b01.toml", "Q1", 255.0,
			[]string{"C1", "C2", "C3", "R5", "R6", "RV1", "R7", "R2"}, []string{"C5", "R8", "Q2"}},
		// a buffer's base fed from the supply and tapped off the ladder's
		// middle: its bias and coupling are Q2's (ngspice 2541.33 Hz, on
		// testdata/phase-shift/bjt-lowpass4-buffer_return.cir, as
		// TestPhaseShiftInputAtControl)
		{"../../testdata/phase-shift/bjt-lowpass4-buffer.toml", "Q1", 2541.33,
			[]string{"R1", "R2", "R3", "R4", "C1", "C2", "C3", "C4"}, []string{"C12", "R8", "Q2"}},
	} {
		t.Run(tc.file, func(t *testing.T) {
			c, err := graph.LoadFile(tc.file)
			if err != nil {
				t.Fatal(err)
			}
			st := findReduced(t, c)
			s := holderOf(st, tc.device)
			if s == nil || s.Topology != phaseShiftLoopTopology || s.Title != "RC phase-shift oscillator (BJT)" {
				t.Fatalf("stages %s: want %s holding %s", topologies(st), phaseShiftLoopTopology, tc.device)
			}
			for _, r := range tc.holds {
				if !slices.Contains(s.Parts, r) {
					t.Errorf("%s lacks %s: %v", s.Title, r, s.Parts)
				}
			}
			for _, r := range tc.not {
				if slices.Contains(s.Parts, r) {
					t.Errorf("%s holds %s, another stage's: %v", s.Title, r, s.Parts)
				}
			}
			if cap := stageOf(st, loopCapTopology); cap != nil && cap.Title == "Part of "+tc.device+"'s oscillator loop" {
				t.Errorf("a ladder part in a stage of its own: %s %v", cap.Title, cap.Parts)
			}
			f, _, _, m, ok := s.Loop[0].Range()
			if !ok || m < 0 || math.Abs(f/tc.spiceHz-1) > 0.05 {
				t.Errorf("loop %.1f Hz %+.1f dB, ngspice %.1f Hz", f, m, tc.spiceHz)
			}
		})
	}
}

// Only a ladder is a phase-shift oscillator: the Wien bridge's network
// (a bridge between two devices, testdata/osc/wien-bjt.toml) keeps the
// plain name (TestOscillatorFoundByLoop), and a ladder of two sections
// counts two.
func TestLadderSections(t *testing.T) {
	parts := func(second string) string {
		return `title = "ladder"
band = "100..10k"
[nets]
gnd = { role = "ground" }
vcc = { role = "supply", volts = 9 }
[parts]
Q1 = { bjt = "npn", pins = { b = "b", c = "c", e = "gnd" }, beta = 200, ic = "1m" }
R4 = { r = "4k7", pins = ["c", "vcc"] }
R3 = { r = "22k", pins = ["b", "gnd"] }
C1 = { c = "10n", pins = ["c", "n1"] }
R1 = { r = "10k", pins = ["n1", "gnd"] }
` + second
	}
	for _, tc := range []struct {
		name, rest string
		want       int
	}{
		{"three high-pass", `C2 = { c = "10n", pins = ["n1", "n2"] }
R2 = { r = "10k", pins = ["n2", "gnd"] }
C3 = { c = "10n", pins = ["n2", "b"] }`, 3},
		{"two high-pass", `C2 = { c = "10n", pins = ["n1", "b"] }`, 2},
		{"bridged, no chain", `C2 = { c = "10n", pins = ["n1", "n2"] }
R2 = { r = "10k", pins = ["n2", "gnd"] }
C3 = { c = "10n", pins = ["n2", "b"] }
C4 = { c = "1n", pins = ["n1", "b"] }`, 0},
	} {
		t.Run(tc.name, func(t *testing.T) {
			c, err := graph.Parse("ladder.toml", []byte(parts(tc.rest)))
			if err != nil {
				t.Fatal(err)
			}
			g := groundOf(c, nil)
			fb, ok := rcFeedback(c, c, g, c.Part("Q1"))
			if !ok || fb.sections != tc.want {
				t.Errorf("sections %d (network %v), want %d", fb.sections, fb.parts, tc.want)
			}
		})
	}
}
