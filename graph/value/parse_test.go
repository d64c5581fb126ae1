package value

import (
	"errors"
	"math"
	"strconv"
	"testing"
)

func TestParseLetterCode(t *testing.T) {
	tests := []struct {
		in   string
		want Unit
		v    float64
	}{
		{"4K7", Ohm, 4700},          // IEC 60062 RKM code examples, as reproduced in the Wikipedia "RKM code" article
		{"R47", Ohm, 0.47},          // IEC 60062 RKM code examples, as reproduced in the Wikipedia "RKM code" article
		{"4R7", Ohm, 4.7},           // IEC 60062 RKM code examples, as reproduced in the Wikipedia "RKM code" article
		{"47K3", Ohm, 47300},        // IEC 60062 RKM code examples, as reproduced in the Wikipedia "RKM code" article
		{"4M7", Ohm, 4.7e6},         // IEC 60062 RKM code examples, as reproduced in the Wikipedia "RKM code" article
		{"1M0", Ohm, 1e6},           // IEC 60062 RKM code examples, as reproduced in the Wikipedia "RKM code" article
		{"100R", Ohm, 100},          // pattern of the 470R example, IEC 60062 RKM code as reproduced in the Wikipedia "RKM code" article
		{"4k7", Ohm, 4700},          // common practice, no source
		{"2n2", Farad, 2.2e-9},      // capacitor-marking page (eestudenthelp)
		{"6p8", Farad, 6.8e-12},     // from memory
		{"4u7", Farad, 4.7e-6},      // common practice, no source
		{"4\u00b57", Farad, 4.7e-6}, // same as 4u7 with MICRO SIGN; "u" and "µ" are one prefix by this package's rule
		{"4\u03bc7", Farad, 4.7e-6}, // same as 4u7 with Greek mu; this package's rule
		{"2L2", Ohm, 2.2e-3},        // L = milliohm for resistors; the brief's rule, no further source
		{"47L", Ohm, 47e-3},         // same rule as 2L2
		{"R047", Ohm, 0.047},        // R as decimal point, derived from the R47 example
		{"4V7", Volt, 4.7},          // zener-voltage style marking; common practice, no source
		{"-4k7", Ohm, -4700},        // sign kept; this package's rule
	}
	for _, tc := range tests {
		got, err := Parse(tc.in, tc.want)
		if err != nil {
			t.Errorf("Parse(%q, %v): %v", tc.in, tc.want, err)
			continue
		}
		if got != tc.v {
			t.Errorf("Parse(%q, %v) = %v, want %v", tc.in, tc.want, got, tc.v)
		}
	}
}

func TestParseSINotation(t *testing.T) {
	// The SI prefix values are those of the SI itself; the spellings accepted
	// (spaces, unit words, "K" for kilo) are this package's choice.
	tests := []struct {
		in   string
		want Unit
		v    float64
	}{
		{"470", Ohm, 470},
		{"1e-9", Farad, 1e-9},
		{"0.1", Farad, 0.1},
		{".5", None, 0.5},
		{"47k", Ohm, 47e3},
		{"47K", Ohm, 47e3},
		{"47kΩ", Ohm, 47e3},
		{"47k\u2126", Ohm, 47e3}, // OHM SIGN code point
		{"47 kohm", Ohm, 47e3},
		{"47 kOhms", Ohm, 47e3},
		{"4.7 kΩ", Ohm, 4.7e3},
		{"4k7Ω", Ohm, 4.7e3},
		{"100 pF", Farad, 100e-12},
		{"100pf", Farad, 100e-12}, // SI prefix p = 1e-12, unit in the wrong case
		{"47 uh", Henry, 47e-6},   // SI prefix u = 1e-6
		{"10khz", Hertz, 10e3},    // SI prefix k = 1e3
		{"100pF", Farad, 100e-12},
		{"1.5MHz", Hertz, 1.5e6},
		{"455 kHz", Hertz, 455e3},
		{"250V", Volt, 250},
		{"250 volts", Volt, 250},
		{"10 mA", Ampere, 10e-3},
		{"10 ms", Second, 10e-3},
		{"2 mS", Siemens, 2e-3},
		{"1 mohm", Ohm, 1e-3},
		{"1 Mohm", Ohm, 1e6},
		{"1 F", Farad, 1},
		{"1 fF", Farad, 1e-15},
		{"1T", None, 1e12},
		{"10 H", Henry, 10},
		{"100µH", Henry, 100e-6},
		{"1.5e3k", None, 1.5e6},
		{"+5", Volt, 5},
		{"\u22125", Volt, -5}, // typographic minus
		{"  4k7  ", Ohm, 4700},
		{"0", Ohm, 0},
		{"1e24", None, 1e24},
		{"1e-24", None, 1e-24},
	}
	for _, tc := range tests {
		got, err := Parse(tc.in, tc.want)
		if err != nil {
			t.Errorf("Parse(%q, %v): %v", tc.in, tc.want, err)
			continue
		}
		if got != tc.v {
			t.Errorf("Parse(%q, %v) = %v, want %v", tc.in, tc.want, got, tc.v)
		}
	}
}

