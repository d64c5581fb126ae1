package ac

import (
	"math"
	"math/rand"
	"slices"
	"testing"
)

// TestSolvePartIsSolve: on banded matrices with random complex entries of
// wide range, and on one whose bound passes the largest double (a pivot of
// 1e-305), solvePart gives solve's numbers to the bit at every step it
// reports solved, and the whole solution when it reports the bound failed;
// the bound both holds and fails among the cases.
func TestSolvePartIsSolve(t *testing.T) {
	rng := rand.New(rand.NewSource(7))
	held, failed := 0, 0
	for trial := range 200 {
		n := 2 + rng.Intn(60)
		a := bandMatrix(rng, n, trial%3)
		if trial == 0 {
			a.x[0] = 1e-305 // the first column's diagonal (its first entry)
		}
		f := newLU(n, identityOrder(n))
		if err := f.factor(a); err != nil {
			continue
		}
		rhs := make([]complex128, n)
		for i := range rhs {
			rhs[i] = complex(rng.NormFloat64(), rng.NormFloat64()) * complex(math.Pow(10, float64(rng.Intn(600)-300)), 0)
		}
		want := slices.Clone(rhs)
		f.solve(want, make([]complex128, n))
		from := rng.Intn(n + 1)
		got := slices.Clone(rhs)
		proved := f.solvePart(got, make([]complex128, n), from, make([]float64, n))
		lo := 0
		switch {
		case proved:
			lo = from
			held++
		case from > 0:
			failed++
		}
		for k := lo; k < n; k++ {
			if !sameBits(real(got[k]), real(want[k])) || !sameBits(imag(got[k]), imag(want[k])) {
				t.Fatalf("trial %d (from %d, proved %v): step %d %v, solve %v", trial, from, proved, k, got[k], want[k])
			}
		}
	}
	if held == 0 || failed == 0 {
		t.Errorf("bound held %d times and failed %d: want both", held, failed)
	}
}

// bandMatrix is an n×n matrix with the diagonal and `width` bands either
// side, entries of magnitudes from 1e-200 to 1e200, diagonal dominant
// enough to keep its pivots.
func bandMatrix(rng *rand.Rand, n, width int) *csc {
	a := &csc{n: n, p: make([]int, n+1)}
	for j := range n {
		for i := max(0, j-width); i <= min(n-1, j+width); i++ {
			v := complex(rng.NormFloat64(), rng.NormFloat64())
			if i == j {
				v += 10
			}
			a.i = append(a.i, i)
			a.x = append(a.x, v*complex(math.Pow(10, float64(rng.Intn(400)-200)), 0))
		}
		a.p[j+1] = len(a.i)
	}
	return a
}

func identityOrder(n int) []int {
	q := make([]int, n)
	for i := range q {
		q[i] = i
	}
	return q
}

// TestBoundHoldsOnLadder: on the matrix of an RC ladder of 3,000 sections
// (1 kΩ, 10 nF, as bench/gen writes it) at frequencies where its far end
// falls into subnormal numbers, the bound shows every unknown finite, so
// the back substitution stops at the output, whose value is solve's.
func TestBoundHoldsOnLadder(t *testing.T) {
	const n, g, c = 3000, 1e-3, 10e-9
	for _, hz := range []float64{10, 300, 1e3, 5e3, 1e6} {
		w := 2 * math.Pi * hz
		a := &csc{n: n, p: make([]int, n+1)}
		for j := range n {
			diag := complex(2*g, w*c)
			if j == n-1 {
				diag = complex(g, w*c)
			}
			for i := max(0, j-1); i <= min(n-1, j+1); i++ {
				v := complex(-g, 0)
				if i == j {
					v = diag
				}
				a.i = append(a.i, i)
				a.x = append(a.x, v)
			}
			a.p[j+1] = len(a.i)
		}
		f := newLU(n, identityOrder(n))
		if err := f.factor(a); err != nil {
			t.Fatal(err)
		}
		rhs := make([]complex128, n)
		rhs[0] = complex(g, 0) // the input driven at 1 V through the first resistor
		want := slices.Clone(rhs)
		f.solve(want, make([]complex128, n))
		got := slices.Clone(rhs)
		if !f.solvePart(got, make([]complex128, n), n-1, make([]float64, n)) {
			t.Errorf("%g Hz: the bound failed", hz)
		}
		if !sameBits(real(got[n-1]), real(want[n-1])) || !sameBits(imag(got[n-1]), imag(want[n-1])) {
			t.Errorf("%g Hz: output %v, solve %v", hz, got[n-1], want[n-1])
		}
	}
}
