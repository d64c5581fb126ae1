package ac

import (
	"fmt"
	"math/cmplx"
	"os"
	"strings"
	"testing"

	"pare/graph"
	"pare/internal/synth"
)

// TestBlockProbeMatchesWhole: a response solved on the block of the matrix
// its source drives equals, to the last bit, the response solved on the
// whole matrix (Transfer and Impedance, which the ngspice tests check): the
// blocks of a block-diagonal LU never meet. With a second copy beside it
// (another block to leave out) the whole matrix is factored afresh whenever
// a reused pivot of either block grows too small, which may pick other
// pivots for this block than its own history would: equal then to rounding
// (a relative 1e-12, derived from the pivot threshold 1e-3 and double
// precision, with room to spare).
func TestBlockProbeMatchesWhole(t *testing.T) {
	files := append([]string{"testdata/two-inputs.toml", "testdata/hartley-xtal.toml", "testdata/if-pair.toml"}, exampleFiles(t)...)
	for i := 0; i < 2*len(files); i++ {
		f, n := files[i/2], 1+i%2
		c := copies(t, f, n)
		m, err := newModel(c, Options{VarSet: true, VarFrac: 0.3}, &dcShare{})
		if err != nil {
			t.Fatal(err)
		}
		freqs := logSweep(c.Band.Min, c.Band.Max, 7)
		for _, in := range c.Inputs {
			for _, out := range c.Outputs {
				if out == in {
					continue
				}
				want, err := Transfer(c, in, out, freqs, m.opt())
				if err != nil {
					t.Fatalf("%s: %v", f, err)
				}
				checkProbe(t, m, f, n, "transfer", in, out, freqs, want)
			}
			want, err := Impedance(c, in, freqs, m.opt())
			if err != nil {
				// An open input: the block must refuse it in the same words.
				if _, perr := newProbe(m, "impedance", in, ""); perr == nil || perr.Error() != err.Error() {
					t.Errorf("%s: Z(%s): whole %v, block %v", f, in, err, perr)
				}
				continue
			}
			checkProbe(t, m, f, n, "impedance", in, "", freqs, want)
		}
	}
}

func (m *model) opt() Options { return Options{VarSet: true, VarFrac: 0.3} }

func checkProbe(t *testing.T, m *model, file string, n int, what, from, to string, freqs []float64, want []complex128) {
	t.Helper()
	p, err := newProbe(m, what, from, to)
	if err != nil {
		t.Fatalf("%s: %s %s→%s: %v", file, what, from, to, err)
	}
	for k, f := range freqs {
		got, err := p.at(f)
		if err != nil {
			t.Fatalf("%s: %v", file, err)
		}
		if d := cmplx.Abs(got - want[k]); (n == 1 && d != 0) || d > 1e-12*cmplx.Abs(want[k]) {
			t.Errorf("%s: %s %s→%s at %g Hz: block %v, whole %v", file, what, from, to, f, got, want[k])
		}
		if p.silent && got != 0 {
			t.Errorf("%s: %s→%s marked zero by structure but is %v", file, from, to, got)
		}
	}
}

// copies loads n renamed copies of a netlist, joined only through AC ground.
func copies(t *testing.T, file string, n int) *graph.Circuit {
	t.Helper()
	src, err := os.ReadFile(file)
	if err != nil {
		t.Fatal(err)
	}
	b, err := synth.Copies(src, n)
	if err != nil {
		t.Fatal(err)
	}
	return mustParse(t, string(b))
}

// TestCompareCountsSilentTransfers: of n copies' n inputs × n outputs, the
// n·(n−1) transfers between copies are zero by construction (the copies
// share only AC-ground nets) and are counted in a note, not listed; the n
// within a copy are compared as in a single copy.
func TestCompareCountsSilentTransfers(t *testing.T) {
	for _, n := range []int{1, 3} {
		c := copies(t, "testdata/triode-stage.toml", n)
		r, err := Compare(c, c.Clone(), CompareOptions{})
		if err != nil {
			t.Fatal(err)
		}
		transfers := 0
		for _, p := range r.Pairs {
			if p.What == "transfer" {
				transfers++
			}
		}
		in, out := len(c.Inputs)/n, len(c.Outputs)/n
		if want := n * in * out; transfers < want {
			t.Errorf("%d copies: %d transfers listed, want at least %d", n, transfers, want)
		}
		note := fmt.Sprintf("%d transfer(s) not compared", n*(n-1)*in*out)
		found := strings.Contains(strings.Join(r.Notes, "\n"), note)
		if found != (n > 1) {
			t.Errorf("%d copies: note %q present %v, notes %q", n, note, found, r.Notes)
		}
	}
}
