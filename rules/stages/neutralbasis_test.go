package stages

import (
	"math/cmplx"
	"strings"
	"testing"
)

// TestReview18NeutraliserBasis: review18 b05's C12 (4.7 pF from T5's
// secondary end back to Q3's base) is worded with what its figure is: the
// collector-to-base capacitance its own feedback equals, against a small
// BJT's typical 2 pF (from memory, the solver's models have none), and
// flagged as neutralising little. Check values: ngspice 39 .ac at
// 454.89 kHz on pare's reduced deck with Q3's collector driven
// (testdata/neutral/review18-b05-{none,c12,cbc,both}.cir: neither, C12
// alone, 2 pF alone, both): V(q3_b) = 9.01531e-7−j1.34058e-6,
// −1.3662e-5−j1.0246e-5, −1.44794e-4+j4.26378e-4,
// −1.58983e-4+j4.1777e-4; so C12 cancels 2 pF × |c12 − none| / |cbc −
// none| = 75.558 fF (3.8 %), and the reverse transfer with it is
// 4.4700e-4 against 4.5029e-4 without (0.73 % lower).
func TestReview18NeutraliserBasis(t *testing.T) {
	none := complex(9.01531e-7, -1.34058e-6) // ngspice, above
	c12 := complex(-1.3662e-5, -1.0246e-5)
	cbc := complex(-1.44794e-4, 4.26378e-4)
	both := complex(-1.58983e-4, 4.1777e-4)
	sts := findBiased(t, loadReview18(t, "b05.toml")) // the main job's: figures at the DC operating point
	s := stageOf(sts, "winding-feedback-capacitor")
	if s == nil {
		t.Fatalf("no neutralising capacitor: %s", topologies(sts))
	}
	for key, want := range map[string]float64{
		"c_cancelled_f":     2e-12 * cmplx.Abs(c12-none) / cmplx.Abs(cbc-none),
		"rev_transfer":      cmplx.Abs(both),
		"rev_transfer_open": cmplx.Abs(cbc),
	} {
		if got := fig(s.Figures, key); !within(got, want, 0.005) {
			t.Errorf("%s = %g, ngspice %g", key, got, want)
		}
	}
	notes := strings.Join(s.Notes, "\n")
	for _, want := range []string{"Q3's Cbc", "typical 2 pF (from memory, not the part's data)", "3.8 % of it"} {
		if !strings.Contains(notes, want) {
			t.Errorf("notes %q lack %q", notes, want)
		}
	}
	if len(s.Flags) != 1 || !strings.Contains(s.Flags[0], "neutralises little") || !strings.Contains(s.Flags[0], "0.73 % lower") {
		t.Errorf("flags %q, want it flagged as neutralising little, 0.73 %% lower (ngspice)", s.Flags)
	}
}