func TestParseErrors(t *testing.T) {
	// All messages are this package's own wording.
	tests := []struct {
		in   string
		want Unit
		msg  string
		kind error
	}{
		{"", Ohm, `empty value`, ErrSyntax},
		{"   ", Ohm, `empty value`, ErrSyntax},
		{"abc", Ohm, `value "abc": not a number: write a number with an optional SI prefix or code letter and unit, as "4k7"`, ErrSyntax},
		{"R", Ohm, `value "R": not a number: write a number with an optional SI prefix or code letter and unit, as "4k7"`, ErrSyntax},
		// A capacitor's class and the mains sign copied from its body with
		// the voltage (common practice on suppression capacitors).
		{"X2 275V~", Volt, `value "X2 275V~": not a number; did you mean "275V"?`, ErrSyntax},
		{"Y1 250 V~", Volt, `value "Y1 250 V~": not a number; did you mean "250"?`, ErrSyntax},
		{"V~", Volt, `value "V~": not a number: write a number with an optional SI prefix or code letter and unit, as "275V"`, ErrSyntax},
		{"about 4k7", Ohm, `value "about 4k7": not a number; did you mean "4k7"?`, ErrSyntax},
		{"X2 275V~", Ohm, `value "X2 275V~": not a number: write a number with an optional SI prefix or code letter and unit, as "4k7"`, ErrSyntax},
		{"4k7k", Ohm, `value "4k7k": extra multiplier "k" after "4k7": the code letter already scales the number`, ErrSyntax},
		{"4,7k", Ohm, `value "4,7k": use a point or the letter code (4k7), not a comma`, ErrSyntax},
		{"2,2n", Farad, `value "2,2n": use a point or the letter code (2n2), not a comma`, ErrSyntax},
		{"4,700", Ohm, `value "4,700": use a point or the letter code, not a comma`, ErrSyntax},
		{"47uH", Farad, `value "47uH": unit H does not fit a farad value`, ErrUnit},
		{"47k", Ohm, "", nil},
		{"47 kF", Ohm, `value "47 kF": unit F does not fit an ohm value`, ErrUnit},
		{"4R7", Farad, `value "4R7": unit Ω (letter R) does not fit a farad value`, ErrUnit},
		{"2L2", Farad, `value "2L2": unit Ω (letter L) does not fit a farad value`, ErrUnit},
		{"4V7", Ohm, `value "4V7": unit V (letter V) does not fit an ohm value`, ErrUnit},
		{"4.7k3", Ohm, `value "4.7k3": use either a decimal point or a code letter, not both`, ErrSyntax},
		{"4 k7", Ohm, `value "4 k7": unknown unit or prefix "k7"`, ErrSyntax},
		{"10 mhz", Hertz, `value "10 mhz": unknown unit or prefix "mhz"`, ErrSyntax},
		// A unit in the wrong case after a prefix whose case never matters
		// (common practice on parts lists): read where it can mean one thing.
		{"100pf", Farad, "", nil},
		{"47 uh", Henry, "", nil},
		{"10khz", Hertz, "", nil},
		{"100pf", Henry, `value "100pf": unknown unit or prefix "pf"`, ErrSyntax},
		{"10 mf", Farad, `value "10 mf": unknown unit or prefix "mf"`, ErrSyntax},
		{"4k7x", Ohm, `value "4k7x": unknown unit "x"`, ErrSyntax},
		{"0.01 mfd", Farad, `value "0.01 mfd": old marking "mfd" is not read (m means milli here); write 0.01u`, ErrSyntax},
		{"1e999", Ohm, `value "1e999": out of range (magnitude must be 0 or 1e-24 to 1e24)`, ErrOutOfRange},
		{"1e-999", Ohm, `value "1e-999": out of range (magnitude must be 0 or 1e-24 to 1e24)`, ErrOutOfRange},
		{"1e99999999999999999999", Ohm, `value "1e99999999999999999999": out of range (magnitude must be 0 or 1e-24 to 1e24)`, ErrOutOfRange},
		{"2e24", Ohm, `value "2e24": out of range (magnitude must be 0 or 1e-24 to 1e24)`, ErrOutOfRange},
	}
	for _, tc := range tests {
		_, err := Parse(tc.in, tc.want)
		if tc.kind == nil {
			if err != nil {
				t.Errorf("Parse(%q): unexpected error %v", tc.in, err)
			}
			continue
		}
		if err == nil {
			t.Errorf("Parse(%q, %v): no error, want %q", tc.in, tc.want, tc.msg)
			continue
		}
		if err.Error() != tc.msg {
			t.Errorf("Parse(%q, %v) error\n got %q\nwant %q", tc.in, tc.want, err.Error(), tc.msg)
		}
		if !errors.Is(err, tc.kind) {
			t.Errorf("Parse(%q): error %v is not %v", tc.in, err, tc.kind)
		}
	}
}

func TestUnitNames(t *testing.T) {
	// Symbols are the SI symbols; the names are this package's message words.
	tests := []struct {
		u         Unit
		sym, name string
	}{
		{None, "", "dimensionless"},
		{Ohm, "Ω", "ohm"},
		{Farad, "F", "farad"},
		{Henry, "H", "henry"},
		{Volt, "V", "volt"},
		{Hertz, "Hz", "hertz"},
		{Second, "s", "second"},
		{Siemens, "S", "siemens"},
		{Ampere, "A", "ampere"},
		{Unit(99), "", "Unit(99)"},
		{Unit(-1), "", "Unit(-1)"},
	}
	for _, tc := range tests {
		if got := tc.u.Symbol(); got != tc.sym {
			t.Errorf("Unit(%d).Symbol() = %q, want %q", int(tc.u), got, tc.sym)
		}
		if got := tc.u.String(); got != tc.name {
			t.Errorf("Unit(%d).String() = %q, want %q", int(tc.u), got, tc.name)
		}
	}
}

// round3 is v rounded to three significant digits, computed independently
// of Format so that the round-trip test is not circular.
func round3(v float64) float64 {
	r, _ := strconv.ParseFloat(strconv.FormatFloat(v, 'e', 2, 64), 64)
	return r
}

func closeTo(a, b, rel float64) bool {
	if a == b {
		return true
	}
	return math.Abs(a-b) <= rel*math.Max(math.Abs(a), math.Abs(b))
}
