package align_test

import (
	"path/filepath"
	"strings"
	"testing"
)

// A calibration step the trimmer cannot reach is worth a warning: review16
// a01's VFO tops out at 997.8 kHz with TC1 at 10 pF, the declared band asks
// 1.05 MHz, and TC1 at its least (3 pF) gives only 1.012 MHz (the reviewer's
// ngspice deck, testdata/review16/spice/a/c01_loop_tc1min.cir); the bench
// VFO fixture likewise stops at 5.664 MHz against 5.7 MHz (pare's solver
// with its trimmer at 3 pF). The estimate is the tank formula C ∝ 1/f².
func TestTrimmerCannotReachTheTop(t *testing.T) {
	cases := []struct{ file, want string }{
		{filepath.Join("..", "..", "..", "testdata", "review16", "a01.toml"), "TC1 at its least (3 pF) brings the top of the coverage only to about 1.012 MHz: the step's 1.05 MHz is beyond its reach"},
		{filepath.Join("..", "..", "..", "testdata", "good", "review-vfo.toml"), "C3 at its least (3 pF) brings the top of the coverage only to about 5.664 MHz"},
	}
	for _, tc := range cases {
		_, g := build(t, tc.file)
		found := false
		for _, w := range g.Warnings {
			found = found || strings.Contains(w, tc.want)
		}
		if !found {
			t.Errorf("%s: no warning %q in %q", filepath.Base(tc.file), tc.want, g.Warnings)
		}
	}
}
