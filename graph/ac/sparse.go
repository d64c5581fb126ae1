package ac

import (
	"errors"
	"math"
)

// The linear solver. Circuits of the trade are ladders and chains of stages:
// every node touches a handful of others, so the MNA matrix has a few entries
// per row. We order the unknowns with reverse Cuthill–McKee (order.go), which
// gives such matrices a narrow band, then factor with a left-looking sparse
// LU in the manner of Gilbert and Peierls: column by column, a sparse
// triangular solve whose cost is the number of operations actually done, and
// threshold partial pivoting that keeps the diagonal (and so the RCM band)
// unless a diagonal entry is too small next to the column's largest.
// Pivoting is needed because MNA has rows whose diagonal is zero (a node that
// only meets coupled windings, whose conductance appears through the branch
// equations). With a band of width b the work is O(N·b²) per frequency
// point, linear in N for the circuits pare sees.
//
// RCM was chosen over minimum degree because it is short, deterministic with
// index tie-breaks, and for chains it is as good: the fill of a banded matrix
// stays inside the band. After the first frequency point the pivot sequence
// and the fill pattern are reused (a numeric refactorisation, no graph
// search); if a reused pivot becomes too small the factorisation is redone
// with fresh pivoting.

// pivotTol is the threshold for keeping the diagonal pivot: |diag| must be at
// least this fraction of the largest candidate in its column (the value KLU
// uses by default; common practice).
const pivotTol = 1e-3

// errSingular reports a column with no usable pivot.
type errSingular struct{ col int }

func (e *errSingular) Error() string { return "singular matrix" }

var errStalePivot = errors.New("reused pivot too small")

// csc is a square sparse matrix in compressed-column form.
type csc struct {
	n int
	p []int // column pointers, len n+1
	i []int // row indices
	x []complex128
}

// lu is a sparse LU factorisation P·A·Q = L·U.
type lu struct {
	n    int
	q    []int // column order: step k factors column q[k]
	prow []int // pivot row chosen at step k
	pinv []int // step at which row r was chosen
	// L: strictly lower part, unit diagonal implied, row indices as steps.
	lp []int
	li []int
	lx []complex128
	// U: strictly upper part in topological order, row indices as steps; diagonal apart.
	up []int
	ui []int
	ux []complex128
	ud []complex128 // 1/U(k,k): solves multiply, division is far slower
	ai []int        // the step of each entry of A's rows, for refactor

	x      []complex128 // work vector
	mark   []int
	stack  []int
	reach  []int
	frames []frame
	gen    int
	ready  bool
	tiny   bool // finiteBound's note of a tiny value (resolution.go)
}

// frame is one level of the depth-first search in reachOf.
type frame struct{ row, next int }

func newLU(n int, q []int) *lu {
	return &lu{n: n, q: q, x: make([]complex128, n), mark: make([]int, n),
		stack: make([]int, 0, 16), reach: make([]int, 0, 16)}
}

