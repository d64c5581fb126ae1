package pipeline

import "testing"

// TestShortVolts: an electrode voltage on a sheet is written by the one
// formatter of sheet figures (graph/figure.Plain): three significant
// figures, more only where the integer part needs them, never an exponent
// (a chart reader copies the figure onto a meter reading; common practice).
func TestShortVolts(t *testing.T) {
	for _, tc := range []struct {
		v    float64
		want string
	}{
		{233.46, "233"},
		{1234.6, "1235"}, // not "1.23e+03"
		{-16.54, "-16.5"},
		{0.01234, "0.0123"},
		{0.004, "0"}, // below half a 10 mV digit: nothing to read
	} {
		if got := shortVolts(tc.v); got != tc.want {
			t.Errorf("shortVolts(%g) = %q, want %q", tc.v, got, tc.want)
		}
	}
}
