package rules

import (
	"testing"

	"pare/graph/ac"
)

// Every reduction below the ideal view keeps the signal behaviour: the AC
// comparison (transfer from each input to each output and the driving-point
// impedances, swept over every band, gangs at min, mid and max) stays within
// its default tolerance of 0.5 dB and 5° (common practice for a redrawn
// circuit). The ideal view approximates on purpose and is not held to it.
func TestReductionsVerify(t *testing.T) {
	for _, path := range fixtures(t) {
		for _, lvl := range []Level{LevelTidy, LevelSignal} {
			c := loadFile(t, path)
			r, _ := reduceChecked(t, c, Options{Level: lvl})
			rep, err := ac.Compare(c, r, ac.CompareOptions{})
			if err != nil {
				t.Fatalf("%s at %s: %v", path, lvl, err)
			}
			if !rep.OK {
				w, _ := rep.Worst()
				t.Errorf("%s at %s: reduction changes the signal: %s", path, lvl, w)
			}
		}
	}
}
