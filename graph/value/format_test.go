package value

import (
	"math"
	"testing"
)

func TestFormat(t *testing.T) {
	tests := []struct {
		v    float64
		u    Unit
		s    Style
		want string
	}{
		{4700, Ohm, Code, "4k7"},                // IEC 60062 RKM code examples (4K7), as reproduced in the Wikipedia "RKM code" article; lowercase k is common practice, no source
		{0.47, Ohm, Code, "R47"},                // IEC 60062 RKM code examples, as reproduced in the Wikipedia "RKM code" article
		{4.7, Ohm, Code, "4R7"},                 // IEC 60062 RKM code examples, as reproduced in the Wikipedia "RKM code" article
		{47300, Ohm, Code, "47k3"},              // IEC 60062 RKM code examples (47K3), as reproduced in the Wikipedia "RKM code" article
		{4.7e6, Ohm, Code, "4M7"},               // IEC 60062 RKM code examples, as reproduced in the Wikipedia "RKM code" article
		{100, Ohm, Code, "100R"},                // pattern of the 470R example, IEC 60062 RKM code as reproduced in the Wikipedia "RKM code" article
		{1e6, Ohm, Code, "1M"},                  // 1M0 in the RKM examples; dropping the trailing zero is this package's choice
		{2.2e-9, Farad, Code, "2n2"},            // capacitor-marking page (eestudenthelp)
		{6.8e-12, Farad, Code, "6p8"},           // from memory
		{4.7e-6, Farad, Code, "4u7"},            // common practice, no source
		{1e-6, Farad, Code, "1u"},               // common practice, no source
		{1e-10, Farad, Code, "100p"},            // common practice, no source
		{2.2e-3, Ohm, Code, "2L2"},              // L = milliohm; the brief's rule, no further source
		{0.047, Ohm, Code, "R047"},              // derived from the R47 example
		{4.7, Volt, Code, "4V7"},                // zener-voltage style; common practice, no source
		{250, Volt, Code, "250V"},               // same convention as 4V7
		{0, Ohm, Code, "0R"},                    // zero-ohm link marking; common practice, no source
		{0, Farad, Code, "0"},                   // this package's choice
		{-4700, Ohm, Code, "-4k7"},              // sign kept; this package's choice
		{455e3, Hertz, Code, "455k"},            // this package's choice, re-parses as 455 kHz
		{10.7e6, Hertz, Code, "10M7"},           // this package's choice
		{1.5, Hertz, Code, "1.5"},               // no prefix and no unit letter: plain decimal; this package's choice
		{4.7e-3, Farad, Code, "4700u"},          // capacitors skip milli; common practice, no source
		{1e20, Hertz, Code, "1e20"},             // beyond the prefixes; this package's choice
		{4700, Ohm, Symbol, "4.7 kΩ"},           // SI prefix notation; choosing the prefix that gives 1..999 is common practice, no source
		{1e-10, Farad, Symbol, "100 pF"},        // common practice, no source
		{2.2e-9, Farad, Symbol, "2.2 nF"},       // common practice, no source
		{4.7e-3, Farad, Symbol, "4700 µF"},      // capacitors in pF/nF/µF only; common practice, no source
		{455e3, Hertz, Symbol, "455 kHz"},       // SI prefix notation
		{0.47, Ohm, Symbol, "0.47 Ω"},           // sub-ohm resistors without prefix; this package's choice
		{2.2e-3, Ohm, Symbol, "2.2 mΩ"},         // SI prefix notation
		{0, Ohm, Symbol, "0 Ω"},                 // this package's choice
		{4700, None, Symbol, "4.7k"},            // a bare prefix joins the number; this package's choice
		{999.6, Ohm, Symbol, "1 kΩ"},            // rounding moves to the next prefix; arithmetic
		{-0.5, Volt, Symbol, "-500 mV"},         // SI prefix notation, sign kept
		{1.23e-20, Farad, Symbol, "1.23e-20 F"}, // beyond the prefixes; this package's choice
		{math.NaN(), Ohm, Symbol, "NaN Ω"},      // never produced by Parse; must not panic
		{math.Inf(1), Ohm, Code, "+Inf"},        // never produced by Parse; must not panic
	}
	for _, tc := range tests {
		if got := Format(tc.v, tc.u, tc.s); got != tc.want {
			t.Errorf("Format(%v, %v, %v) = %q, want %q", tc.v, tc.u, tc.s, got, tc.want)
		}
	}
}

func TestFormatPrec(t *testing.T) {
	tests := []struct {
		v      float64
		digits int
		want   string
	}{
		{4700, 3, "4k7"},       // trailing zeros trimmed; this package's choice
		{47300, 3, "47k3"},     // IEC 60062 RKM code examples (47K3)
		{47321, 3, "47k3"},     // arithmetic rounding
		{47321, 5, "47k321"},   // arithmetic rounding
		{47321, 2, "47k"},      // arithmetic rounding
		{47321, 1, "50k"},      // arithmetic rounding
		{47321, 0, "50k"},      // clamped to one digit
		{4712.5, 40, "4k7125"}, // clamped to 17 digits
	}
	for _, tc := range tests {
		if got := FormatPrec(tc.v, Ohm, Code, tc.digits); got != tc.want {
			t.Errorf("FormatPrec(%v, Ohm, Code, %d) = %q, want %q", tc.v, tc.digits, got, tc.want)
		}
	}
}

// roundTripValues spans the whole accepted magnitude range with mantissas
// that sit on, near and across rounding edges.
func roundTripValues() []float64 {
	mants := []float64{1, 1.005, 1.2, 1.5, 2.2, 3.14159, 4.7, 4.73, 5.6, 6.8, 8.2, 9.1, 9.949, 9.95, 9.996, 10.0049, 99.96, 123.456, 999.5}
	var vs []float64
	for e := -24; e <= 23; e++ {
		for _, m := range mants {
			v := m * math.Pow(10, float64(e))
			if v < MinMagnitude || v > MaxMagnitude {
				continue
			}
			vs = append(vs, v, -v)
		}
	}
	return append(vs, 0, MinMagnitude, MaxMagnitude)
}

func TestRoundTrip(t *testing.T) {
	// The property itself comes from the package contract: a value written in
	// code form must read back to three significant digits.
	units := []Unit{None, Ohm, Farad, Henry, Volt, Hertz, Second, Siemens, Ampere}
	n := 0
	for _, u := range units {
		for _, v := range roundTripValues() {
			want := round3(v)
			code := Format(v, u, Code)
			got, err := Parse(code, u)
			if err != nil {
				t.Errorf("Parse(Format(%v, %v, Code) = %q): %v", v, u, code, err)
				continue
			}
			if got != want {
				t.Errorf("Parse(Format(%v, %v, Code) = %q) = %v, want %v", v, u, code, got, want)
			}
			sym := Format(v, u, Symbol)
			got, err = Parse(sym, u)
			if err != nil {
				t.Errorf("Parse(Format(%v, %v, Symbol) = %q): %v", v, u, sym, err)
				continue
			}
			if got != want {
				t.Errorf("Parse(Format(%v, %v, Symbol) = %q) = %v, want %v", v, u, sym, got, want)
			}
			n++
		}
	}
	if n < 1000 {
		t.Errorf("only %d round trips checked", n)
	}
}
