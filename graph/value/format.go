package value

import (
	"math"
	"strconv"
	"strings"
)

// Style selects how Format writes a value.
type Style int

const (
	// Symbol writes a number, a space and prefixed unit: "4.7 kΩ", "100 pF".
	Symbol Style = iota
	// Code writes the IEC 60062 letter code: "4k7", "100R", "R47", "2n2",
	// "4u7". It is ASCII and always re-parses with Parse.
	Code
)

// DefaultDigits is the number of significant digits Format keeps: as many as
// a marking or an E24 value carries.
const DefaultDigits = 3

// Beyond the prefixes Format knows it falls back to exponent notation.
const (
	minPrefixExp = -15
	maxPrefixExp = 12
)

var prefixSymbol = map[int]string{
	-15: "f", -12: "p", -9: "n", -6: "\u00b5", -3: "m",
	0: "", 3: "k", 6: "M", 9: "G", 12: "T",
}

var prefixCode = map[int]string{
	-15: "f", -12: "p", -9: "n", -6: "u", -3: "m",
	3: "k", 6: "M", 9: "G", 12: "T",
}

// Format writes v in the trade's short form with DefaultDigits significant
// digits, trailing zeros trimmed: Format(4700, Ohm, Symbol) is "4.7 kΩ",
// Format(4700, Ohm, Code) is "4k7".
func Format(v float64, u Unit, s Style) string {
	return FormatPrec(v, u, s, DefaultDigits)
}

// FormatPrec is Format with digits significant digits (clamped to 1..17).
// The prefix is chosen so that the number lies in 1..999, with two trade
// conventions: capacitances skip milli ("4700 µF", not "4.7 mF"), and
// resistances from 0.01 to 1 Ω are written without prefix ("R47",
// "0.47 Ω") as on current-sense resistors. Code uses L for milliohm ("2L2")
// and V for whole volts ("4V7"), as on zener diodes.
func FormatPrec(v float64, u Unit, s Style, digits int) string {
	num, suffix := formatParts(v, u, s, digits)
	return join(num, suffix, u, s)
}

func join(num, suffix string, u Unit, s Style) string {
	if s == Code || suffix == "" {
		return num + suffix
	}
	if u == None {
		// A bare prefix reads as part of the number: "4.7k".
		return num + suffix
	}
	return num + " " + suffix
}

// formatParts splits the output into number and suffix so that FormatRange
// can share one suffix between both ends. In Code style the suffix is empty
// and the number holds everything.
func formatParts(v float64, u Unit, s Style, digits int) (string, string) {
	if digits < 1 {
		digits = 1
	}
	if digits > 17 {
		digits = 17
	}
	switch {
	case math.IsNaN(v):
		return "NaN", symbolSuffix(0, u, s)
	case math.IsInf(v, 1):
		return "+Inf", symbolSuffix(0, u, s)
	case math.IsInf(v, -1):
		return "-Inf", symbolSuffix(0, u, s)
	case v == 0:
		if s == Code {
			return "0" + zeroCode(u), ""
		}
		return "0", symbolSuffix(0, u, s)
	}
	sign := ""
	if v < 0 {
		sign, v = "-", -v
	}
	// strconv does the rounding, so the digits are exactly those of the
	// correctly rounded decimal and 999.6 becomes 1.00e+03, not 1000.
	e := strconv.FormatFloat(v, 'e', digits-1, 64)
	mant, expText, _ := strings.Cut(e, "e")
	exp, _ := strconv.Atoi(expText)
	d := strings.Replace(mant, ".", "", 1)

	if exp < minPrefixExp || exp > maxPrefixExp+2 {
		n := d[:1]
		if f := strings.TrimRight(d[1:], "0"); f != "" {
			n += "." + f
		}
		n = sign + n + "e" + strconv.Itoa(exp)
		return n, symbolSuffix(0, u, s)
	}

	p := floorDiv(exp, 3) * 3
	if u == Farad && p == -3 {
		p = -6
	}
	if u == Ohm && (exp == -1 || exp == -2) {
		p = 0
	}
	intPart, frac := splitDigits(d, exp-p)

	if s == Symbol {
		n := intPart
		if frac != "" {
			n += "." + frac
		}
		return sign + n, symbolSuffix(p, u, s)
	}
	letter, ok := prefixCode[p]
	switch {
	case p == 0 && u == Ohm:
		letter = "R"
		if intPart == "0" {
			intPart = ""
		}
	case p == 0 && u == Volt:
		letter = "V"
	case p == -3 && u == Ohm:
		letter = "L"
	case !ok: // no prefix and no unit letter: an ordinary decimal
		if frac != "" {
			return sign + intPart + "." + frac, ""
		}
		return sign + intPart, ""
	}
	return sign + intPart + letter + frac, ""
}

func symbolSuffix(p int, u Unit, s Style) string {
	if s == Code {
		return ""
	}
	return prefixSymbol[p] + u.Symbol()
}

func zeroCode(u Unit) string {
	switch u {
	case Ohm:
		return "R"
	case Volt:
		return "V"
	}
	return ""
}

// splitDigits places the decimal point shift places after the first of the
// significant digits d, padding with zeros either side; trailing fraction
// zeros are dropped.
func splitDigits(d string, shift int) (string, string) {
	var intPart, frac string
	switch {
	case shift < 0:
		intPart, frac = "0", strings.Repeat("0", -shift-1)+d
	case shift+1 >= len(d):
		intPart = d + strings.Repeat("0", shift+1-len(d))
	default:
		intPart, frac = d[:shift+1], d[shift+1:]
	}
	return intPart, strings.TrimRight(frac, "0")
}

func floorDiv(a, b int) int {
	q := a / b
	if a%b != 0 && (a < 0) != (b < 0) {
		q--
	}
	return q
}
