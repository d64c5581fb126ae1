package stages

import (
	"math"
	"slices"
	"testing"

	"pare/graph"
	"pare/graph/figure"
)

// The Wien-bridge pattern names the class, not one drawing: the two
// captured oscillators (the first stage's common electrode on an unbypassed
// resistor that carries the bridge's negative-feedback arm), a series arm
// drawn capacitor first, and the textbook drawing with the common electrode
// at AC ground, each with both devices in the one stage and the frequency
// solved in circuit beside its formula. The near misses must not be named:
// two RC-coupled stages with no frequency-selective feedback, and a Wien
// network around a single inverting stage (feedback in antiphase: it cannot
// oscillate as drawn).
func TestWienBridgeClass(t *testing.T) {
	cases := []struct {
		name, path, family, parts string
		devices                   []string
		formulaHz                 float64 // 0: a near miss
	}{
		// handbook formula f = 1/(2π√(R1R2C1C2)), 10 kΩ and 10 nF: 1591.55 Hz (derived).
		{"valve fixture", "../../testdata/osc/wien-valve.toml", "", "", []string{"V1", "V2"}, 1591.55},
		{"bjt fixture", "../../testdata/osc/wien-bjt.toml", "", "", []string{"Q1", "Q2"}, 1591.55},
		// Series arm capacitor first, emitter degenerated; the parallel arm's R
		// is the Thevenin resistance of a base divider, 22k ∥ 22k = 11 kΩ:
		// 1/(2π√(10k·11k·10n·10n)) = 1517.5 Hz (handbook formula, derived).
		{"capacitor first, divider", "", "bjt", `@Q1(g1, k1, o1)
@Q2(g2, gnd, o2)
R5 = { r = "4k7", pins = ["o1", "ht"] }
R6 = { r = "2k2", pins = ["o2", "ht"] }
C5 = { c = "1u", pins = ["o1", "g2"] }
R7 = { r = "47k", pins = ["g2", "gnd"] }
C1 = { c = "10n", pins = ["o2", "m"] }
R1 = { r = "10k", pins = ["m", "g1"] }
R2 = { r = "22k", pins = ["g1", "gnd"] }
R8 = { r = "22k", pins = ["g1", "ht"] }
C2 = { c = "10n", pins = ["g1", "gnd"] }
R3 = { r = "470", pins = ["k1", "gnd"] }
R4 = { r = "1k", pins = ["o2", "k1"] }`, []string{"Q1", "Q2"}, 1517.5},
		// The textbook drawing: both common electrodes at AC ground, direct
		// coupling between the stages; 100 kΩ and 1 nF, 1591.55 Hz (derived).
		{"grounded, direct", "", "valve", `@Q1(g1, gnd, o1)
@Q2(o1, gnd, o2)
R5 = { r = "47k", pins = ["o1", "ht"] }
R6 = { r = "47k", pins = ["o2", "ht"] }
R1 = { r = "100k", pins = ["o2", "m"] }
C1 = { c = "1n", pins = ["m", "g1"] }
R2 = { r = "100k", pins = ["g1", "gnd"] }
C2 = { c = "1n", pins = ["g1", "gnd"] }`, []string{"Q1", "Q2"}, 1591.55},
		// Two RC-coupled stages, no feedback from the output at all.
		{"two-stage amplifier", "", "valve", `@Q1(g1, k1, o1)
@Q2(g2, gnd, o2)
R5 = { r = "47k", pins = ["o1", "ht"] }
R6 = { r = "47k", pins = ["o2", "ht"] }
C5 = { c = "100n", pins = ["o1", "g2"] }
R7 = { r = "470k", pins = ["g2", "gnd"] }
R2 = { r = "10k", pins = ["g1", "gnd"] }
C2 = { c = "10n", pins = ["g1", "gnd"] }
R3 = { r = "1k", pins = ["k1", "gnd"] }
C9 = { c = "100n", pins = ["o2", "out"] }
R9 = { r = "470k", pins = ["out", "gnd"] }`, nil, 0},
		// A Wien network from the output of one inverting stage to its own
		// control electrode.
		{"single stage", "", "bjt", `@Q1(g1, k1, o1)
R5 = { r = "4k7", pins = ["o1", "ht"] }
R1 = { r = "10k", pins = ["o1", "m"] }
C1 = { c = "10n", pins = ["m", "g1"] }
R2 = { r = "10k", pins = ["g1", "gnd"] }
C2 = { c = "10n", pins = ["g1", "gnd"] }
R3 = { r = "470", pins = ["k1", "gnd"] }`, nil, 0},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			var c *graph.Circuit
			if tc.path != "" {
				var err error
				if c, err = graph.LoadFile(tc.path); err != nil {
					t.Fatal(err)
				}
			} else {
				c = audioCircuit(t, tc.family, tc.parts)
			}
			found := find(t, c, Options{})
			st := stageOf(found, "wien-bridge")
			if tc.formulaHz == 0 {
				if st != nil {
					t.Fatalf("near miss named %s %v", st.Title, st.Parts)
				}
				return
			}
			if st == nil {
				t.Fatalf("not named; stages %s", topologies(found))
			}
			for _, d := range tc.devices {
				if !slices.Contains(st.Parts, d) {
					t.Errorf("%s not in the stage %v", d, st.Parts)
				}
			}
			checkWienFigure(t, st, tc.formulaHz)
		})
	}
}

// checkWienFigure: the frequency shown is the solver's loop 0° frequency
// (the loop of a device in the stage starts, margin above 0 dB), within 5 %
// of the formula that stands beside it as its cross-check (the formula
// takes the network unloaded).
func checkWienFigure(t *testing.T, st *Stage, formulaHz float64) {
	t.Helper()
	f, ok := st.Figures.Get("f")
	if !ok || f.Origin.Source != figure.Solver || f.Check == nil {
		t.Fatalf("f %+v: want the solver's with a formula check", f)
	}
	if got := f.Check.Value; math.Abs(got-formulaHz) > 1e-4*formulaHz {
		t.Errorf("formula %.6g Hz, want %.6g", got, formulaHz)
	}
	if math.Abs(f.Value-formulaHz) > 0.05*formulaHz {
		t.Errorf("in circuit %.6g Hz, more than 5 %% from the formula's %.6g", f.Value, formulaHz)
	}
	starts := false
	for _, l := range st.Loop {
		if _, _, _, mMax, ok := l.Range(); ok && mMax > 0 {
			starts = true
		}
	}
	if !starts {
		t.Errorf("no loop with a margin above 0 dB: %+v", st.Loop)
	}
}

// audioCircuit builds a fixture as circuit does, in an audio band.
func audioCircuit(t *testing.T, family, parts string) *graph.Circuit {
	t.Helper()
	src := "title = \"fixture\"\nband = \"100..10k\"\n[nets]\nht = { role = \"supply\", volts = 250 }\n[parts]\n" +
		expandDevices(parts, family) + "\n"
	c, err := graph.Parse("fixture.toml", []byte(src))
	if err != nil {
		t.Fatalf("fixture does not load: %v\n%s", err, src)
	}
	return c
}
