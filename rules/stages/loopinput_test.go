package stages

import (
	"math"
	"slices"
	"strings"
	"testing"

	"pare/graph"
)

// An oscillator whose tank carries the declared input: the solver held an
// input at 0 V, which shorted the tank, and the loop used to read "does not
// oscillate as drawn" where the reviewer's ngspice transient of the same
// capture (testdata/review20/spice/b, c01.cir) runs at 2.673–3.088 MHz. The
// loop search now leaves an input a tuned circuit stands across free in the
// first place (graph/ac loopheld.go, docs/references.md §53): the loop
// starts as the set runs, with nothing to reopen and so no flag.
func TestLoopFreesInputOnItsTank(t *testing.T) {
	const spiceLo, spiceHi = 2.673e6, 3.088e6 // reviewer's ngspice transient, c01.cir
	cases := []struct {
		name     string
		inputs   []string
		wantFlag bool
	}{
		{"input on the tank", []string{"osc_tank"}, false},
		{"input on the emitter tap, as captured", nil, false},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			st := blockedColpitts(t, tc.inputs)
			if st == nil || len(st.Loop) == 0 {
				t.Fatal("no blocked Colpitts with a loop found")
			}
			lo, hi, _, _, ok := st.Loop[0].Range()
			if !ok || math.Abs(lo/spiceLo-1) > 0.01 || math.Abs(hi/spiceHi-1) > 0.01 {
				t.Errorf("loop %s–%s (ok %v), want within 1 %% of %s–%s", hzText(lo), hzText(hi), ok, hzText(spiceLo), hzText(spiceHi))
			}
			var flagged, dead bool
			for _, f := range st.Flags {
				flagged = flagged || strings.Contains(f, "declared input osc_tank open")
				dead = dead || strings.Contains(f, "does not oscillate")
			}
			if flagged != tc.wantFlag || dead {
				t.Errorf("flags %q: want the opened-input flag %v and no 'does not oscillate'", st.Flags, tc.wantFlag)
			}
		})
	}
}

// The reopening still serves an untuned input on the loop: review14 b01's
// RC phase-shift oscillator with its input declared on the ladder's middle
// node ps2 (C2, C3, R5: no inductance, so the loop search holds it, and
// held the ladder cannot turn the phase). The stage carries the loop with
// ps2 open, ngspice's return ratio with nothing on the ladder (1168.24 Hz,
// +7.656 dB on testdata/review14/spice/b01_return.cir, docs/references.md
// §37; 0.5 % and 0.5 dB, pare's bias from its own DC solve), and says why.
func TestLoopReopensAnUntunedInput(t *testing.T) {
	c, err := graph.LoadFile("../../testdata/review14/b01.toml")
	if err != nil {
		t.Fatal(err)
	}
	c.Inputs = []string{"ps2"}
	for _, st := range findReduced(t, c) {
		for _, l := range st.Loop {
			if l.Device != "Q1" {
				continue
			}
			lo, hi, mLo, mHi, ok := l.Range()
			if !ok || math.Abs(lo/1168.24-1) > 0.005 || math.Abs(hi/1168.24-1) > 0.005 || math.Abs(mLo-7.656) > 0.5 || math.Abs(mHi-7.656) > 0.5 {
				t.Errorf("loop %s–%s %+.2f..%+.2f dB (ok %v), ngspice 1168.24 Hz +7.656 dB", hzText(lo), hzText(hi), mLo, mHi, ok)
			}
			if !slices.ContainsFunc(st.Flags, func(f string) bool { return strings.Contains(f, "declared input ps2 open") }) {
				t.Errorf("flags %q: want the opened-input flag for ps2", st.Flags)
			}
			return
		}
	}
	t.Fatal("no stage carries Q1's loop")
}
