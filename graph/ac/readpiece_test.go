package ac

import (
	"math/cmplx"
	"testing"

	"pare/internal/synth"
)

// A tank read where it is driven is solved on the part of its block the
// nodes read depend on (readPiece): on the synthetic bank's first valve
// channel as captured (devices at full gain, so the diode detector ties
// the IF strip in both ways) the mixer's grid and oscillator tanks leave
// out the audio valve's anode and cathode, whose currents its grid's
// voltage sets and nothing returns, and give the whole block's impedance
// to rounding, across the medium-wave band and the oscillator's (with the
// devices made quiet, rules/stages' tracking walk, the piece is 13 of 24
// unknowns). The check values are the solver's own whole-block
// solution; the bound, 10⁻¹⁰ of the value, is rounding in a system of
// some thirty unknowns eliminated in two orders, well under the 10⁻⁶ a
// peak search resolves.
func TestReadPieceIsTheWholeBlock(t *testing.T) {
	c, err := synth.BankCircuit(300, 1)
	if err != nil {
		t.Fatal(err)
	}
	rs := NewResponses(c)
	for _, tc := range []struct{ a, b string }{
		{"rf_tank_1", ""}, {"osc_tank_1", ""}, {"osc_tank_1", "osc_pad_1"},
	} {
		var r *Response
		if tc.b == "" {
			r, err = rs.Transimpedance(tc.a, tc.a, Options{})
		} else {
			r, err = rs.Across(tc.a, tc.b, Options{})
		}
		if err != nil {
			t.Fatal(err)
		}
		b := tc.b
		if b == "" {
			b = tc.a
		}
		m, n, k, err := rs.nodes(Options{}, tc.a, b)
		if tc.b == "" {
			k = 0
		}
		if err != nil {
			t.Fatal(err)
		}
		isHeld := heldSet(len(m.nl.nodes), -1, otherInputs(c, m.nl, -1))
		whole := m.component(n, isHeld)
		wr := &Response{s: assemble(m.nl, -1, isHeld, whole), in: n, out: n, back: k, current: true}
		t.Logf("%s %s: %d unknowns, the whole block %d", tc.a, tc.b, r.s.n, wr.s.n)
		if r.s.n >= wr.s.n {
			t.Errorf("%s: %d unknowns solved, the whole block has %d: nothing cut", tc.a, r.s.n, wr.s.n)
		}
		for f := 400e3; f <= 3e6; f *= 1.07 {
			got, err1 := r.At(f)
			want, err2 := wr.At(f)
			if err1 != nil || err2 != nil || cmplx.Abs(got-want) > 1e-10*cmplx.Abs(want) {
				t.Errorf("%s %s at %g Hz: piece %v (%v), whole block %v (%v)", tc.a, tc.b, f, got, err1, want, err2)
			}
		}
	}
}

// A response carried to another gang setting (retuned) is the response a
// Responses elaborated and assembled at that setting afresh gives, to the
// bit: the bank's mixer tanks at both ends of the travel and between,
// the first response asked for at mid travel. Derived from the code it
// stands in for.
func TestRetunedIsAssembled(t *testing.T) {
	c, err := synth.BankCircuit(300, 1)
	if err != nil {
		t.Fatal(err)
	}
	carried := NewResponses(c)
	if _, err := carried.Transimpedance("rf_tank_1", "rf_tank_1", Options{VarFrac: 0.5, VarSet: true}); err != nil {
		t.Fatal(err)
	}
	for _, net := range []string{"rf_tank_1", "osc_tank_1"} {
		for _, frac := range []float64{0, 0.3, 1} {
			o := Options{VarFrac: frac, VarSet: true}
			got, err1 := carried.Transimpedance(net, net, o)
			want, err2 := NewResponses(c).Transimpedance(net, net, o)
			if err1 != nil || err2 != nil {
				t.Fatal(err1, err2)
			}
			for f := 400e3; f <= 3e6; f *= 1.3 {
				g, _ := got.At(f)
				w, _ := want.At(f)
				if g != w {
					t.Errorf("%s at %g, %g Hz: carried %v, assembled %v", net, frac, f, g, w)
				}
			}
		}
	}
	if len(carried.shapes) != 2 {
		t.Errorf("%d shapes kept, want 2 (one per tank)", len(carried.shapes))
	}
}
