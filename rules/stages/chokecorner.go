package stages

import (
	"fmt"
	"math"

	"pare/graph"
	"pare/graph/figure"
)

// chokeCornerWhy explains why an LC section's −3 dB corner in circuit (fc,
// the solver's) differs from its resonance f0 = 1/(2π√(LC2)) (the
// formula), in words that agree with the solver's figure. Undamped and
// unloaded, an LC section falls 3 dB only above its resonance, at
// √(1+√2) = 1.55 f0 (handbook, from memory: |1 − (f/f0)²| = √2). A choke
// whose winding resistance is comparable with its reactance there (a
// loudspeaker field coil: Q = 2πf0·L/Rdc under about 1) is damped: the
// section then falls like an RC one, below its resonance, towards
// 1/(2π·Rdc·C2), the capacitor C2 = 1/((2πf0)²L) taken back from f0.
func chokeCornerWhy(s *graph.Part, f0, fc float64) string {
	l := s.Inductance()
	rdc, _ := s.Param("rdc")
	if fc >= f0 || !(l > 0) || !(rdc > 0) {
		return "the formula is the section's resonance; an LC section falls 3 dB only above it (√(1+√2) = 1.55 times it, undamped and unloaded)"
	}
	undamped := math.Sqrt(1+math.Sqrt2) * f0
	q := 2 * math.Pi * f0 * l / rdc
	c2 := 1 / (math.Pow(2*math.Pi*f0, 2) * l)
	rc := 1 / (2 * math.Pi * rdc * c2)
	return fmt.Sprintf("the formula is the section's resonance; undamped, an LC section would fall 3 dB only above it (1.55 times it, %s), but %s's winding resistance %s (Q %.2g at %s) damps it, so in circuit it falls like an RC section, below the resonance (1/(2π·Rdc·C2) gives %s; the load moves it)",
		hz(undamped), s.Ref, figure.Format(rdc, figure.Ohm, figure.Text), q, hz(f0), hz(rc))
}
