package ac

import (
	"math"
	"math/cmplx"
)

// find is the search of Find on the loop system ls, solved afresh: the
// result, with neither Ref nor Frac set, is a function of ls and o alone
// (loopKey).
func (ls *loopSystem) find(o LoopOptions) (Loop, error) {
	return ls.findStride(o, scanStride)
}

// findStride is find with the scan's stride given (1: every grid point).
func (ls *loopSystem) findStride(o LoopOptions, stride int) (Loop, error) {
	var res Loop
	grid, err := searchGrid(ls, o)
	if err != nil {
		return res, err
	}
	if o.Inverted {
		ls.sign = -ls.sign // −L: its 0° is L's 180°
	}
	cross := func(f1, f2 float64, l1, l2 complex128) error {
		if (imag(l1) > 0) != (imag(l2) > 0) && (real(l1) > 0 || real(l2) > 0) {
			x, err := ls.refine(f1, f2, l1)
			if err != nil {
				return err
			}
			if real(x.l) > 0 {
				res.Crossings = append(res.Crossings, Crossing{F: x.f, GainDB: 20 * math.Log10(cmplx.Abs(x.l))})
			}
		}
		return nil
	}
	if err := ls.scan(grid, stride, cross); err != nil {
		return res, err
	}
	best := math.Inf(-1)
	for _, x := range res.Crossings {
		if x.GainDB > best {
			best, res.F, res.MarginDB = x.GainDB, x.F, x.GainDB
		}
	}
	return res, nil
}

// scanStride is how many grid steps the scan takes at a time: 4 of the
// 200 a decade, 4.7 %, where the loop phase is far from 0° and turns
// slowly; the steps between are solved where it is not (scan).
const scanStride = 4

// scanTurn is the most the loop phase may turn over a stride that is not
// filled in. A single resonance (a pole pair or a zero pair) turns the
// phase one way by at most 180°, so over a stride whose ends both lie in
// the left half-plane (Re L ≤ 0, no 0° crossing possible at either end),
// on one side of the negative real axis and less than 45° apart, its
// phase stays on the short arc between them and never reaches the right
// half-plane where the crossing test can hold. Only two resonances within
// the stride turning the phase out by more than 90° and back could put a
// crossing there; a crystal's pair, the one such case the sets hold, has
// its own dense patch on the grid (searchGrid), 2,000 steps over 2.2 %,
// so a stride there spans 0.004 %.
const scanTurn = math.Pi / 4

// scan solves L on the grid and calls cross on every pair of neighbouring
// grid points where the crossing test (Im L changing sign, Re L above 0
// at one end) could hold, in ascending order, as a scan of every point
// does: it solves every stride-th point, and the points between where
// the stride's ends leave room for a crossing (mayCross). A stride filled
// in is tested point by point, so a crossing is refined from the same two
// grid points and their solved L as before. The grid's first point is
// solved first, so the LU's pivots are chosen there as before; the last
// bits of a refined crossing can still move (parts in 10¹⁵) where a
// later point falls back to a fresh factorisation at another frequency.
// On the 1,010-part bank 6 % of the strides are filled in: 124,000 points
// solved where the scan of every point took 424,000.
func (ls *loopSystem) scan(grid []float64, stride int, cross func(f1, f2 float64, l1, l2 complex128) error) error {
	l := make([]complex128, len(grid))
	var err error
	if l[0], err = ls.atF(grid[0]); err != nil {
		return err
	}
	for i := 0; i < len(grid)-1; {
		j := min(i+stride, len(grid)-1)
		if l[j], err = ls.atF(grid[j]); err != nil {
			return err
		}
		switch {
		case j == i+1:
			if err := cross(grid[i], grid[j], l[i], l[j]); err != nil {
				return err
			}
		case mayCross(l[i], l[j]):
			for k := i + 1; k < j; k++ {
				if l[k], err = ls.atF(grid[k]); err != nil {
					return err
				}
			}
			for k := i; k < j; k++ {
				if err := cross(grid[k], grid[k+1], l[k], l[k+1]); err != nil {
					return err
				}
			}
		}
		i = j
	}
	return nil
}

// mayCross tells whether a stride whose ends have loop gains a and b can
// hold a 0° crossing (scanTurn): Im L changes sign over it, Re L is above
// 0 at an end, or the phase turns more than scanTurn between the ends.
func mayCross(a, b complex128) bool {
	if (imag(a) > 0) != (imag(b) > 0) || real(a) > 0 || real(b) > 0 {
		return true
	}
	return math.Abs(cmplx.Phase(b/a)) > scanTurn
}

type loopAt struct {
	f float64
	l complex128
}

// refine bisects (on a log scale) for Im L = 0 between f1 and f2, where the
// sign of Im L differs; lo is L at f1.
func (ls *loopSystem) refine(f1, f2 float64, lo complex128) (loopAt, error) {
	var mid loopAt
	for range 60 {
		fm := math.Sqrt(f1 * f2)
		l, err := ls.atF(fm)
		if err != nil {
			return mid, err
		}
		mid = loopAt{fm, l}
		if (imag(l) > 0) == (imag(lo) > 0) {
			f1, lo = fm, l
		} else {
			f2 = fm
		}
		if f2/f1-1 < 1e-12 {
			break
		}
	}
	return mid, nil
}
