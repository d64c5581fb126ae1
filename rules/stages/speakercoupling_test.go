package stages

import (
	"math"
	"path/filepath"
	"slices"
	"testing"

	"pare/graph"
)

// TestOutputCapacitorIntoTheSpeaker: the output capacitor of a
// single-supply amplifier feeds the loudspeaker, and its corner is set by
// the speaker's impedance, beside the overall feedback resistor's path
// from the speaker side. With the feedback resistor nearer the inputs
// than the amplifier's mid-point, the speaker side was taken for the
// capacitor's driven side: review20 b04 (a blind reviewer's circuit)
// paired C7 with the mid-point's DC feedback resistor R2 as "RC coupling,
// f c 5.72 Hz". Check values: b04 from the
// reviewer's ngspice-39 run (testdata/review20/spice/b, report: C7 into
// 8 Ω, 42.6 Hz, 2 %); the variant, of our own (a 4 Ω speaker, 1000 µF,
// 2k2 + 100 Ω of feedback path), from fc = 1/(2πRC) with R the speaker
// beside the feedback path (handbook, from memory), 2 %.
func TestOutputCapacitorIntoTheSpeaker(t *testing.T) {
	b04, err := graph.LoadFile(filepath.Join("..", "..", "testdata", "review20", "b04.toml"))
	if err != nil {
		t.Fatal(err)
	}
	variant := circuit(t, "bjt", `@Q1(in, e1, c1)
R1 = { r = "100", pins = ["e1", "gnd"] }
R2 = { r = "1k", pins = ["c1", "ht"] }
@Q2(c1, mid, gnd)
R3 = { r = "2k2", pins = ["spk", "e1"] }
C1 = { c = "1000u", pins = ["mid", "spk"] }
LS1 = { spk = "4", pins = ["spk", "gnd"] }
R4 = { r = "47k", pins = ["mid", "gnd"] }`, `outputs = ["spk"]`)
	rVariant := 4 * 2300 / (4 + 2300.0)
	for _, tc := range []struct {
		name     string
		st       []Stage
		cap, not string
		want     float64 // Hz
	}{
		{"review20 b04", findBiased(t, b04), "C7", "R2", 42.6},
		{"variant", find(t, variant, Options{}), "C1", "R4", 1 / (2 * math.Pi * 1000e-6 * rVariant)},
	} {
		s := holding(tc.st, tc.cap)
		if s == nil || s.Topology != "speaker-coupling" {
			t.Errorf("%s: %s not an output capacitor into the loudspeaker: %s", tc.name, tc.cap, topologies(tc.st))
			continue
		}
		// the loudspeaker is shared (a Zobel across it names it too), so
		// the stage holds the capacitor, never the DC feedback resistor
		if slices.Contains(s.Parts, tc.not) {
			t.Errorf("%s: stage holds %v, not %s", tc.name, s.Parts, tc.not)
		}
		if got := fig(s.Figures, "f_c_hz"); !within(got, tc.want, 0.02) {
			t.Errorf("%s: corner %g Hz, want %g (2 %%)", tc.name, got, tc.want)
		}
	}
}
