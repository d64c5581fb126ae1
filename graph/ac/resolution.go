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

// tinyLevel: a value in the work vector with both parts below it may have
// met underflow in a product with an LU entry (MNA entries, conductances
// and susceptances, span far less than the 2¹²² between it and the
// smallest normal number). It is boundFloor, below which the bound of the
// partial solve (solvepart.go) raises every modulus: that pass sees each
// value of the forward pass already, and notes a tiny one at the cost of a
// comparison.
const tinyLevel = boundFloor

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

// watch is one system's check: what the solve overwrites of the point's
// right-hand side, what the solve held, and the scaled solve's space and
// result.
type watch struct {
	saved  []complex128 // b at the steps read (or all of b when every step is)
	b2, y2 []complex128
	from   int  // the lowest step read
	all    bool // saved is all of b
	tiny   bool // a nonzero value with both parts at or below tinyLevel was seen
	gone   bool // the solve took the whole path and b was not saved: no second solve
	shift  int  // the scaling of b2; 0: not solved again (yet)
	wide   bool // no scaling had room
}

// keep saves what the solve will overwrite of the right-hand side: the
// entries of the steps read (the partial solve leaves the rest of b as it
// was), or all of it when every step is read.
func (w *watch) keep(s *system, from int) {
	w.from, w.all = from, from <= 0
	if w.all {
		w.saved = append(w.saved[:0], s.b...)
		return
	}
	w.saved = w.saved[:0]
	for k := from; k < s.f.n; k++ {
		w.saved = append(w.saved, s.b[s.f.q[k]])
	}
}

// check runs after the solve of a point (solveRHSFrom; part: it took the
// partial path) and notes whether the work vector ran tiny; the second
// solve is left to beyond, which needs it only for a read unknown that is
// a normal number.
func (w *watch) check(s *system, part bool) {
	w.shift, w.wide = 0, false
	w.gone = !part && !w.all
	if part {
		w.tiny = s.f.tiny
		return
	}
	_, w.tiny = span(s.y, 0, false)
}

// again solves the point again with the right-hand side times 2^shift
// into b2 (once a point).
func (w *watch) again(s *system) {
	if w.shift != 0 || w.wide {
		return
	}
	f, n := s.f, len(s.b)
	b2, y2 := fitC(&w.b2, n), fitC(&w.y2, n)
	if w.all {
		copy(b2, w.saved)
	} else {
		copy(b2, s.b)
		for k := w.from; k < f.n; k++ {
			b2[f.q[k]] = w.saved[k-w.from]
		}
	}
	top, _ := span(b2, 0, false)
	top, _ = span(s.y, top, false)
	// 100 binary orders of room for the partial sums above the largest
	// magnitude seen.
	shift := min(maxShift, math.Ilogb(math.MaxFloat64/top)-100)
	if w.gone || top == 0 || shift < minShift {
		w.wide = true
		return
	}
	for i, v := range b2 {
		b2[i] = complex(math.Ldexp(real(v), shift), math.Ldexp(imag(v), shift))
	}
	f.forward(b2, y2)
	f.backward(y2, w.from)
	for k := w.from; k < f.n; k++ {
		b2[f.q[k]] = y2[k]
	}
	w.shift = shift
}

// span is the largest max(|re|,|im|) in v (at least top), and whether any
// nonzero one is below tinyLevel (or tiny already).
func span(v []complex128, top float64, tiny bool) (float64, bool) {
	for _, x := range v {
		m := max(math.Abs(real(x)), math.Abs(imag(x)))
		top = max(top, m)
		if m < tinyLevel && m != 0 {
			tiny = true
		}
	}
	return top, tiny
}

// minNormalDB is the smallest normal double in dB: a subnormal unknown
// has lost bits, and one that underflowed is below it.
var minNormalDB = 20 * math.Log10(0x1p-1022)

// beyond says whether the solved voltage of node is beyond the solve's
// resolution at the point just solved.
func (s *system) beyond(node int) Beyond {
	w, u := s.watch, s.unk[node]
	if w == nil || u < 0 || !w.tiny {
		return Beyond{}
	}
	x := s.b[u]
	if max(math.Abs(real(x)), math.Abs(imag(x))) < 0x1p-1022 {
		// Subnormal, or zero after values ran tiny: below the normal
		// range, with bits lost (an unknown the source does not reach is
		// zero too; it is told apart only where no value ran tiny).
		return Beyond{Lost: true, BelowDB: minNormalDB}
	}
	w.again(s)
	if w.wide {
		return Beyond{} // a normal number, and no room to look further
	}
	xs := complex(math.Ldexp(real(x), w.shift), math.Ldexp(imag(x), w.shift))
	m, d := cmplx.Abs(xs), cmplx.Abs(xs-w.b2[u])
	if d <= m*resolvedRel {
		return Beyond{}
	}
	if math.IsNaN(d) || math.IsInf(d, 0) {
		d = m // the scaled solve overflowed: the unknown itself is the bound
	}
	// The second solve is itself good to resolvedRel at best.
	bound := (m + d) * (1 + resolvedRel)
	return Beyond{Lost: true, BelowDB: 20*math.Log10(bound) - float64(w.shift)*20*math.Log10(2)}
}
