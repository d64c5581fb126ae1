package ac

import (
	"fmt"
	"path/filepath"
	"testing"
)

// The examples' oscillators are checked as the fixtures are, at both ends
// of the dial (where the margin is least and most): an example must be a working design, so
// each must have a 0° crossing with a margin above 0 dB that a kicked
// ngspice transient of the same linear circuit confirms (it grows), at the
// frequency pare gives.
func TestExampleLoopsAgainstNgspiceTransient(t *testing.T) {
	if testing.Short() {
		t.Skip("transients")
	}
	bin := needNgspice(t)
	for _, tc := range []struct{ file, ref string }{
		{"transistor-front-end.toml", "Q1"}, // self-oscillating mixer, feedback winding in the collector
	} {
		file := filepath.Join("..", "..", "examples", tc.file)
		for _, gang := range []float64{0, 1} {
			t.Run(fmt.Sprintf("%s/%s/gang%.1f", tc.file, tc.ref, gang), func(t *testing.T) {
				t.Parallel()
				c := load(t, file)
				loop, err := FindLoop(c, tc.ref, LoopOptions{Options: Options{VarFrac: gang, VarSet: true}})
				if err != nil {
					t.Fatal(err)
				}
				// Common practice: a few dB of start-up margin; an example
				// that does not start, or one driven 20 dB into limiting, is
				// not a design to show.
				if loop.F == 0 || loop.MarginDB < 1 || loop.MarginDB > 20 {
					t.Fatalf("%s: loop margin %+.2f dB at %.6g Hz: want 1 to 20 dB", tc.ref, loop.MarginDB, loop.F)
				}
				checkLoopTran(t, bin, c, tc.ref, gang)
			})
		}
	}
}
