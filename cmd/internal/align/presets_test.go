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
