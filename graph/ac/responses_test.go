package ac

import (
	"reflect"
	"testing"
)

// A setting made from another setting's netlist (atSetting) is the
// netlist an elaboration at that setting gives, element for element and
// value for value, on every example and the loop fixtures, at the ends,
// the middle and a setting between. Derived from the code it stands in
// for: the two must not differ by a bit.
func TestAtSettingIsElaboration(t *testing.T) {
	checked := 0
	for _, lc := range loopCircuits(t, 5) {
		f, c := lc.file, lc.c
		rs := NewResponses(c)
		if _, err := rs.model(Options{VarFrac: 0.5, VarSet: true}); err != nil || rs.base == nil {
			continue // nothing to make other settings from
		}
		for _, frac := range []float64{0, 0.3, 1} {
			o := Options{VarFrac: frac, VarSet: true}
			got := rs.base.atSetting(o)
			want, err := elaborate(c, o)
			if err != nil || got == nil {
				continue
			}
			if !reflect.DeepEqual(got.nl, want) {
				t.Errorf("%s at %g: the netlists differ", f, frac)
			}
			checked++
		}
	}
	if checked < 10 {
		t.Errorf("only %d settings compared", checked)
	}
}
