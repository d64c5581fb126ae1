package ac

import (
	"cmp"
	"errors"
	"fmt"
	"math"
	"slices"
)

// Entry is one coefficient of a real linear system: A[Row][Col] += V.
// Entries at the same place add up, as stamps of a nodal matrix do.
type Entry struct {
	Row, Col int
	V        float64
}

// ErrSingular is returned by SolveReal when the equations do not fix every
// unknown (a node that nothing connects to the rest).
var ErrSingular = errors.New("singular system")

// SolveReal solves A·x = b for a real n×n system given by its entries, with
// the solver that runs the AC analysis: reverse Cuthill–McKee order and the
// sparse LU with threshold partial pivoting (sparse.go). It is for the small
// networks other packages cut from a circuit (the resistance from a net to
// ground, the capacitance a set of capacitors presents between two nets):
// one linear solver for the whole program. b is not changed.
func SolveReal(n int, entries []Entry, b []float64) ([]float64, error) {
	if len(b) != n {
		return nil, fmt.Errorf("right-hand side of length %d for %d unknowns", len(b), n)
	}
	f, err := factorReal(n, entries)
	if err != nil {
		return nil, err
	}
	return f.solve(b)
}

// realFactors is a real system ordered and factored once, for as many
// right-hand sides as a caller has: each solve is what SolveReal gives for
// it, to the bit, at the cost of the substitutions alone.
type realFactors struct {
	n    int
	perm []int
	f    *lu
}

func factorReal(n int, entries []Entry) (*realFactors, error) {
	if n == 0 {
		return &realFactors{}, nil
	}
	for _, e := range entries {
		if e.Row < 0 || e.Row >= n || e.Col < 0 || e.Col >= n {
			return nil, fmt.Errorf("entry (%d, %d) outside a %d×%d system", e.Row, e.Col, n, n)
		}
	}
	perm := realOrder(n, entries)
	a := realCSC(n, entries, perm)
	identity := make([]int, n)
	for i := range identity {
		identity[i] = i
	}
	f := newLU(n, identity)
	if err := f.factor(&a); err != nil {
		var s *errSingular
		if errors.As(err, &s) {
			return nil, ErrSingular
		}
		return nil, err
	}
	return &realFactors{n: n, perm: perm, f: f}, nil
}

// solve solves for one right-hand side of length n; b is not changed.
func (r *realFactors) solve(b []float64) ([]float64, error) {
	if len(b) != r.n {
		return nil, fmt.Errorf("right-hand side of length %d for %d unknowns", len(b), r.n)
	}
	if r.n == 0 {
		return []float64{}, nil
	}
	x := make([]complex128, r.n)
	for i, v := range b {
		x[r.perm[i]] = complex(v, 0)
	}
	r.f.solve(x, make([]complex128, r.n))
	out := make([]float64, r.n)
	for i := range out {
		v := real(x[r.perm[i]])
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return nil, ErrSingular
		}
		out[i] = v
	}
	return out, nil
}

// realOrder numbers the unknowns in reverse Cuthill–McKee order, as
// newSystem does for the AC matrix: perm[old] is the new index.
func realOrder(n int, entries []Entry) []int {
	adj := make([][]int, n)
	for _, e := range entries {
		if e.Row != e.Col {
			adj[e.Row] = append(adj[e.Row], e.Col)
			adj[e.Col] = append(adj[e.Col], e.Row)
		}
	}
	for i := range adj {
		adj[i] = dedupe(adj[i])
	}
	perm := make([]int, n)
	for k, old := range rcm(adj) {
		perm[old] = k
	}
	return perm
}

// realCSC compresses the entries, renumbered by perm, into a column-form
// matrix, adding entries at one place in the order given so the sums are
// the same on every run.
func realCSC(n int, entries []Entry, perm []int) csc {
	type ent struct {
		row, col, ord int
		v             float64
	}
	ents := make([]ent, len(entries))
	for i, e := range entries {
		ents[i] = ent{perm[e.Row], perm[e.Col], i, e.V}
	}
	slices.SortFunc(ents, func(x, y ent) int {
		if x.col != y.col {
			return cmp.Compare(x.col, y.col)
		}
		if x.row != y.row {
			return cmp.Compare(x.row, y.row)
		}
		return cmp.Compare(x.ord, y.ord)
	})
	a := csc{n: n, p: make([]int, n+1)}
	for i, e := range ents {
		if i == 0 || e.row != ents[i-1].row || e.col != ents[i-1].col {
			a.i = append(a.i, e.row)
			a.x = append(a.x, 0)
			a.p[e.col+1]++
		}
		a.x[len(a.x)-1] += complex(e.v, 0)
	}
	for j := 0; j < n; j++ {
		a.p[j+1] += a.p[j]
	}
	return a
}
