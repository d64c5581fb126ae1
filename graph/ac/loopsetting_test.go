package ac

import "testing"

// TestLoopsSettingIsElaborated: a Loops asked at several gang settings
// elaborates the first and makes each other from it (atSetting); every
// loop system it cuts is the one a Loops elaborated at that setting alone
// cuts: the same digest (the block's size, pattern, stamps and
// coefficients to the bit, loopKey) and the same error, for every
// amplifying part of the examples and the loop fixtures, walked from the
// least capacitance to the full and back through the middle as a tracking
// walk's bisections come back.
func TestLoopsSettingIsElaborated(t *testing.T) {
	checked, derived := 0, 0
	for _, lc := range loopCircuits(t, 6, "testdata/hartley-xtal.toml", "../../testdata/good/review-ifstrip.toml") {
		f, c := lc.file, lc.c
		for _, p := range c.Parts {
			if !p.IsActive() {
				continue
			}
			walked := NewLoops(c)
			for _, frac := range []float64{0, 1, 0.5, 0.25, 0.3} {
				o := Options{VarFrac: frac, VarSet: true}
				got, err1 := walked.system(p.Ref, o)
				want, err2 := NewLoops(c).system(p.Ref, o)
				if (err1 == nil) != (err2 == nil) || err1 != nil && err1.Error() != err2.Error() {
					t.Errorf("%s %s at %g: errors %v (walked) and %v (alone)", f, p.Ref, frac, err1, err2)
					continue
				}
				if err1 != nil {
					continue
				}
				if got.key(LoopOptions{}, 0) != want.key(LoopOptions{}, 0) {
					t.Errorf("%s %s at %g: the walked Loops' system differs from one elaborated there", f, p.Ref, frac)
				}
				checked++
				if walked.base != nil && walked.nls[[2]float64{1, frac}].m.from != nil {
					derived++
				}
			}
		}
	}
	if checked < 50 || derived < 20 {
		t.Errorf("only %d loop systems compared, %d of them made from another setting", checked, derived)
	}
}