// factor computes the factorisation with pivoting. It records the pivot
// order and patterns for refactor.
func (f *lu) factor(a *csc) error {
	n := f.n
	f.pinv = fill(f.pinv, n, -1)
	f.prow = fill(f.prow, n, -1)
	// L with original row indices during the factorisation.
	f.lp = append(f.lp[:0], 0)
	f.li = f.li[:0]
	f.lx = f.lx[:0]
	f.up = append(f.up[:0], 0)
	f.ui = f.ui[:0]
	f.ux = f.ux[:0]
	f.ud = fill(f.ud, n, 0)
	x := f.x
	for k := 0; k < n; k++ {
		j := f.q[k]
		f.reachOf(a, j)
		for t := a.p[j]; t < a.p[j+1]; t++ {
			x[a.i[t]] += a.x[t]
		}
		// Eliminate with the columns of L already computed, in topological order.
		for _, r := range f.reach {
			s := f.pinv[r]
			if s < 0 {
				continue
			}
			u := x[r]
			if u != 0 {
				for t := f.lp[s]; t < f.lp[s+1]; t++ {
					x[f.li[t]] -= f.lx[t] * u
				}
			}
		}
		// Split into U (pivoted rows) and pivot candidates.
		best, bestAbs := -1, 0.0
		diagAbs := -1.0
		for _, r := range f.reach {
			if f.pinv[r] >= 0 {
				f.ui = append(f.ui, r)
				f.ux = append(f.ux, x[r])
				continue
			}
			v := mag1(x[r])
			if v > bestAbs || best < 0 {
				best, bestAbs = r, v
			}
			if r == j {
				diagAbs = v
			}
		}
		if best < 0 || bestAbs == 0 {
			f.clear()
			return &errSingular{col: j}
		}
		if diagAbs >= pivotTol*bestAbs && diagAbs > 0 {
			best = j
		}
		inv := recip(x[best])
		f.ud[k] = inv
		f.pinv[best] = k
		f.prow[k] = best
		for _, r := range f.reach {
			if f.pinv[r] < 0 {
				f.li = append(f.li, r)
				f.lx = append(f.lx, x[r]*inv)
			}
		}
		f.lp = append(f.lp, len(f.li))
		f.up = append(f.up, len(f.ui))
		f.clear()
	}
	// Rows as steps from here on: refactor and solve work in step space.
	for t, r := range f.li {
		f.li[t] = f.pinv[r]
	}
	for t, r := range f.ui {
		f.ui[t] = f.pinv[r]
	}
	f.ai = f.ai[:0]
	for _, r := range a.i {
		f.ai = append(f.ai, f.pinv[r])
	}
	f.ready = true
	return nil
}

func (f *lu) clear() {
	for _, r := range f.reach {
		f.x[r] = 0
	}
}

// reachOf finds the rows that column j's solve touches, in topological order
// (rows of earlier pivots before the rows they update), by depth-first search
// through the columns of L. Unpivoted rows are leaves.
func (f *lu) reachOf(a *csc, j int) {
	f.gen++
	g := f.gen
	f.reach = f.reach[:0]
	post := f.stack[:0]
	// Iterative DFS; we collect the postorder and reverse it.
	st := f.frames[:0]
	for t := a.p[j]; t < a.p[j+1]; t++ {
		r0 := a.i[t]
		if f.mark[r0] == g {
			continue
		}
		f.mark[r0] = g
		st = append(st[:0], frame{r0, -1})
		for len(st) > 0 {
			top := &st[len(st)-1]
			s := f.pinv[top.row]
			if s < 0 {
				post = append(post, top.row)
				st = st[:len(st)-1]
				continue
			}
			if top.next < 0 {
				top.next = f.lp[s]
			}
			pushed := false
			for top.next < f.lp[s+1] {
				r := f.li[top.next]
				top.next++
				if f.mark[r] != g {
					f.mark[r] = g
					st = append(st, frame{r, -1})
					pushed = true
					break
				}
			}
			if !pushed {
				post = append(post, top.row)
				st = st[:len(st)-1]
			}
		}
	}
	for i := len(post) - 1; i >= 0; i-- {
		f.reach = append(f.reach, post[i])
	}
	f.stack = post[:0]
	f.frames = st[:0]
}

