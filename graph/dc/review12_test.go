package dc

import (
	"math"
	"path/filepath"
	"testing"

	"pare/graph"
)

// The reservoir's ripple on review 12's mains supply (250-0-250 V, valve
// rectifier, 32 µF, choke filter): the reviewer's ngspice transient
// (testdata/review12/spice/c08.cir, docs/references.md §30) gives 6.69 V
// p-p (303.87 − 297.18 V) whose fundamental at 100 Hz is 2 × 2.810 V =
// 5.62 V p-p, 0.84 of the swing: not a sawtooth's 2/π (4.26 V), which read
// the hum left after the filter 25 % low. The estimate's own waveform gives
// its fundamental.
func TestReservoirRippleFundamental(t *testing.T) {
	c, err := graph.LoadFile(filepath.Join("..", "..", "testdata", "review12", "c08.toml"))
	if err != nil {
		t.Fatal(err)
	}
	pt, err := Solve(c)
	if err != nil {
		t.Fatal(err)
	}
	e := pt.estimateFor("ht1")
	if e == nil {
		t.Fatal("no estimate on ht1")
	}
	for _, tc := range []struct {
		what      string
		got, want float64
	}{
		{"ripple p-p", e.Ripple, 6.69},
		{"ripple fundamental p-p", e.Fundamental, 5.62},
	} {
		if math.Abs(tc.got-tc.want) > 0.03*tc.want {
			t.Errorf("%s %.3g V, ngspice %.3g V: more than 3 %% apart", tc.what, tc.got, tc.want)
		}
	}
}
