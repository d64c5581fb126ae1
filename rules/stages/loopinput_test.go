package stages

import (
	"math"
	"strings"
	"testing"
)

// An oscillator whose tank carries the declared input: the solver holds an
// input at 0 V, which shorts the tank, and the loop used to read "does not
// oscillate as drawn" where the reviewer's ngspice transient of the same
// capture (testdata/review20/spice/b, c01.cir) runs at 2.673–3.088 MHz. With
// the input open the loop starts, and the stage says why it was opened.
func TestLoopFreesInputOnItsTank(t *testing.T) {
	const spiceLo, spiceHi = 2.673e6, 3.088e6 // reviewer's ngspice transient, c01.cir
	cases := []struct {
		name     string
		inputs   []string
		wantFlag bool
	}{
		{"input on the tank", []string{"osc_tank"}, true},
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
