package value

import (
	"math"
	"strconv"
)

// Series is an IEC 60063 preferred-number series, named by its count of
// values per decade.
type Series int

// The series a radio technician meets; wider tolerances used fewer values.
const (
	E6  Series = 6
	E12 Series = 12
	E24 Series = 24
)

// The standard's values, in tenths. They are a table, not a formula:
// rounding 10^(i/24) would give 2.6, 2.9, 3.2, ... where E24 has 2.7, 3.0, 3.3.
var seriesTenths = map[Series][]int{
	E6:  {10, 15, 22, 33, 47, 68},
	E12: {10, 12, 15, 18, 22, 27, 33, 39, 47, 56, 68, 82},
	E24: {10, 11, 12, 13, 15, 16, 18, 20, 22, 24, 27, 30, 33, 36, 39, 43, 47, 51, 56, 62, 68, 75, 82, 91},
}

// String gives the series name, "E12".
func (s Series) String() string { return "E" + strconv.Itoa(int(s)) }

// Values returns the mantissas of one decade, 1.0 up to 9.1, ascending. The
// slice is the caller's to modify. An unknown series has none.
func (s Series) Values() []float64 {
	t := seriesTenths[s]
	if t == nil {
		return nil
	}
	out := make([]float64, len(t))
	for i, n := range t {
		out[i] = float64(n) / 10
	}
	return out
}

// Tolerance is the tolerance the series was laid out for, as a fraction:
// adjacent values overlap at roughly that deviation. Unknown series give 0.
func (s Series) Tolerance() float64 {
	switch s {
	case E6:
		return 0.20
	case E12:
		return 0.10
	case E24:
		return 0.05
	}
	return 0
}

// Nearest returns the series value nearest to v by ratio, so the geometric
// midpoint between two neighbours decides and 8700 in E6 goes up to 10000.
// An exact tie goes to the lower value. Values without a preferred
// neighbour (zero, negative, NaN, infinite, or an unknown series) come back
// unchanged.
func Nearest(v float64, s Series) float64 {
	t := seriesTenths[s]
	if t == nil || !(v > 0) || math.IsInf(v, 1) {
		return v
	}
	decade := int(math.Floor(math.Log10(v)))
	lv := math.Log(v)
	best, bestDist := v, math.Inf(1)
	// Log10 can be off by one at decade edges, and the nearest value may sit
	// in the next decade (9.6 -> 10), so look one decade either side.
	for d := decade - 1; d <= decade+1; d++ {
		for _, n := range t {
			c, err := strconv.ParseFloat(strconv.Itoa(n)+"e"+strconv.Itoa(d-1), 64)
			if err != nil || c == 0 || math.IsInf(c, 0) {
				continue
			}
			if dist := math.Abs(lv - math.Log(c)); dist < bestDist {
				best, bestDist = c, dist
			}
		}
	}
	return best
}
