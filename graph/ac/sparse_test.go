package ac

import (
	"math"
	"math/rand"
	"testing"
)

// recip must give the bits Go's own complex division gives for 1/m (the
// runtime's algorithm, the reference here), signed zeros and special values
// included: the proof's numbers may not move by a rounding.
func TestRecipMatchesDivision(t *testing.T) {
	negZero := math.Copysign(0, -1)
	specials := []float64{0, negZero, 1, -1, 0.5, -3, 1e-300, -1e-300, 1e300, -1e300, 5e-324,
		math.MaxFloat64, math.Inf(1), math.Inf(-1), math.NaN()}
	var ms []complex128
	for _, a := range specials {
		for _, b := range specials {
			ms = append(ms, complex(a, b))
		}
	}
	rng := rand.New(rand.NewSource(1))
	for range 100000 {
		ms = append(ms, complex(rng.NormFloat64()*math.Pow(10, float64(rng.Intn(40)-20)),
			rng.NormFloat64()*math.Pow(10, float64(rng.Intn(40)-20))))
	}
	one := complex(1, 0)
	for _, m := range ms {
		got, want := recip(m), one/m
		if !sameBits(real(got), real(want)) || !sameBits(imag(got), imag(want)) {
			t.Fatalf("recip(%v) = %v, 1/m = %v", m, got, want)
		}
	}
}

func sameBits(a, b float64) bool {
	return math.Float64bits(a) == math.Float64bits(b) || (a != a && b != b)
}
