// The LU of one system at several frequencies at once.

package ac

// A sweep solves one small block (about 30 unknowns) at hundreds of
// frequencies with one pivot sequence, and the numeric refactorisation
// (refactor) does only a few hundred complex operations a point: most of
// its time went on walking the factors' index arrays, once per point. The
// batched forms below walk them once for a run of points and do each
// point's arithmetic in an inner loop over the points. Every array is kept
// frequency-minor: entry e of point i is at e·w+i, w the width of the run.
//
// Each point gets exactly the operations refactor and solve give it, in
// the same order (the skips of zero multipliers and the pivot test
// included), so its numbers are the same to the bit. A point whose kept
// pivot has gone stale ends the run there: the points before it are done,
// and the caller factors that point afresh with pivoting (decompose), as
// the point-by-point loop would, and starts a new run after it with the
// new pivots.

// luRun is the scratch of one batched factorisation: the work vector,
// L's and U's numbers and the pivots' reciprocals, frequency-minor.
type luRun struct {
	w          int // the run's width (its stride)
	x, lx, ux  []complex128
	ud, y, rhs []complex128
	maxL       []float64 // pivotRun's largest candidate below each pivot
}

// size makes the run's arrays fit f's factors at width w. Only the work
// vector starts zeroed: every other entry a run reads it writes first.
func (r *luRun) size(f *lu, w int) {
	r.w = w
	r.x = fit(r.x, f.n*w)
	clear(r.x)
	r.lx = fit(r.lx, len(f.li)*w)
	r.ux = fit(r.ux, len(f.ui)*w)
	r.ud = fit(r.ud, f.n*w)
	r.y = fit(r.y, f.n*w)
	r.rhs = fit(r.rhs, f.n*w)
	if cap(r.maxL) < w {
		r.maxL = make([]float64, w)
	}
}

// fit returns s with length n, its contents undefined.
func fit(s []complex128, n int) []complex128 {
	if cap(s) < n {
		return make([]complex128, n)
	}
	return s[:n]
}

// refactorRun is refactor for the first n points of the run, whose matrix
// (a's pattern) has slot t of point i at ax[t·w+i]. It returns how many
// points, from the first, kept every pivot: their factors are in r.
func (f *lu) refactorRun(a *csc, ax []complex128, n int, r *luRun) int {
	w, x := r.w, r.x
	for k := 0; k < f.n; k++ {
		j := f.q[k]
		for t := a.p[j]; t < a.p[j+1]; t++ {
			xr, at := x[f.ai[t]*w:][:n], ax[t*w:][:n]
			for i := range xr {
				xr[i] += at[i]
			}
		}
		for t := f.up[k]; t < f.up[k+1]; t++ {
			s := f.ui[t]
			xs, ut := x[s*w:][:n], r.ux[t*w:][:n]
			copy(ut, xs)
			clear(xs)
			for m := f.lp[s]; m < f.lp[s+1]; m++ {
				xr, lm := x[f.li[m]*w:][:n], r.lx[m*w:][:n]
				for i, u := range ut {
					if u != 0 {
						xr[i] -= lm[i] * u
					}
				}
			}
		}
		n = f.pivotRun(k, n, r)
	}
	return n
}

// pivotRun takes column k's pivot at each of the first n points and scales
// L's column by its reciprocal; it returns the points before the first
// whose kept pivot is too small (refactor's test).
func (f *lu) pivotRun(k, n int, r *luRun) int {
	w, x := r.w, r.x
	xk, udk := x[k*w:][:n], r.ud[k*w:][:n]
	maxL := r.maxL[:n]
	clear(maxL)
	for m := f.lp[k]; m < f.lp[k+1]; m++ {
		for i, v := range x[f.li[m]*w:][:n] {
			if a := mag1(v); a > maxL[i] {
				maxL[i] = a
			}
		}
	}
	for i, piv := range xk {
		if pa := mag1(piv); pa == 0 || pa < pivotTol*maxL[i] {
			n = i
			break
		}
		udk[i] = recip(piv)
	}
	clear(xk)
	udk = udk[:n]
	for m := f.lp[k]; m < f.lp[k+1]; m++ {
		xr, lm := x[f.li[m]*w:][:n], r.lx[m*w:][:n]
		for i, inv := range udk {
			lm[i] = xr[i] * inv
			xr[i] = 0
		}
	}
	return n
}

// solveRun is solve for the first n points of the run: the right-hand
// sides are in r.rhs (row u of point i at u·w+i) and the solutions are left
// in r.y, step k of point i at k·w+i (unknown q[k]).
func (f *lu) solveRun(n int, r *luRun) {
	w, y := r.w, r.y
	for k := 0; k < f.n; k++ {
		copy(y[k*w:][:n], r.rhs[f.prow[k]*w:][:n])
	}
	for k := 0; k < f.n; k++ {
		yk := y[k*w:][:n]
		for t := f.lp[k]; t < f.lp[k+1]; t++ {
			yr, lt := y[f.li[t]*w:][:n], r.lx[t*w:][:n]
			for i, v := range yk {
				if v != 0 {
					yr[i] -= lt[i] * v
				}
			}
		}
	}
	for k := f.n - 1; k >= 0; k-- {
		yk, udk := y[k*w:][:n], r.ud[k*w:][:n]
		for i := range yk {
			yk[i] *= udk[i]
		}
		for t := f.up[k]; t < f.up[k+1]; t++ {
			yr, ut := y[f.ui[t]*w:][:n], r.ux[t*w:][:n]
			for i, v := range yk {
				if v != 0 {
					yr[i] -= ut[i] * v
				}
			}
		}
	}
}
