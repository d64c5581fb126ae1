package value

import (
	"strings"
	"testing"
)

// FuzzParse checks that no input panics and that anything accepted survives
// a trip through Format in both styles within 0.5 %, the precision three
// significant digits guarantee.
func FuzzParse(f *testing.F) {
	for _, s := range []string{
		"4k7", "R47", "4R7", "47K3", "1M0", "100R", "2n2", "6p8", "4µ7", "2L2", "4V7",
		"47 kohm", "4.7 kΩ", "100 pF", "1.5MHz", "250V", "1e-9", "-0", "9.996e23",
		"12p..420p", "+80/-20%", "±5 %", "4,7k", "1e999", "", "R", "0.01 mfd",
	} {
		f.Add(s)
	}
	units := []Unit{None, Ohm, Farad, Henry, Volt, Hertz, Second, Siemens, Ampere}
	f.Fuzz(func(t *testing.T, s string) {
		for _, u := range units {
			v, err := Parse(s, u)
			if err != nil {
				if err.Error() == "" {
					t.Fatalf("Parse(%q, %v): empty error message", s, u)
				}
				continue
			}
			for _, st := range []Style{Code, Symbol} {
				out := Format(v, u, st)
				w, err := Parse(out, u)
				if err != nil {
					t.Fatalf("Parse(%q, %v) = %v, Format = %q does not re-parse: %v", s, u, v, out, err)
				}
				if !closeTo(w, v, 0.005) {
					t.Fatalf("Parse(%q, %v) = %v, Format = %q re-parses as %v", s, u, v, out, w)
				}
			}
		}
		if r, err := ParseRange(s, Farad); err == nil {
			code := FormatRange(r, Farad, Code)
			back, err := ParseRange(code, Farad)
			if err != nil {
				t.Fatalf("ParseRange(%q) = %v, FormatRange = %q does not re-parse: %v", s, r, code, err)
			}
			if !closeTo(back.Min, r.Min, 0.005) || !closeTo(back.Max, r.Max, 0.005) {
				t.Fatalf("ParseRange(%q) = %v, FormatRange = %q re-parses as %v", s, r, code, back)
			}
			_ = FormatRange(r, Farad, Symbol)
		}
		if tol, err := ParseTolerance(s); err == nil && tol != (Tolerance{}) {
			str := tol.String()
			back, err := ParseTolerance(str)
			if err != nil {
				t.Fatalf("ParseTolerance(%q) = %v, String = %q does not re-parse: %v", s, tol, str, err)
			}
			if !closeTo(back.Plus, tol.Plus, 1e-5) || !closeTo(back.Minus, tol.Minus, 1e-5) {
				t.Fatalf("ParseTolerance(%q) = %v, String = %q re-parses as %v", s, tol, str, back)
			}
		} else if err != nil && !strings.HasPrefix(err.Error(), "tolerance ") && err.Error() != "empty tolerance" {
			t.Fatalf("ParseTolerance(%q): error without context: %v", s, err)
		}
	})
}
