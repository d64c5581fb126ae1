// One system solved at many frequencies, the points shared between cores.

package ac

import (
	"fmt"
	"math"
	"runtime"
)

// A point's numbers are a function of its matrix and of the pivot order
// the factorisation keeps: the order chosen afresh at the first point, and
// again at any point where a kept pivot has gone stale (lu.decompose). So
// once the first point is solved, every later point up to the first stale
// one is solved with the first point's pivots, whichever core solves it.
// sweepPoints deals the points after the first to the cores in turn, each
// core on its own copy of the system refactoring with those pivots; a core
// stops at a stale pivot or an error. Read in order, the points up to the
// first that no core finished are the one-by-one loop's, to the bit; from
// that point on the loop itself runs (and meets the stale pivot or the
// error exactly where it would have). TestSweepPointsIsLoop.

// parallelWork is the least unknowns × points a sweep must hold before its
// points are shared: a stage figure's block of tens of unknowns at a few
// hundred points is over before a goroutine starts.
var parallelWork = 200_000

// sweepPoints solves s at each frequency in order, as the loop
//
//	for k, f := range freqs { check f; s.solveAt(f); rhs(s); s.solveRHS(f); read(k, s) }
//
// would, stopping at the first error; rhs (may be nil) sets the
// right-hand side after the matrix is assembled; read takes a point's
// solution from the system it was solved on, and reads only unknowns of
// the steps from `from` up (solveRHSFrom: the others may be left unsolved).
func sweepPoints(s *system, freqs []float64, from int, rhs func(*system), read func(int, *system)) error {
	sw := &pointSweep{freqs: freqs, from: from, rhs: rhs, read: read}
	cores := runtime.GOMAXPROCS(0)
	if cores < 2 || s.n == 0 || len(freqs) < 8 || s.n*len(freqs) < parallelWork {
		return sw.loop(s, 0)
	}
	bad := len(freqs) // the first frequency that is no frequency
	for k, f := range freqs {
		if !validHz(f) {
			bad = k
			break
		}
	}
	if bad == 0 {
		return sw.loop(s, 0)
	}
	if err := sw.point(s, 0); err != nil {
		return err
	}
	read(0, s)
	sw.done = make([]bool, bad)
	sw.errs = make([]error, bad)
	finished := make(chan struct{}, cores)
	for w := 1; w < cores; w++ {
		t := s.twin() // before s solves again
		go func() {
			sw.refactorPoints(t, w, cores, bad)
			finished <- struct{}{}
		}()
	}
	sw.refactorPoints(s, 0, cores, bad)
	for w := 1; w < cores; w++ {
		<-finished
	}
	for k := 1; k < bad; k++ {
		switch {
		case sw.errs[k] != nil:
			return sw.errs[k]
		case !sw.done[k]:
			// A stale pivot, or a point after one on its core: the loop
			// from here, with the pivots it would hold here.
			return sw.loop(s, k)
		}
	}
	return sw.loop(s, bad)
}

// pointSweep is one sweepPoints: its points, what it reads, and which
// points the cores finished (done) or failed at (errs).
type pointSweep struct {
	freqs []float64
	from  int
	rhs   func(*system)
	read  func(int, *system)
	done  []bool
	errs  []error
}

// refactorPoints solves the points first+1, first+1+step, … below end on s
// with the pivots it holds, marking each done; it stops at a stale pivot
// (leaving the point not done) or at an error (kept in errs).
func (sw *pointSweep) refactorPoints(s *system, first, step, end int) {
	for k := first + 1; k < end; k += step {
		f := sw.freqs[k]
		s.assembleAt(f)
		if sw.rhs != nil {
			sw.rhs(s)
		}
		if err := s.f.refactor(&s.a); err != nil {
			return
		}
		if err := s.solveRHSFrom(f, sw.from); err != nil {
			sw.errs[k] = err
			return
		}
		sw.read(k, s)
		sw.done[k] = true
	}
}

// loop is the one-by-one loop from point k on.
func (sw *pointSweep) loop(s *system, k int) error {
	for ; k < len(sw.freqs); k++ {
		if err := sw.point(s, k); err != nil {
			return err
		}
		sw.read(k, s)
	}
	return nil
}

// point checks the frequency of point k and solves s at it.
func (sw *pointSweep) point(s *system, k int) error {
	f := sw.freqs[k]
	if !validHz(f) {
		return fmt.Errorf("frequency %g: must be a positive number of hertz", f)
	}
	if err := s.solveAt(f); err != nil {
		return err
	}
	if sw.rhs != nil {
		sw.rhs(s)
	}
	return s.solveRHSFrom(f, sw.from)
}

func validHz(f float64) bool { return f > 0 && !math.IsInf(f, 0) }

// twin is a copy of s that solves on its own: the pattern, stamps and
// constant sums are shared (read only), the numbers and the factors' space
// are its own, with the pivot order s holds.
func (s *system) twin() *system {
	t := *s
	t.a.x = make([]complex128, len(s.a.x))
	t.b = make([]complex128, len(s.b))
	t.y = make([]complex128, len(s.y))
	t.bound = nil
	if s.watch != nil {
		t.watch = &watch{}
	}
	t.vals = append([]complex128(nil), s.vals...)
	f := *s.f
	f.lx = append([]complex128(nil), s.f.lx...)
	f.ux = append([]complex128(nil), s.f.ux...)
	f.ud = append([]complex128(nil), s.f.ud...)
	f.x = make([]complex128, len(s.f.x))
	// refactor reads the pattern and the pivot order and writes only the
	// numbers above; factor, which rewrites the rest, is never called on
	// a twin.
	t.f = &f
	return &t
}
