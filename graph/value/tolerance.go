package value

import (
	"fmt"
	"strconv"
	"strings"
)

// Tolerance is the permitted deviation as fractions of the nominal value:
// ±5 % is {0.05, 0.05}; an electrolytic's +80/-20 % is {0.8, 0.2}. Both
// fields are non-negative.
type Tolerance struct{ Plus, Minus float64 }

// ParseTolerance reads "5%", "±5 %", "+-5%", "+/-5%" and asymmetric
// "+80/-20%" (either side first, each may carry its own %). A bare number
// is refused: "0.05" and "5" are each plausible as the other.
func ParseTolerance(s string) (Tolerance, error) {
	t := strings.TrimSpace(s)
	fail := func(msg string) (Tolerance, error) {
		return Tolerance{}, &inputError{kind: ErrSyntax, what: "tolerance", text: t, msg: msg}
	}
	if t == "" {
		return fail("")
	}
	if strings.ContainsRune(t, ',') {
		return fail("use a point, not a comma")
	}
	if !strings.HasSuffix(t, "%") {
		// "0.05" most likely means 5 %, so the hint must not suggest 0.05 %.
		if n, err := percent(t); err == "" && n < 0.01 && n > 0 {
			return fail(fmt.Sprintf("needs a %% sign (for a fraction %s write %s %%)", t, pct(n*100)))
		}
		return fail(fmt.Sprintf("needs a %% sign (%s %%)", t))
	}
	body := strings.TrimSpace(strings.TrimSuffix(t, "%"))
	for _, sym := range []string{"\u00b1", "+/-", "+/\u2212", "+-", "+\u2212"} {
		if rest, ok := strings.CutPrefix(body, sym); ok {
			n, err := percent(rest)
			if err != "" {
				return fail(err)
			}
			if n > 1 {
				return fail("a symmetric tolerance above 100 % would allow negative values")
			}
			return Tolerance{n, n}, nil
		}
	}
	a, b, asym := strings.Cut(body, "/")
	if !asym {
		if strings.HasPrefix(body, "+") || strings.HasPrefix(body, "-") || strings.HasPrefix(body, "\u2212") {
			return fail("write ±5 % for a symmetric tolerance or +80/-20 % for an asymmetric one")
		}
		n, err := percent(body)
		if err != "" {
			return fail(err)
		}
		if n > 1 {
			return fail("a symmetric tolerance above 100 % would allow negative values")
		}
		return Tolerance{n, n}, nil
	}
	var tol Tolerance
	var havePlus, haveMinus bool
	for _, part := range []string{a, b} {
		part = strings.TrimSpace(strings.TrimSuffix(strings.TrimSpace(part), "%"))
		var rest string
		plus := false
		switch {
		case strings.HasPrefix(part, "+"):
			rest, plus = part[1:], true
		case strings.HasPrefix(part, "-"):
			rest = part[1:]
		case strings.HasPrefix(part, "\u2212"):
			rest = part[len("\u2212"):]
		default:
			return fail("each side of an asymmetric tolerance needs its sign, as in +80/-20 %")
		}
		n, err := percent(rest)
		if err != "" {
			return fail(err)
		}
		if plus {
			tol.Plus, havePlus = n, true
		} else {
			tol.Minus, haveMinus = n, true
		}
	}
	if !havePlus || !haveMinus {
		return fail("an asymmetric tolerance needs one + side and one - side, as in +80/-20 %")
	}
	if tol.Minus > 1 {
		return fail("the minus side cannot exceed 100 %")
	}
	return tol, nil
}

// percent reads an unsigned decimal like "5" or "0.25" and returns it as a
// fraction; exponents and signs are refused since no marking uses them.
func percent(s string) (float64, string) {
	s = strings.TrimSpace(s)
	i := skipDigits(s, 0)
	j := i
	if j < len(s) && s[j] == '.' {
		j = skipDigits(s, j+1)
	}
	if s == "" || j != len(s) || s == "." {
		return 0, fmt.Sprintf("%q is not a percentage", s)
	}
	n, err := strconv.ParseFloat(s, 64)
	if err != nil {
		return 0, fmt.Sprintf("%q is not a percentage", s)
	}
	return n / 100, ""
}

// String writes "±5 %" or "+80/−20 %" (with a typographic minus, which
// ParseTolerance also reads); the zero value gives "" so that an unset
// tolerance prints nothing.
func (t Tolerance) String() string {
	if t == (Tolerance{}) {
		return ""
	}
	if t.Plus == t.Minus {
		return "\u00b1" + pct(t.Plus) + " %"
	}
	return "+" + pct(t.Plus) + "/\u2212" + pct(t.Minus) + " %"
}

// pct hides the binary noise of fraction*100 (0.07*100 is 7.000000000000001).
func pct(f float64) string {
	r, _ := strconv.ParseFloat(strconv.FormatFloat(f*100, 'g', 6, 64), 64)
	return strconv.FormatFloat(r, 'f', -1, 64)
}
