// What a solve resolves: a response so far below its source that double
// precision no longer holds it.

package ac

import (
	"math"
	"math/cmplx"

	"pare/graph"
)

// A long ladder attenuates by more than a double can hold: on the
// 10,000-section RC ladder the output falls below the smallest normal
// double (about −6153 dB re the source) near 160 Hz, the unknowns along it
// run through subnormal numbers to the smallest one or to zero, and the
// solve prints −6159.074 dB (that smallest number) with a phase that is
// rounding, at every frequency above. Nothing in the solve fails: only the
// figure is not the response.
//
// IEEE arithmetic is exact under scaling by a power of two wherever no
// operation underflows or overflows: solving with the right-hand side
// times 2^shift gives every unknown times 2^shift to the bit. So where the
// solve's work vector holds a value small enough that a product or
// quotient with it may have underflowed (tinyLevel), the point is solved
// again with the right-hand side scaled up (by up to 2⁶⁰⁰, as far as the
// largest magnitude seen leaves room), with the same factors and the same
// operations. A read unknown that comes out of both solves the same, to
// within resolvedRel, is resolved; one that does not lost bits to
// underflow and is not the response. The difference of the two solves
// estimates what the first one lost; the modulus of the unknown plus that
// difference is the upper bound said beside it (the scaled solve holds
// 600 more bits of range; where it underflows too, its value is still
// above the true one's scaled modulus, so the bound still holds in the
// cases seen, not in general).
//
// This finds underflow only. Rounding that cancels (a bridge at its null)
// is not looked for: the factors' rounding would need a second solve at
// every point, which the sweep's speed does not leave room for.

// tinyLevel: a value in the work vector at or below it may have met
// underflow in a product with an LU entry (MNA entries, conductances and
// susceptances, span far less than the 2¹²² between it and the smallest
// normal number).
const tinyLevel = 0x1p-900

// resolvedRel is how close the two solves must agree, relative to the
// unknown, for it to count as resolved: 2⁻²⁰ (10⁻⁶), below the printed
// digits of a sweep (0.001 dB is 1.2·10⁻⁴, 0.01° is 1.7·10⁻⁴ rad).
const resolvedRel = 0x1p-20

// maxShift is the largest scaling tried, and minShift the least that tells
// anything (below it the magnitudes in the solve span nearly the whole
// range of a double).
const (
	maxShift = 600
	minShift = 64
)

// Beyond says of one point whether its figure is beyond what the solve
// resolves. BelowDB is then an upper bound of the modulus in dB (re 1 V of
// the source, or re 1 Ω for an impedance).
type Beyond struct {
	Lost    bool
	BelowDB float64
}

// TransferChecked is Transfer that also says, point by point, whether the
// solve resolves the response.
func TransferChecked(c *graph.Circuit, in, out string, freqs []float64, o Options) ([]complex128, []Beyond, error) {
	lost := [][]Beyond{make([]Beyond, len(freqs))}
	res, err := transferWatched(c, in, []string{out}, freqs, o, lost)
	if err != nil {
		return nil, nil, err
	}
	return res[0], lost[0], nil
}

// ImpedanceChecked is Impedance that also says, point by point, whether
// the solve resolves it.
func ImpedanceChecked(c *graph.Circuit, net string, freqs []float64, o Options) ([]complex128, []Beyond, error) {
	lost := make([]Beyond, len(freqs))
	z, err := impedance(c, net, freqs, o, lost)
	if err != nil {
		return nil, nil, err
	}
	return z, lost, nil
}

// watch is one system's check: the point's right-hand side, the scaled
// solve's space and its result.
type watch struct {
	b0, b2, y2 []complex128
	shift      int  // the scaling of b2; 0: the point needed no second solve
	wide       bool // a second solve was needed and no scaling had room
}

// keep saves the right-hand side before the solve overwrites it.
func (w *watch) keep(b []complex128) { w.b0 = append(w.b0[:0], b...) }

// check runs after the solve of a point (solveRHSFrom, unknowns read at
// steps from `from` up): when the work vector holds a tiny value, it
// solves again scaled into b2.
func (w *watch) check(s *system, from int) {
	w.shift, w.wide = 0, false
	top, tiny := span(w.b0, 0, false)
	top, tiny = span(s.y, top, tiny)
	if !tiny || top == 0 {
		return
	}
	// 100 binary orders of room for the partial sums above the largest
	// magnitude seen.
	shift := min(maxShift, math.Ilogb(math.MaxFloat64/top)-100)
	if shift < minShift {
		w.wide = true
		return
	}
	n := len(w.b0)
	b2, y2 := fitC(&w.b2, n), fitC(&w.y2, n)
	for i, v := range w.b0 {
		b2[i] = complex(math.Ldexp(real(v), shift), math.Ldexp(imag(v), shift))
	}
	f := s.f
	f.forward(b2, y2)
	f.backward(y2, from)
	for k := from; k < f.n; k++ {
		b2[f.q[k]] = y2[k]
	}
	w.shift = shift
}

// span is the largest max(|re|,|im|) in v (at least top), and whether any
// nonzero one is at most tinyLevel (or tiny already).
func span(v []complex128, top float64, tiny bool) (float64, bool) {
	for _, x := range v {
		m := max(math.Abs(real(x)), math.Abs(imag(x)))
		top = max(top, m)
		if m <= tinyLevel && m != 0 {
			tiny = true
		}
	}
	return top, tiny
}

// beyond says whether the solved voltage of node is beyond the solve's
// resolution at the point just solved.
func (s *system) beyond(node int) Beyond {
	w, u := s.watch, s.unk[node]
	if w == nil || u < 0 {
		return Beyond{}
	}
	x := s.b[u]
	if w.wide {
		// No second solve: a subnormal or zero unknown is lost.
		if m := cmplx.Abs(x); m < 0x1p-1022 {
			return Beyond{Lost: true, BelowDB: 20 * math.Log10(0x1p-1022)}
		}
		return Beyond{}
	}
	if w.shift == 0 {
		return Beyond{}
	}
	xs := complex(math.Ldexp(real(x), w.shift), math.Ldexp(imag(x), w.shift))
	m, d := cmplx.Abs(xs), cmplx.Abs(xs-w.b2[u])
	if m == 0 && d == 0 {
		// Zero both ways after values ran tiny: it underflowed even at
		// 2^shift. (An unknown the source does not reach is zero too; it
		// is told apart only where no value in the solve ran tiny.)
		d = 0x1p-1074
	} else if d <= m*resolvedRel {
		return Beyond{}
	}
	if math.IsNaN(d) || math.IsInf(d, 0) {
		d = m // the scaled solve overflowed: the unknown itself is the bound
	}
	// The second solve is itself good to resolvedRel at best.
	bound := (m + d) * (1 + resolvedRel)
	return Beyond{Lost: true, BelowDB: 20*math.Log10(bound) - float64(w.shift)*20*math.Log10(2)}
}
