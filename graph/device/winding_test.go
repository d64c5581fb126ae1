package device_test

import (
	"math"
	"testing"

	"pare/graph"
	"pare/graph/device"
)

// TestWindingLossReferred: a winding's loss is R = ω·L/q at the frequency
// its q is referred to (Winding.QAt) when it has one, else at the ω0 the
// caller gives (the band's centre): the definition of Q (docs/references.md
// §16). 1.147 mH, q 60 at 469.94 kHz: 56.45 Ω; at 920.9 kHz: 110.6 Ω.
func TestWindingLossReferred(t *testing.T) {
	w0 := 2 * math.Pi * math.Sqrt(530e3*1.6e6)
	for _, tc := range []struct {
		qAt, want float64
	}{
		{469.94e3, 2 * math.Pi * 469.94e3 * 1.147e-3 / 60},
		{0, w0 * 1.147e-3 / 60},
	} {
		p := &graph.Part{Ref: "L1", Kind: graph.Inductor, Windings: []graph.Winding{{Name: "12", L: 1.147e-3, From: "1", To: "2", Q: 60, QAt: tc.qAt}}}
		if r := device.WindingLoss(p, w0)[0]; math.Abs(r/tc.want-1) > 1e-12 {
			t.Errorf("q at %g Hz: R %g Ω, want %g Ω", tc.qAt, r, tc.want)
		}
	}
}
