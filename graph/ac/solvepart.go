// A solve for a caller that reads a few unknowns.

package ac

import "math"

// A sweep reads one or two unknowns of each solution, but solveRHS refuses
// a solution with any unknown infinite or NaN, so every unknown was solved.
// In the back substitution the unknowns of the steps below the lowest one
// read only feed each other; they need not be worked out when they are
// shown to be finite without it. A bound does that: the same column sweep
// in real numbers over upper bounds of the moduli of y, U and 1/diag(U)
// (|ab| = |a||b|, |a+b| ≤ |a|+|b|), each modulus and each unknown's bound
// raised to at least boundFloor, bounds every unknown's modulus from
// above; each of its operations stays within rounding of the exact
// bound (a relative 2⁻⁵³ a step), and below boundLimit that rounding,
// compounded over any number of steps pare solves, keeps the unknowns far
// from the largest double, so none of them is infinite or NaN. Where the
// bound fails (or any magnitude is itself infinite or NaN), every unknown
// is solved and checked as before. The unknowns read are the same to the
// bit either way: the forward pass is whole, and the backward pass does
// the same operations down to the lowest step read. On the 10,000-section
// RC ladder the output is the last step, and the back substitution, which
// from 200 Hz to 7 kHz runs through subnormal numbers, was half the solve.

// boundFloor keeps the bound in normal numbers (a larger bound is still a
// bound, and arithmetic on subnormal numbers is slow).
const boundFloor = 0x1p-900

// boundLimit leaves the rounding of the bound (at most 2⁻⁵³ relative per
// operation, so a factor 1+2⁻²³ over 2³⁰ operations) and the solve's own
// rounding far inside the largest double.
const boundLimit = math.MaxFloat64 / (1 << 30)

// solveRHSFrom is solveRHS for a caller that reads only the unknowns at
// steps from `from` up (solvepart.go): those come out the same to the bit,
// and the rest are solved only when the bound cannot show them finite.
func (s *system) solveRHSFrom(f float64, from int) error {
	if s.n == 0 {
		return nil
	}
	if len(s.bound) != s.n {
		s.bound = make([]float64, s.n)
	}
	if s.watch != nil {
		s.watch.keep(s, from)
	}
	part := s.f.solvePart(s.b, s.y, from, s.bound)
	if !part {
		if err := s.finite(f); err != nil {
			return err
		}
	}
	if s.watch != nil {
		s.watch.check(s, part)
	}
	return nil
}

// lowestStep is the lowest factorisation step of the unknowns of nodes
// (ground and the driven node have none); s.n when none has one.
func (s *system) lowestStep(nodes []int) int {
	from := s.n
	if s.n == 0 {
		return from
	}
	for k, u := range s.f.q {
		for _, n := range nodes {
			if s.unk[n] == u {
				from = min(from, k)
			}
		}
	}
	return from
}

// solvePart solves like solve, but when the bound shows every unknown
// finite it works out only the steps from `from` up and reports true: b then
// holds the solution at those steps (through q) and is stale elsewhere. On
// false, b holds the whole solution, as solve leaves it. bound is scratch
// of length n.
func (f *lu) solvePart(b, y []complex128, from int, bound []float64) bool {
	f.forward(b, y)
	if from <= 0 || !f.finiteBound(y, bound) {
		f.backward(y, 0)
		for k := 0; k < f.n; k++ {
			b[f.q[k]] = y[k]
		}
		return false
	}
	f.backward(y, from)
	for k := from; k < f.n; k++ {
		b[f.q[k]] = y[k]
	}
	return true
}

// finiteBound runs the back substitution on moduli (modBound, floored at
// boundFloor) and tells whether every bound stays at most boundLimit. It
// notes in f.tiny whether the forward pass left a nonzero value with both
// parts below boundFloor.
func (f *lu) finiteBound(y []complex128, r []float64) bool {
	tiny := false
	for k := 0; k < f.n; k++ {
		r[k] = modBound(y[k])
		// Raised to the floor: a nonzero value that low is tiny
		// (resolution.go).
		if r[k] == 2*boundFloor && y[k] != 0 {
			tiny = true
		}
	}
	f.tiny = tiny
	for k := f.n - 1; k >= 0; k-- {
		// A product of two floored values may underflow: floored again,
		// it is still at least the exact one.
		x := max(r[k]*modBound(f.ud[k]), boundFloor)
		if !(x <= boundLimit) {
			return false
		}
		for t := f.up[k]; t < f.up[k+1]; t++ {
			r[f.ui[t]] += modBound(f.ux[t]) * x
		}
	}
	return true
}

// modBound is an upper bound of the modulus |v| of at least boundFloor, within a relative
// 2⁻⁴⁹ of the modulus when |v| is above it, worked out without arithmetic
// on subnormal numbers (NaN stays NaN, and infinite infinite). The modulus
// itself, not |re|+|im|: along a ladder the bound multiplies a step's
// magnitudes thousands of times over, and a factor up to √2 a step (or
// the 2 of twice the larger part) made it overflow where the unknowns
// decay.
func modBound(v complex128) float64 {
	re, im := math.Abs(real(v)), math.Abs(imag(v))
	if re != re || im != im {
		return math.NaN()
	}
	m, s := max(re, im), min(re, im)
	switch {
	case m < boundFloor:
		return 2 * boundFloor // |v| ≤ √2·m
	case s < m*0x1p-30:
		return m * (1 + 0x1p-49) // |v| ≤ m·√(1+2⁻⁶⁰)
	}
	q := s / m
	return m * math.Sqrt(1+q*q) * (1 + 0x1p-49)
}
