package ac

import (
	"math"
	"path/filepath"
	"testing"

	"pare/graph"
)

// The scan by strides finds the crossings the scan of every grid point
// finds, at the same frequencies and margins (to parts in 10¹², where a
// fresh factorisation at another frequency moves the last bits): every
// active part of the package's circuits, the flagship example and the
// oscillator fixtures, at both ends of the gang, and the loop seen the
// other way round at full capacitance. The check values are the solver's
// own scan of every point.
func TestLoopScanIsEveryPoint(t *testing.T) {
	var files []string
	for _, pat := range []string{"testdata/*.toml", "../../examples/club-receiver.toml", "../../testdata/osc/*.toml"} {
		m, err := filepath.Glob(pat)
		if err != nil {
			t.Fatal(err)
		}
		files = append(files, m...)
	}
	crossings := 0
	for _, file := range files {
		c, err := graph.LoadFile(file)
		if err != nil {
			continue // the package's circuits of bad input
		}
		n0 := crossings
		for _, p := range c.Parts {
			if p.Kind != graph.Valve && p.Kind != graph.BJT && p.Kind != graph.FET {
				continue
			}
			for _, frac := range []float64{0, 1} {
				for _, inv := range []bool{false, frac == 1} {
					o := LoopOptions{Options: Options{VarFrac: frac, VarSet: true}, Inverted: inv}
					got, okG := scanWith(t, c, p.Ref, o, scanStride)
					want, okW := scanWith(t, c, p.Ref, o, 1)
					if okG != okW || !sameCrossings(got, want) {
						t.Errorf("%s %s gang %g inverted %v: by strides %v %+v, every point %v %+v", file, p.Ref, frac, inv, okG, got, okW, want)
					}
					crossings += len(want)
				}
			}
		}
		t.Logf("%s: %d crossings", file, crossings-n0)
	}
	if crossings < 100 {
		t.Errorf("%d crossings compared, want at least 100: the test checks too little", crossings)
	}
}

// scanWith is the loop search of ref on a system of its own, scanned with
// the stride given; ok is false where the search fails.
func scanWith(t *testing.T, c *graph.Circuit, ref string, o LoopOptions, stride int) ([]Crossing, bool) {
	t.Helper()
	ls, err := NewLoops(c).system(ref, o.Options)
	if err != nil {
		return nil, false
	}
	l, err := ls.findStride(o, stride)
	return l.Crossings, err == nil
}

func sameCrossings(a, b []Crossing) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if math.Abs(a[i].F-b[i].F) > 1e-12*b[i].F || math.Abs(a[i].GainDB-b[i].GainDB) > 1e-9 {
			return false
		}
	}
	return true
}
