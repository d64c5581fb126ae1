package value

import (
	"errors"
	"testing"
)

func TestParseTolerance(t *testing.T) {
	// Notations are the ones written on parts and parts lists (common
	// practice, no source); +80/-20 % is the usual electrolytic figure.
	tests := []struct {
		in   string
		want Tolerance
		str  string
	}{
		{"5%", Tolerance{0.05, 0.05}, "±5 %"},
		{"±5 %", Tolerance{0.05, 0.05}, "±5 %"},
		{"+-5%", Tolerance{0.05, 0.05}, "±5 %"},
		{"+/-5%", Tolerance{0.05, 0.05}, "±5 %"},
		{"10 %", Tolerance{0.1, 0.1}, "±10 %"},
		{"± 0.5 %", Tolerance{0.005, 0.005}, "±0.5 %"},
		{"7%", Tolerance{0.07, 0.07}, "±7 %"}, // 0.07*100 is not exactly 7 in binary
		{"+80/-20%", Tolerance{0.8, 0.2}, "+80/−20 %"},
		{"+80%/-20%", Tolerance{0.8, 0.2}, "+80/−20 %"},
		{"-20/+80 %", Tolerance{0.8, 0.2}, "+80/−20 %"},
		{"+80/\u221220 %", Tolerance{0.8, 0.2}, "+80/−20 %"},
		{"+5/-5%", Tolerance{0.05, 0.05}, "±5 %"},
		{"0%", Tolerance{}, ""},
	}
	for _, tc := range tests {
		got, err := ParseTolerance(tc.in)
		if err != nil {
			t.Errorf("ParseTolerance(%q): %v", tc.in, err)
			continue
		}
		if got != tc.want {
			t.Errorf("ParseTolerance(%q) = %v, want %v", tc.in, got, tc.want)
		}
		if s := got.String(); s != tc.str {
			t.Errorf("ParseTolerance(%q).String() = %q, want %q", tc.in, s, tc.str)
		}
	}
}

func TestParseToleranceErrors(t *testing.T) {
	// All messages are this package's own wording.
	tests := []struct {
		in, msg string
	}{
		{"", `empty tolerance`},
		{"5", `tolerance "5": needs a % sign (5 %)`},
		{"0.05", `tolerance "0.05": needs a % sign (for a fraction 0.05 write 5 %)`},
		{"+5%", `tolerance "+5%": write ±5 % for a symmetric tolerance or +80/-20 % for an asymmetric one`},
		{"0,5%", `tolerance "0,5%": use a point, not a comma`},
		{"+80/20%", `tolerance "+80/20%": each side of an asymmetric tolerance needs its sign, as in +80/-20 %`},
		{"+80/+20%", `tolerance "+80/+20%": an asymmetric tolerance needs one + side and one - side, as in +80/-20 %`},
		{"+10/-120%", `tolerance "+10/-120%": the minus side cannot exceed 100 %`},
		{"±150%", `tolerance "±150%": a symmetric tolerance above 100 % would allow negative values`},
		{"±1e2%", `tolerance "±1e2%": "1e2" is not a percentage`},
		{"%", `tolerance "%": "" is not a percentage`},
	}
	for _, tc := range tests {
		_, err := ParseTolerance(tc.in)
		if err == nil {
			t.Errorf("ParseTolerance(%q): no error, want %q", tc.in, tc.msg)
			continue
		}
		if err.Error() != tc.msg {
			t.Errorf("ParseTolerance(%q) error\n got %q\nwant %q", tc.in, err.Error(), tc.msg)
		}
		if !errors.Is(err, ErrSyntax) {
			t.Errorf("ParseTolerance(%q): error is not ErrSyntax", tc.in)
		}
	}
}