// refactor recomputes the numbers of a factorisation of a matrix with the
// same pattern, keeping the pivot sequence. It returns errStalePivot when a
// kept pivot has become too small, and the caller factors afresh.
func (f *lu) refactor(a *csc) error {
	x := f.x // indexed by step here
	ai := f.ai[:len(a.i)]
	for k := 0; k < f.n; k++ {
		j := f.q[k]
		for t := a.p[j]; t < a.p[j+1]; t++ {
			x[ai[t]] += a.x[t]
		}
		for t := f.up[k]; t < f.up[k+1]; t++ {
			s := f.ui[t]
			u := x[s]
			f.ux[t] = u
			x[s] = 0
			if u != 0 {
				for m := f.lp[s]; m < f.lp[s+1]; m++ {
					x[f.li[m]] -= f.lx[m] * u
				}
			}
		}
		piv := x[k]
		x[k] = 0
		pa := mag1(piv)
		maxL := 0.0
		for m := f.lp[k]; m < f.lp[k+1]; m++ {
			if v := mag1(x[f.li[m]]); v > maxL {
				maxL = v
			}
		}
		if pa == 0 || pa < pivotTol*maxL {
			for m := f.lp[k]; m < f.lp[k+1]; m++ {
				x[f.li[m]] = 0
			}
			for i := range x {
				x[i] = 0
			}
			return errStalePivot
		}
		inv := recip(piv)
		f.ud[k] = inv
		for m := f.lp[k]; m < f.lp[k+1]; m++ {
			r := f.li[m]
			f.lx[m] = x[r] * inv
			x[r] = 0
		}
	}
	return nil
}

// solve overwrites b (indexed by unknown) with A⁻¹·b, using y as scratch of length n.
func (f *lu) solve(b, y []complex128) {
	f.forward(b, y)
	f.backward(y, 0)
	for k := 0; k < f.n; k++ {
		b[f.q[k]] = y[k]
	}
}

// forward permutes b into y and solves L·y = P·b in place.
func (f *lu) forward(b, y []complex128) {
	for k := 0; k < f.n; k++ {
		y[k] = b[f.prow[k]]
	}
	for k := 0; k < f.n; k++ {
		v := y[k]
		if v == 0 {
			continue
		}
		for t := f.lp[k]; t < f.lp[k+1]; t++ {
			y[f.li[t]] -= f.lx[t] * v
		}
	}
}

// backward solves U·x = y in place, from the last step down to step from:
// the steps below it are left part done (a step's value is final once its
// column is reached, and later columns only change lower steps).
func (f *lu) backward(y []complex128, from int) {
	for k := f.n - 1; k >= from; k-- {
		v := y[k] * f.ud[k]
		y[k] = v
		if v == 0 || k == from {
			continue
		}
		for t := f.up[k]; t < f.up[k+1]; t++ {
			y[f.ui[t]] -= f.ux[t] * v
		}
	}
}

// decompose factors a, reusing the previous pivot sequence when there is one.
func (f *lu) decompose(a *csc) error {
	if f.ready {
		if err := f.refactor(a); err == nil {
			return nil
		}
		f.ready = false
	}
	return f.factor(a)
}

// mag1 is |re|+|im|: within a factor √2 of the modulus, and cheap enough
// for pivot comparisons, which only need a rough size.
func mag1(v complex128) float64 { return math.Abs(real(v)) + math.Abs(imag(v)) }

func fill[T any](s []T, n int, v T) []T {
	if cap(s) < n {
		s = make([]T, n)
	}
	s = s[:n]
	for i := range s {
		s[i] = v
	}
	return s
}

// recip is 1/m to the bit as Go's complex division gives it (Smith's
// algorithm, the runtime's complex128div with a numerator of 1), without the
// call and the special-value checks for a finite, non-zero m: the LU takes
// a pivot's reciprocal once per column at every frequency point. Every
// operation of the division is kept, the ones by the numerator's 1 and 0
// included, so signed zeros come out as they do there.
func recip(m complex128) complex128 {
	re, im := real(m), imag(m)
	if m == 0 || math.IsInf(re, 0) || math.IsInf(im, 0) || re != re || im != im {
		return 1 / m
	}
	if math.Abs(re) >= math.Abs(im) {
		ratio := im / re
		denom := re + ratio*im
		return complex(1/denom, (0-ratio)/denom)
	}
	ratio := re / im
	denom := im + ratio*re
	return complex((ratio+0)/denom, -1/denom)
}
