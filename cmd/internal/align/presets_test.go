package align_test

import (
	"bytes"
	"math"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"pare/cmd/internal/align"
)

// A set whose only adjustments are presets gets a procedure for them: what
// each sets, read from its place in the circuit and from what the solvers
// show it do over its travel (never from its name or note), where to
// measure, the order and the caution; where pare cannot tell, it says so.
// Check values: ngspice-39 .op on the blind reviewer's deck of review17
// b04 with RV1 at its nominal setting and at both ends
// (testdata/presets/b04-bias-travel.cir, run by hand), docs/references.md §44.
func TestPresetProcedures(t *testing.T) {
	review := func(n string) string { return filepath.Join("..", "..", "..", "testdata", "review17", n+".toml") }
	fixture := func(n string) string { return filepath.Join("..", "..", "..", "testdata", "presets", n+".toml") }
	cases := []struct {
		name, file string
		job        string   // the words the preset's job starts with; "" pare cannot tell
		has        []string // words its lines must hold
		// ngspice's quiescent current (mA) at the nominal setting and at
		// 0 % and 100 % of the travel; 0: not checked
		iNom, i0, i1 float64
	}{
		{"complementary pair's bias (review17 b04)", review("b04"), "Output bias: RV1 sets the quiescent current of the pair Q2/Q3",
			[]string{"mid-point mid", "across R9", "current-limited supply"}, 17.357, 2.2656, 62.721},
		{"phase-shift oscillator's gain (review17 b01)", review("b01"), "Oscillator gain: RV1 is in Q1's loop",
			[]string{"RV1 at 0 % of its travel: Q1's loop gain +", "(starts)", "clips"}, 0, 0, 0},
		{"hum balance (review17 a05)", review("a05"), "Hum balance: RV1 is the artificial centre tap of T1's winding",
			[]string{"least hum", "model no hum"}, 0, 0, 0},
		{"a lone device's bias", fixture("bias-preset"), "Bias: RV1 sets Q1's quiescent current",
			[]string{"Q1's current", "least current"}, 0, 0, 0},
		{"an input-level preset", fixture("level-preset"), "",
			[]string{"RV1: pare cannot tell what it sets"}, 0, 0, 0},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			res, g := build(t, tc.file)
			g.AddPresets(res.Circuit, res.DC, res.Stages)
			if len(g.Presets) != 1 {
				t.Fatalf("presets %+v, want one", g.Presets)
			}
			p := g.Presets[0]
			if (tc.job == "") != (p.Job == "") {
				t.Errorf("job %q, want one: %v", p.Job, tc.job != "")
			}
			var b bytes.Buffer
			if err := align.WriteText(&b, g); err != nil {
				t.Fatal(err)
			}
			text := b.String()
			if tc.job != "" && !strings.Contains(text, "  1. "+tc.job) {
				t.Errorf("guide's first preset does not start %q:\n%s", tc.job, text)
			}
			if !strings.Contains(text, "Presets, in the order they are set") {
				t.Errorf("no presets section in:\n%s", text)
			}
			for _, w := range tc.has {
				if !strings.Contains(text, w) {
					t.Errorf("guide lacks %q:\n%s", w, text)
				}
			}
			if tc.iNom > 0 {
				checkCurrents(t, text, tc.iNom, tc.i0, tc.i1)
			}
		})
	}
}

// checkCurrents reads "current A mA at the nominal setting, B mA–C mA
// over the travel" and holds it within 2 % of ngspice's (pare prints three
// significant digits).
func checkCurrents(t *testing.T, text string, nom, lo, hi float64) {
	t.Helper()
	m := regexp.MustCompile(`quiescent current ([0-9.]+) mA at the nominal setting, ([0-9.]+) mA–([0-9.]+) mA over the travel`).FindStringSubmatch(text)
	if m == nil {
		t.Fatalf("no quiescent current line in:\n%s", text)
	}
	for i, want := range []float64{nom, lo, hi} {
		got, _ := strconv.ParseFloat(m[i+1], 64)
		if math.Abs(got/want-1) > 0.02 {
			t.Errorf("current %g mA, want within 2 %% of ngspice's %g mA", got, want)
		}
	}
}

// A preset in an arm of a phase-shift ladder (review19 b01: RV1 in series
// with R6, the second shunt arm), on none of the device's nets, is in the
// oscillator's loop: it sets the frequency and the start, and the guide
// gives the loop solver's 0° point and margin over its travel. Check
// values: ngspice-39 .ac on testdata/review19/spice/b/c01_loop.cir with
// RV1 at 1 mΩ, 3 kΩ (nominal, 60 %) and 5 kΩ (run by hand): 0° at
// 284.4 Hz +10.82 dB, 255.0 Hz +11.06 dB, 239.3 Hz +10.93 dB.
func TestLadderPresetInLoop(t *testing.T) {
	file := filepath.Join("..", "..", "..", "testdata", "review19", "b01.toml")
	res, g := build(t, file)
	g.AddPresets(res.Circuit, res.DC, res.Stages)
	if len(g.Presets) != 1 || !strings.HasPrefix(g.Presets[0].Job, "oscillator frequency and gain: RV1 is in Q1's feedback network") {
		t.Fatalf("presets %+v, want RV1 in Q1's feedback network", g.Presets)
	}
	re := regexp.MustCompile(`RV1 at (\d+) % of its travel: Q1's loop gain ([+-][0-9.]+) dB at ([0-9.]+) Hz`)
	want := map[string][2]float64{"0": {284.4, 10.82}, "60": {255.0, 11.06}, "100": {239.3, 10.93}}
	got := 0
	for _, pt := range g.Presets[0].Points {
		m := re.FindStringSubmatch(pt)
		if m == nil {
			continue
		}
		w, ok := want[m[1]]
		if !ok {
			t.Errorf("unexpected travel point %q", pt)
			continue
		}
		got++
		db, _ := strconv.ParseFloat(m[2], 64)
		f, _ := strconv.ParseFloat(m[3], 64)
		if math.Abs(f/w[0]-1) > 0.02 || math.Abs(db-w[1]) > 0.5 {
			t.Errorf("%s: want %.1f Hz %+.2f dB (ngspice) within 2 %% and 0.5 dB", pt, w[0], w[1])
		}
	}
	if got != 3 {
		t.Errorf("%d travel points, want 3: %v", got, g.Presets[0].Points)
	}
}
