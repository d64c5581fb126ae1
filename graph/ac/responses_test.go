package ac

import (
	"reflect"
	"testing"

	"pare/graph"
	"pare/internal/synth"
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

// A supply rail driven to read one decoupler's response feeds every
// stage of a set; the response is solved on the piece that holds its
// output, and gives the numbers, to the bit, of the whole block the rail
// drives (the system solved before): the synthetic bank's decoupled lines
// of its first and last valve channels, from the rail, across three
// decades. The check values are the solver's own whole-block solution.
func TestTransferOutPieceIsTheWholeBlock(t *testing.T) {
	c, err := synth.BankCircuit(300, 1)
	if err != nil {
		t.Fatal(err)
	}
	for _, n := range c.Nets {
		if n.Name == "ht" {
			n.Role = graph.Signal // lifted from AC ground, as the figures drive it
		}
	}
	rs := NewResponses(c)
	for _, out := range []string{"ht_if_1", "ht_pre_1", "ht_if_4"} {
		r, err := rs.Transfer("ht", out, Options{})
		if err != nil {
			t.Fatal(err)
		}
		m, n, k, err := rs.nodes(Options{}, "ht", out)
		if err != nil {
			t.Fatal(err)
		}
		isHeld := heldSet(len(m.nl.nodes), n, otherInputs(c, m.nl, n))
		whole := m.component(n, isHeld)
		wr := &Response{s: assemble(m.nl, n, isHeld, whole), in: n, out: k}
		t.Logf("%s: %d unknowns, the whole block %d", out, r.s.n, wr.s.n)
		if r.s.n*3 > wr.s.n {
			t.Errorf("%s: %d unknowns solved, the whole block has %d: the piece is not cut", out, r.s.n, wr.s.n)
		}
		for f := 10.0; f <= 1e4; f *= 1.5 {
			got, err1 := r.At(f)
			want, err2 := wr.At(f)
			if err1 != nil || err2 != nil || got != want {
				t.Errorf("%s at %g Hz: piece %v (%v), whole block %v (%v)", out, f, got, err1, want, err2)
			}
		}
	}
}
