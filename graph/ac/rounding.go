// The deviation a comparison does not chase: rounding.

package ac

import "math"

// Two systems that are the same equations written differently (two
// capacitors in parallel merged into one, 10 pF + 31 pF stored as
// 43.000000000000007 pF; a part's stamps visited in another order) give
// responses that differ only by the rounding of their two solves: on the
// 1,010-part bank's step proofs, under a relative 10⁻¹⁰ wherever a step
// was such a rewrite. The refinement of a sweep adds points around the
// highest peaks of the deviation so that a resonance that moved between two
// points of the grid is found; where the deviation is rounding, its peaks
// are where the rounding happened to fall, not where the circuits differ,
// and the points added there find more rounding. On that bank more than
// half of the step proofs' solves went to them.
//
// roundingRel is the relative difference below which a deviation counts as
// rounding for the refinement: 10⁻⁹, ten times the rounding seen there and
// eight orders of magnitude below the tolerance (0.5 dB is 6 %). The worst
// deviation is still taken over every point swept; the peaks of both
// responses are refined as always, and so is every deviation peak above it.
// Only the step proofs use it (CompareOptions.AboveRounding): the final
// proof and `verify --steps` print where their worst deviation lies,
// rounding or not, and search as they always did. TestAboveRounding holds
// it to the same verdicts and, for every pair that deviates by more than
// rounding, the same worst deviation to the bit.
const roundingRel = 1e-9

// roundingDB and roundingDeg are roundingRel as a deviation in decibels and
// in degrees (a phase of 10⁻⁹ rad).
var (
	roundingDB  = 20 * math.Log10(1+roundingRel)
	roundingDeg = roundingRel * 180 / math.Pi
)
