package ac

import (
	"errors"
	"path/filepath"
	"testing"

	"pare/graph"
)

// The loop system cut from the model indexed once (loopSystemIn) is the
// one cut from a copy of the netlist without the device's sources
// (loopSystemOf): the same digest, which covers the block's size, pattern,
// stamps and coefficients to the bit (loopKey), and the same error where
// there is none to solve, for every amplifying part of the examples and
// the loop fixtures at both ends and the middle of the gang. Derived from
// the code it replaces: the two must not differ by a bit.
func TestLoopSystemInIsLoopSystemOf(t *testing.T) {
	checked := 0
	for _, lc := range loopCircuits(t, 6, "testdata/hartley-xtal.toml", "../../testdata/good/review-ifstrip.toml") {
		f, c := lc.file, lc.c
		for _, frac := range []float64{0, 0.5, 1} {
			o := Options{VarFrac: frac, VarSet: true}
			nl, err := elaborate(c, o)
			if err != nil {
				continue // a circuit the model refuses: nothing to cut
			}
			m := indexModel(c, nl)
			for _, p := range c.Parts {
				if !p.IsActive() {
					continue
				}
				want, err1 := loopSystemOf(c, nl, p.Ref, false)
				got, err2 := loopSystemIn(c, m, p.Ref)
				if (err1 == nil) != (err2 == nil) || err1 != nil && err1.Error() != err2.Error() {
					t.Errorf("%s %s at %g: errors %v and %v", f, p.Ref, frac, err1, err2)
					continue
				}
				var fe *FloatingError
				if err1 != nil && !errors.As(err1, &fe) {
					continue
				}
				if err1 == nil && want.key(LoopOptions{}, 0) != got.key(LoopOptions{}, 0) {
					t.Errorf("%s %s at %g: the systems differ", f, p.Ref, frac)
				}
				checked++
			}
		}
	}
	if checked < 20 {
		t.Errorf("only %d loop systems compared", checked)
	}
}

// loopCircuits loads the examples, the loop fixtures and the extra files,
// and fails when fewer than least are found: the circuits the tests that
// hold a faster construction to the one it replaces run over.
func loopCircuits(t *testing.T, least int, extra ...string) []loopCircuit {
	t.Helper()
	files, err := filepath.Glob("../../examples/*.toml")
	if err != nil {
		t.Fatal(err)
	}
	more, _ := filepath.Glob("../../testdata/osc/*.toml")
	files = append(append(files, more...), extra...)
	if len(files) < least {
		t.Fatalf("only %d circuits found", len(files))
	}
	var out []loopCircuit
	for _, f := range files {
		c, err := graph.LoadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		out = append(out, loopCircuit{f, c})
	}
	return out
}

type loopCircuit struct {
	file string
	c    *graph.Circuit
}
