package value

import (
	"errors"
	"testing"
)

func TestParseRange(t *testing.T) {
	// Spans and spellings are this package's notation; the capacitor values
	// are typical of a broadcast tuning gang (common practice, no source).
	tests := []struct {
		in   string
		want Unit
		r    Range
	}{
		{"12p..420p", Farad, Range{12e-12, 420e-12}},
		{"12p .. 420p", Farad, Range{12e-12, 420e-12}},
		{"530k..1.7M", Hertz, Range{530e3, 1.7e6}},
		{"530k..1M7", Hertz, Range{530e3, 1.7e6}},
		{"12p\u2026420p", Farad, Range{12e-12, 420e-12}}, // ellipsis character
		{"0..10k", Ohm, Range{0, 10e3}},
		{"4k7", Ohm, Range{4700, 4700}},
		{"5..5", Volt, Range{5, 5}},
	}
	for _, tc := range tests {
		got, err := ParseRange(tc.in, tc.want)
		if err != nil {
			t.Errorf("ParseRange(%q): %v", tc.in, err)
			continue
		}
		if got != tc.r {
			t.Errorf("ParseRange(%q) = %v, want %v", tc.in, got, tc.r)
		}
	}
}

func TestParseRangeErrors(t *testing.T) {
	// All messages are this package's own wording.
	tests := []struct {
		in   string
		want Unit
		msg  string
		kind error
	}{
		{"", Ohm, `empty range`, ErrSyntax},
		{"1..", Ohm, `range "1..": nothing after ".."`, ErrSyntax},
		{"..1", Ohm, `range "..1": nothing before ".."`, ErrSyntax},
		{"1..2..3", Ohm, `range "1..2..3": write exactly one ".." between two values`, ErrSyntax},
		{"1...5", Ohm, `range "1...5": write exactly one ".." between two values`, ErrSyntax},
		{"-5", Ohm, `range "-5": negative value "-5"`, ErrOutOfRange},
		{"-5..5", Ohm, `range "-5..5": negative value "-5"`, ErrOutOfRange},
		{"420p..12p", Farad, `range "420p..12p": 420p is above 12p; write the smaller value first`, ErrOutOfRange},
		{"12p..4x", Farad, `range "12p..4x": value "4x": unknown unit or prefix "x"`, ErrSyntax},
		{"12p..420pH", Farad, `range "12p..420pH": value "420pH": unit H does not fit a farad value`, ErrUnit},
	}
	for _, tc := range tests {
		_, err := ParseRange(tc.in, tc.want)
		if err == nil {
			t.Errorf("ParseRange(%q): no error, want %q", tc.in, tc.msg)
			continue
		}
		if err.Error() != tc.msg {
			t.Errorf("ParseRange(%q) error\n got %q\nwant %q", tc.in, err.Error(), tc.msg)
		}
		if !errors.Is(err, tc.kind) {
			t.Errorf("ParseRange(%q): error %v is not %v", tc.in, err, tc.kind)
		}
	}
}

func TestRangeMethods(t *testing.T) {
	// Arithmetic on the definitions in the package documentation.
	r := Range{12e-12, 420e-12}
	if !r.IsSpan() || (Range{1, 1}).IsSpan() {
		t.Error("IsSpan wrong")
	}
	if got := r.Mid(); !closeTo(got, 216e-12, 1e-12) { // (12+420)/2
		t.Errorf("Mid = %v, want 216e-12", got)
	}
	if got := r.At(0); got != r.Min {
		t.Errorf("At(0) = %v", got)
	}
	if got := r.At(1); got != r.Max {
		t.Errorf("At(1) = %v", got)
	}
	if got := r.At(0.25); !closeTo(got, 114e-12, 1e-12) { // 12 + 0.25*408
		t.Errorf("At(0.25) = %v, want 114e-12", got)
	}
}

func TestFormatRange(t *testing.T) {
	// Output forms are this package's choice; Code must re-parse.
	tests := []struct {
		r         Range
		u         Unit
		sym, code string
	}{
		{Range{12e-12, 420e-12}, Farad, "12–420 pF", "12p..420p"},
		{Range{530e3, 1.7e6}, Hertz, "530 kHz–1.7 MHz", "530k..1M7"},
		{Range{0, 10e3}, Ohm, "0–10 kΩ", "0R..10k"},
		{Range{4700, 4700}, Ohm, "4.7 kΩ", "4k7"},
		{Range{1e3, 10e3}, None, "1–10k", "1k..10k"},
	}
	for _, tc := range tests {
		if got := FormatRange(tc.r, tc.u, Symbol); got != tc.sym {
			t.Errorf("FormatRange(%v, Symbol) = %q, want %q", tc.r, got, tc.sym)
		}
		code := FormatRange(tc.r, tc.u, Code)
		if code != tc.code {
			t.Errorf("FormatRange(%v, Code) = %q, want %q", tc.r, code, tc.code)
		}
		back, err := ParseRange(code, tc.u)
		if err != nil || back != tc.r {
			t.Errorf("ParseRange(%q) = %v, %v; want %v", code, back, err, tc.r)
		}
	}
}
