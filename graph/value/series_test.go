package value

import (
	"math"
	"slices"
	"testing"
)

// IEC 60063 preferred-number series, source: IEC 60063 lists as reproduced
// in the RWTH Aachen MSP430 book appendix.
var iec60063 = map[Series][]float64{
	E6:  {1.0, 1.5, 2.2, 3.3, 4.7, 6.8},
	E12: {1.0, 1.2, 1.5, 1.8, 2.2, 2.7, 3.3, 3.9, 4.7, 5.6, 6.8, 8.2},
	E24: {1.0, 1.1, 1.2, 1.3, 1.5, 1.6, 1.8, 2.0, 2.2, 2.4, 2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7, 5.1, 5.6, 6.2, 6.8, 7.5, 8.2, 9.1},
}

func TestSeriesValues(t *testing.T) {
	for _, s := range []Series{E6, E12, E24} {
		want := iec60063[s]
		got := s.Values()
		if !slices.Equal(got, want) {
			t.Errorf("%v.Values() = %v, want %v", s, got, want)
		}
		got[0] = 99
		if s.Values()[0] != 1.0 {
			t.Errorf("%v.Values() shares its table with the caller", s)
		}
	}
	if Series(7).Values() != nil {
		t.Error("unknown series has values")
	}
}

func TestSeriesIsNotAFormula(t *testing.T) {
	// Derived from the IEC 60063 table above: rounding 10^(i/24) to one
	// decimal gives 2.6 at i=10, where the table has 2.7.
	formula := math.Round(math.Pow(10, 10.0/24)*10) / 10
	if got := E24.Values()[10]; got == formula || got != 2.7 {
		t.Errorf("E24[10] = %v, formula gives %v", got, formula)
	}
}

func TestSeriesTolerance(t *testing.T) {
	tests := []struct {
		s    Series
		want float64
	}{
		{E6, 0.20},  // itwissen.info
		{E12, 0.10}, // itwissen.info
		{E24, 0.05}, // itwissen.info
		{Series(7), 0},
	}
	for _, tc := range tests {
		if got := tc.s.Tolerance(); got != tc.want {
			t.Errorf("%v.Tolerance() = %v, want %v", tc.s, got, tc.want)
		}
	}
}

func TestNearest(t *testing.T) {
	// Rounding rule is an implementation choice (log distance; common
	// practice, no source); the geometric midpoints quoted are derived.
	tests := []struct {
		v    float64
		s    Series
		want float64
	}{
		{5000, E12, 4700},       // midpoint 4.7/5.6 is 5.1303
		{5000, E24, 5100},       // midpoint 4.7/5.1 is 4.8959
		{3000, E12, 3300},       // midpoint 2.7/3.3 is 2.98496
		{3000, E24, 3000},       // on the table
		{1100, E12, 1200},       // midpoint 1.0/1.2 is 1.09545
		{1100, E24, 1100},       // on the table
		{2500, E12, 2700},       // midpoint 2.2/2.7 is 2.43721
		{2500, E24, 2400},       // midpoint 2.4/2.7 is 2.54558
		{1.05e6, E24, 1.1e6},    // midpoint 1.0/1.1 is 1.04881
		{8700, E6, 10000},       // midpoint 6.8/10 is 8.24621, so across the decade
		{9.6e-12, E12, 10e-12},  // midpoint 8.2/10 is 9.05539, across the decade
		{4.7e-9, E12, 4.7e-9},   // on the table
		{1, E6, 1},              // decade edge
		{0.99999, E6, 1},        // just below a decade edge
		{0, E12, 0},             // no preferred value: unchanged
		{-4700, E12, -4700},     // no preferred value: unchanged
		{4321, Series(7), 4321}, // unknown series: unchanged
	}
	for _, tc := range tests {
		if got := Nearest(tc.v, tc.s); got != tc.want {
			t.Errorf("Nearest(%v, %v) = %v, want %v", tc.v, tc.s, got, tc.want)
		}
	}
	if got := Nearest(math.NaN(), E12); !math.IsNaN(got) {
		t.Errorf("Nearest(NaN) = %v", got)
	}
}
