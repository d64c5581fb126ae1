package align_test

import (
	"math"
	"path/filepath"
	"strings"
	"testing"

	"pare/cmd/internal/align"
)

// TestPushPullPairIsOneStage: a push-pull pair's two halves are one stage,
// driven side by side, so no injection row gains from one half to the
// other; a row at a half gains past the pair and says it is one half, and
// the driver's row names what the other half gets and in which phase. The
// class: transformer-coupled BJT pairs with an emitter resistor each to
// chassis (review18 b05, review16 b05: no shared common net), a valve
// pair (review18 a04), complementary pairs driven in phase (review18
// b04). Check values: ngspice 39 .ac at 400 Hz on pare's small-signal
// deck of review18 b05 (testdata/review18-b05-from-q4b.cir and -q6b.cir,
// written by `pare spice --from`): from q4_b, |V(q5_b)| = |V(q6_b)| =
// 4.7467, phases 2.9375 and −0.2041 rad (antiphase); from q6_b,
// |V(spk)| = 3.5408 and |V(q5_b)| = 0.47395 (the "gain" the table quoted
// before, one half to the other).
func TestPushPullPairIsOneStage(t *testing.T) {
	cases := []struct {
		file  string
		pair  []string // the halves' control nets
		phase string   // what the driver row says of the other half
		// ngspice check values, 0 where none
		driverNet string
		driver    float64 // driver row's gain to its half
		halfNet   string
		half      float64 // a half's row: gain to the output
	}{
		{"review18/b05", []string{"q5_b", "q6_b"}, "in antiphase", "q4_b", 4.7467, "q6_b", 3.5408},
		{"review16/b05", []string{"q5_b", "q6_b"}, "in antiphase", "", 0, "", 0},
		{"review18/a04", []string{"o1_g1", "o2_g1"}, "in antiphase", "", 0, "", 0},
		{"review18/b04", []string{"q2_b", "q1_c"}, "in phase", "", 0, "", 0},
		// A Vbe multiplier between the bases (review19 b04): the half's row
		// against the reviewer's nonlinear deck
		// testdata/review19/spice/b/c04_amp.cir (ngspice-39, .ac at
		// 400 Hz): |V(spk)/V(q2_b)| = 5.7133/7.8123 = 0.7313 in circuit,
		// driven from the input (pare drives q2_b alone: within 1 %).
		{"review19/b04", []string{"q2_b", "q1_c"}, "in phase", "", 0, "q2_b", 0.7313},
	}
	for _, tc := range cases {
		t.Run(tc.file, func(t *testing.T) {
			_, g := build(t, filepath.Join("..", "..", "..", "testdata", tc.file+".toml"))
			rows := map[string]align.Injection{}
			for _, in := range g.Inject {
				rows[in.Net] = in
			}
			drivers := 0
			for _, in := range g.Inject {
				one, other := contains(tc.pair, in.Net), contains(tc.pair, in.GainTo)
				switch {
				case one && other:
					t.Errorf("row at %s gains to the other half %s (×%.3g)", in.Net, in.GainTo, in.Gain)
				case one && !strings.Contains(in.GainNote, "one half of the push-pull pair"):
					t.Errorf("row at %s does not say it is one half: %q", in.Net, in.GainNote)
				case other:
					drivers++
					if !strings.Contains(in.GainNote, tc.phase) {
						t.Errorf("driver row at %s: %q, want the other half %s", in.Net, in.GainNote, tc.phase)
					}
				}
			}
			if drivers != 1 {
				t.Errorf("%d rows gain to a half, want the driver's alone", drivers)
			}
			for net, want := range map[string]float64{tc.driverNet: tc.driver, tc.halfNet: tc.half} {
				if want == 0 {
					continue
				}
				if in, ok := rows[net]; !ok || math.Abs(in.Gain-want)/want > 0.01 { // ngspice, above
					t.Errorf("row at %s: ×%.4g to %s, ngspice ×%.4g", net, in.Gain, in.GainTo, want)
				}
			}
		})
	}
}

// TestBiasMultiplierNoInjection: the transistor of a Vbe multiplier
// between a complementary pair's bases holds them apart, its capacitor
// holds them together for the signal; the trade injects on the pair's
// bases and the driver's, never on the multiplier's base (common
// practice). Review19 b04's table injected at "Q4 base ×0.284 to q2_b":
// the divider's loss quoted as a stage gain. The pair's diode-biased
// kin (review18 b04, review13 b04) keep their rows.
func TestBiasMultiplierNoInjection(t *testing.T) {
	cases := []struct {
		file   string
		absent string   // no row here
		rows   []string // these rows stay
	}{
		{"review19/b04", "q4_b", []string{"q2_b", "q1_c", "q1_b"}},
		{"pairs/comp-vbe", "vm_b", []string{"q2_b", "drv", "q1_b"}},
	}
	for _, tc := range cases {
		t.Run(tc.file, func(t *testing.T) {
			_, g := build(t, filepath.Join("..", "..", "..", "testdata", tc.file+".toml"))
			rows := map[string]bool{}
			for _, in := range g.Inject {
				rows[in.Net] = true
				if in.Net == tc.absent || in.GainTo == tc.absent {
					t.Errorf("row at %s gains ×%.3g to %s: the multiplier is no signal stage", in.Net, in.Gain, in.GainTo)
				}
			}
			for _, n := range tc.rows {
				if !rows[n] {
					t.Errorf("no row at %s", n)
				}
			}
		})
	}
}

func contains(list []string, s string) bool {
	for _, x := range list {
		if x == s {
			return true
		}
	}
	return false
}
