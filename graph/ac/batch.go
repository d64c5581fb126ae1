// A probe solved at a run of frequencies at once (sparsebatch.go).

package ac

import (
	"fmt"
	"math"
	"sync"
)

// runWidth is the most points a run holds: the run's arrays (about 300
// complex numbers a point for a block of 30 unknowns) then stay within a
// core's second-level cache.
const runWidth = 32

// minRun is the fewest points worth a run; fewer are solved one by one.
const minRun = 4

// runScratch is one run's space, lent from a pool: a sweep's probes come
// and go by the thousand, each solved in a handful of runs.
type runScratch struct {
	lu   luRun
	ax   []complex128
	vals []complex128
	ws   []float64
}

var runPool = sync.Pool{New: func() any { return &runScratch{} }}

// atMany solves the probe at each frequency of fs in turn, as at would one
// after the other (the same numbers to the bit: the same pivots, chosen
// afresh at the same points), into out. It returns how many points it
// solved and, when that is fewer than len(fs), the error of the next.
func (p *probe) atMany(fs []float64, out []complex128) (int, error) {
	if p.zero {
		clear(out[:len(fs)])
		return len(fs), nil
	}
	if p.s == nil {
		p.s = assemble(p.nl, p.driven, p.isHeld, p.sub)
	}
	var sc *runScratch
	defer func() {
		if sc != nil {
			runPool.Put(sc)
		}
	}()
	for i := 0; i < len(fs); {
		s := p.s
		if s.n == 0 || !s.f.ready || len(fs)-i < minRun {
			// The first point chooses the pivots; a system of no unknowns
			// and a short tail go point by point.
			v, err := p.at(fs[i])
			if err != nil {
				return i, err
			}
			out[i] = v
			i++
			continue
		}
		if sc == nil {
			sc = runPool.Get().(*runScratch)
		}
		n := min(len(fs)-i, runWidth)
		done, err := p.run(fs[i:i+n], out[i:i+n], sc)
		i += done
		if err != nil {
			return i, err
		}
		if done < n {
			// A kept pivot went stale at fs[i]: at refactors, finds it
			// stale again and factors afresh with pivoting.
			v, err := p.at(fs[i])
			if err != nil {
				return i, err
			}
			out[i] = v
			i++
		}
	}
	return len(fs), nil
}

// run solves the probe at every point of fs with the pivots it has. It
// returns the points solved from the first: all of them, or those before
// one whose pivot went stale or (with the error) whose solution is not
// finite.
func (p *probe) run(fs []float64, out []complex128, sc *runScratch) (int, error) {
	s, n := p.s, len(fs)
	r := &sc.lu
	r.size(s.f, n)
	s.assembleRun(fs, sc)
	done := s.f.refactorRun(&s.a, sc.ax, n, r)
	if p.impedance {
		clear(r.rhs)
		row := r.rhs[s.unk[p.node]*n:][:done]
		for i := range row {
			row[i] = 1
		}
	}
	s.f.solveRun(done, r)
	read := -1 // the step of the unknown read, if it is one
	if u := s.unk[p.node]; u >= 0 {
		read = s.f.stepOf(u)
	}
	done, err := s.finiteRun(fs, done, r)
	for i := 0; i < done; i++ {
		if read >= 0 {
			out[i] = r.y[read*n+i]
		} else {
			out[i] = s.voltage(p.node) // driven (1) or ground (0)
		}
	}
	return done, err
}

// assembleRun is solveAt's assembly at every point of fs: the matrix
// numbers into sc.ax and the right-hand sides into sc.lu.rhs, each
// frequency-minor, from the statics and the same stamps in the same order.
func (s *system) assembleRun(fs []float64, sc *runScratch) {
	fx, n := s.fixed, len(fs)
	sc.ws = sc.ws[:0]
	for _, f := range fs {
		sc.ws = append(sc.ws, 2*math.Pi*f)
	}
	sc.ax = fit(sc.ax, len(fx.ax)*n)
	for t, v := range fx.ax {
		row := sc.ax[t*n:][:n]
		for i := range row {
			row[i] = v
		}
	}
	rhs := sc.lu.rhs
	for u, v := range fx.b {
		row := rhs[u*n:][:n]
		for i := range row {
			row[i] = v
		}
	}
	sc.vals = fit(sc.vals, len(fx.coefs)*n)
	for c, k := range fx.coefs {
		row, co := sc.vals[c*n:][:n], s.coefs[k]
		for i, w := range sc.ws {
			row[i] = co.at(w)
		}
	}
	for _, st := range fx.stamps {
		var dst []complex128
		if st.slot >= 0 {
			dst = sc.ax[int(st.slot)*n:][:n]
		} else {
			dst = rhs[int(st.rhs)*n:][:n]
		}
		if c := fx.varOf[st.val]; c >= 0 {
			addRun(dst, sc.vals[int(c)*n:][:n], st)
		} else {
			addConst(dst, s.vals[st.val], st)
		}
	}
}

// addRun adds one stamp of a coefficient that varies with frequency: a
// matrix slot adds it, a right-hand-side row (the driven node at 1 V)
// subtracts it, as solveAt does.
func addRun(dst, vals []complex128, st stamp) {
	dst = dst[:len(vals)]
	switch {
	case st.slot >= 0 && !st.neg:
		for i, v := range vals {
			dst[i] += v
		}
	case st.slot >= 0:
		for i, v := range vals {
			dst[i] += -v
		}
	case !st.neg:
		for i, v := range vals {
			dst[i] -= v
		}
	default:
		for i, v := range vals {
			dst[i] -= -v
		}
	}
}

// addConst adds one stamp of a constant coefficient (on a slot or row that
// another stamp makes vary).
func addConst(dst []complex128, v complex128, st stamp) {
	if st.neg {
		v = -v
	}
	if st.slot < 0 {
		for i := range dst {
			dst[i] -= v
		}
		return
	}
	for i := range dst {
		dst[i] += v
	}
}

// finiteRun is solveRHS's test of the first n points' solutions, with its
// message: the first point with an unknown that is NaN or infinite, and
// the first such unknown in the unknowns' order.
func (s *system) finiteRun(fs []float64, n int, r *luRun) (int, error) {
	first := n
	for k := range s.f.q {
		for i, v := range r.y[k*r.w:][:first] {
			if !(math.Abs(real(v)) <= math.MaxFloat64 && math.Abs(imag(v)) <= math.MaxFloat64) {
				first = i
				break
			}
		}
	}
	if first == n {
		return n, nil
	}
	bad := -1
	for k, q := range s.f.q {
		v := r.y[k*r.w+first]
		if !(math.Abs(real(v)) <= math.MaxFloat64 && math.Abs(imag(v)) <= math.MaxFloat64) && (bad < 0 || q < bad) {
			bad = q
		}
	}
	return first, fmt.Errorf("no finite solution at %s for the %s", hz(fs[first]), s.what[bad])
}

// stepOf is the step at which unknown u is factored.
func (f *lu) stepOf(u int) int {
	for k, q := range f.q {
		if q == u {
			return k
		}
	}
	return -1
}
