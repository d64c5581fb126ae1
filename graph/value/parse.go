package value

import (
	"errors"
	"fmt"
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"
)

// Error kinds, so a caller can tell a typo from a unit mix-up without
// matching message text: errors.Is(err, value.ErrUnit).
var (
	ErrSyntax     = errors.New("value syntax")
	ErrUnit       = errors.New("unit mismatch")
	ErrOutOfRange = errors.New("value out of range")
)

// MinMagnitude and MaxMagnitude bound what Parse accepts besides zero. No
// part in a radio is anywhere near them, so a value outside is an exponent
// typo; the bound also keeps Format's rounding clear of float overflow and
// of subnormals that cannot hold three significant digits.
const (
	MinMagnitude = 1e-24
	MaxMagnitude = 1e24
)

// Written out because %g would print 1e+24.
const outOfRangeMsg = "out of range (magnitude must be 0 or 1e-24 to 1e24)"

// inputError keeps the kind for errors.Is while the text stays a plain
// sentence; the caller prefixes file:line:col.
type inputError struct {
	kind error
	what string // "value", "range" or "tolerance"
	text string
	msg  string
}

func (e *inputError) Error() string {
	if e.text == "" {
		return "empty " + e.what
	}
	return fmt.Sprintf("%s %q: %s", e.what, e.text, e.msg)
}

func (e *inputError) Unwrap() error { return e.kind }

// prefixExp holds the SI prefixes. "k" and "K" both occur on real parts and
// cannot mean anything else; "m"/"M" stay strictly milli/mega.
var prefixExp = map[rune]int{
	'f': -15, 'p': -12, 'n': -9,
	'u': -6, '\u00b5': -6, '\u03bc': -6, // ASCII u, MICRO SIGN, Greek mu
	'm': -3,
	'k': 3, 'K': 3, 'M': 6, 'G': 9, 'T': 12,
}

// isCodeLetter reports letters that may stand in for the decimal point. R, L
// and V carry their unit with them (ohm, milliohm, volt as on zener diodes).
func isCodeLetter(r rune) bool {
	if _, ok := prefixExp[r]; ok {
		return true
	}
	return r == 'R' || r == 'L' || r == 'V'
}

func isDigit(c byte) bool { return '0' <= c && c <= '9' }

func skipDigits(s string, i int) int {
	for i < len(s) && isDigit(s[i]) {
		i++
	}
	return i
}

// Parse reads one value in the trade's notation and returns it in SI base
// units. It accepts plain and exponent numbers ("470", "1e-9"), an SI prefix
// with an optional unit symbol or word ("47k", "4.7 kΩ", "47 kohm", "100 pF",
// "1.5MHz"), and the IEC 60062 code where the letter replaces the decimal
// point ("4k7", "R47", "4R7", "47K3", "2n2", "4µ7", "2L2" = 2.2 mΩ). The
// letters R and L imply ohms and V implies volts, so they only fit those.
//
// A unit written in the text must be want; with no unit written the value is
// taken to be in want. A leading sign is kept.
func Parse(s string, want Unit) (float64, error) {
	t := strings.TrimSpace(s)
	if t == "" {
		return 0, &inputError{kind: ErrSyntax, what: "value"}
	}
	if strings.ContainsRune(t, ',') {
		return 0, commaError(t, want)
	}
	v, msg, kind := parse(t, want)
	if kind != nil {
		return 0, &inputError{kind: kind, what: "value", text: t, msg: msg}
	}
	return v, nil
}

// commaError spells out the fix, because a decimal comma is the most common
// slip from technicians trained on European schematics. "4,700" is left
// without an example since it may just as well be a thousands separator.
func commaError(t string, want Unit) error {
	msg := "use a point or the letter code, not a comma"
	if strings.Count(t, ",") == 1 && !thousandsLike(t) {
		if v, err := Parse(strings.Replace(t, ",", ".", 1), want); err == nil {
			msg = fmt.Sprintf("use a point or the letter code (%s), not a comma", FormatPrec(v, want, Code, 6))
		}
	}
	return &inputError{kind: ErrSyntax, what: "value", text: t, msg: msg}
}

func thousandsLike(t string) bool {
	i := strings.IndexByte(t, ',')
	if i == 0 || !isDigit(t[i-1]) {
		return false
	}
	j := skipDigits(t, i+1)
	return j-(i+1) == 3
}

// parse returns a message and kind instead of an error so that Parse alone
// decides how errors look. It reads, in order, a sign, the digits with a
// decimal point or an IEC 60062 code letter, an exponent, and a prefix and
// unit; each step is its own function below.
func parse(t string, want Unit) (float64, string, error) {
	neg, i := readSign(t)
	n := readDigits(t, i)
	if n.intDigits == "" && n.fracDigits == "" {
		return 0, notNumber(t, want), ErrSyntax
	}
	if msg, err := n.readExponent(t); err != nil {
		return 0, msg, err
	}
	numText := t[:n.end]
	rest := strings.TrimLeftFunc(t[n.end:], unicode.IsSpace)
	var (
		u   unitRead
		msg string
		err error
	)
	if n.code != 0 {
		u, msg, err = codeUnit(n.code, rest, numText, want)
	} else if rest != "" {
		u, msg, err = prefixUnit(rest, numText, n.hadPoint, want)
	}
	if err != nil {
		return 0, msg, err
	}
	if u.hasUnit && u.written != want {
		return 0, fmt.Sprintf("unit %s does not fit %s value", u.written.Symbol(), want.withArticle()), ErrUnit
	}
	return n.value(u.scale, neg)
}

// readSign reads an optional leading sign and returns where the digits start.
func readSign(t string) (neg bool, i int) {
	switch {
	case strings.HasPrefix(t, "+"):
		return false, 1
	case strings.HasPrefix(t, "-"):
		return true, 1
	case strings.HasPrefix(t, "\u2212"): // typographic minus, as Tolerance.String writes
		return true, len("\u2212")
	}
	return false, 0
}

// digits is the number part of a value as written: the digits before and
// after the decimal point or code letter, the code letter if any, the
// exponent, and where the number ends in the text.
type digits struct {
	intDigits, fracDigits string
	hadPoint              bool
	code                  rune
	exp, end              int
}

// readDigits reads the digits from i, with a decimal point or a code letter
// standing for it.
func readDigits(t string, i int) digits {
	var n digits
	intStart := i
	i = skipDigits(t, i)
	n.intDigits = t[intStart:i]
	if i < len(t) && t[i] == '.' {
		n.hadPoint = true
		i++
		start := i
		i = skipDigits(t, i)
		n.fracDigits = t[start:i]
	} else if i < len(t) {
		// A letter counts as a code letter only with digits after it ("4k7",
		// "R47"), or for R and L which mean nothing else ("100R"); "47k" and
		// "250volts" are read as prefix and unit below.
		r, size := utf8.DecodeRuneInString(t[i:])
		if isCodeLetter(r) {
			j := skipDigits(t, i+size)
			if j > i+size || (n.intDigits != "" && (r == 'R' || r == 'L')) {
				n.code = r
				n.fracDigits = t[i+size : j]
				i = j
			}
		}
	}
	n.end = i
	return n
}

// readExponent reads an "e" exponent after a number written without a code
// letter; an "e" with no digits after it is left for the unit.
func (n *digits) readExponent(t string) (string, error) {
	i := n.end
	if n.code != 0 || i >= len(t) || (t[i] != 'e' && t[i] != 'E') {
		return "", nil
	}
	j := i + 1
	if j < len(t) && (t[j] == '+' || t[j] == '-') {
		j++
	}
	if k := skipDigits(t, j); k > j {
		e, ok := parseExp(t[i+1 : k])
		if !ok {
			return outOfRangeMsg, ErrOutOfRange
		}
		n.exp, n.end = e, k
	}
	return "", nil
}

// unitRead is what the text after the number says: a power of ten and, if
// written, a unit.
type unitRead struct {
	scale   int
	written Unit
	hasUnit bool
}

// codeUnit reads the unit of a number written with a code letter: the
// letter sets the scale (or the unit, for R, L and V), and only a unit may
// follow it.
func codeUnit(code rune, rest, numText string, want Unit) (unitRead, string, error) {
	var u unitRead
	var letterUnit Unit
	switch code {
	case 'R':
		letterUnit = Ohm
	case 'L':
		letterUnit, u.scale = Ohm, -3
	case 'V':
		letterUnit = Volt
	default:
		letterUnit, u.scale = want, prefixExp[code]
	}
	if letterUnit != want {
		return u, fmt.Sprintf("unit %s (letter %c) does not fit %s value", letterUnit.Symbol(), code, want.withArticle()), ErrUnit
	}
	if rest == "" {
		return u, "", nil
	}
	w, ok := lookupUnit(rest)
	if !ok {
		r, _ := utf8.DecodeRuneInString(rest)
		if isCodeLetter(r) {
			return u, fmt.Sprintf("extra multiplier %q after %q: the code letter already scales the number", string(r), numText), ErrSyntax
		}
		return u, fmt.Sprintf("unknown unit %q", rest), ErrSyntax
	}
	u.written, u.hasUnit = w, true
	return u, "", nil
}

// prefixUnit reads an SI prefix and unit after a plain number.
func prefixUnit(rest, numText string, hadPoint bool, want Unit) (unitRead, string, error) {
	var u unitRead
	if r, size := utf8.DecodeRuneInString(rest); hadPoint && isCodeLetter(r) && size < len(rest) && isDigit(rest[size]) {
		return u, "use either a decimal point or a code letter, not both", ErrSyntax
	}
	if msg := oldMarkingHint(rest, numText); msg != "" {
		return u, msg, ErrSyntax
	}
	if w, ok := lookupUnit(rest); ok {
		u.written, u.hasUnit = w, true
		return u, "", nil
	}
	r, size := utf8.DecodeRuneInString(rest)
	p, ok := prefixExp[r]
	if !ok {
		return u, fmt.Sprintf("unknown unit or prefix %q", rest), ErrSyntax
	}
	u.scale = p
	if tail := rest[size:]; tail != "" {
		w, ok := lookupUnit(tail)
		if !ok && foldsTo(r, tail, want) {
			w, ok = want, true // "100pf", "47uh", "10khz": the case was lost, the meaning was not
		}
		if !ok {
			return u, fmt.Sprintf("unknown unit or prefix %q", rest), ErrSyntax
		}
		u.written, u.hasUnit = w, true
	}
	return u, "", nil
}

// value builds the number from its digits and powers of ten.
func (n digits) value(scale int, neg bool) (float64, string, error) {
	mant := n.intDigits
	if mant == "" {
		mant = "0"
	}
	if n.fracDigits != "" {
		mant += "." + n.fracDigits
	}
	// Building a decimal string and parsing it once rounds correctly, where
	// 4.7*1e3 would give 4700.000000000001.
	v, err := strconv.ParseFloat(mant+"e"+strconv.Itoa(n.exp+scale), 64)
	nonZero := strings.Trim(n.intDigits+n.fracDigits, "0") != ""
	if err != nil || (nonZero && (v < MinMagnitude || v > MaxMagnitude)) {
		return 0, outOfRangeMsg, ErrOutOfRange
	}
	if neg {
		v = -v
	}
	return v, "", nil
}

// parseExp refuses exponents too long for any sensible value so that the
// later arithmetic cannot overflow int.
func parseExp(s string) (int, bool) {
	sign := 1
	switch s[0] {
	case '-':
		sign, s = -1, s[1:]
	case '+':
		s = s[1:]
	}
	s = strings.TrimLeft(s, "0")
	if len(s) > 4 {
		return 0, false
	}
	if s == "" {
		return 0, true
	}
	n, err := strconv.Atoi(s)
	if err != nil {
		return 0, false
	}
	return sign * n, true
}

// oldMarkingHint catches "mfd"/"mmfd" from old schematics: there they mean
// microfarad and picofarad, but read by SI rules "m" is milli, so guessing
// either way would be wrong somewhere.
func oldMarkingHint(rest, num string) string {
	switch lowerASCII(rest) {
	case "mfd", "mmfd", "mmf", "uuf":
	default:
		return ""
	}
	letter := "u"
	if l := lowerASCII(rest); l == "mmfd" || l == "mmf" || l == "uuf" {
		letter = "p"
	}
	return fmt.Sprintf("old marking %q is not read (m means milli here); write %s%s", rest, num, letter)
}

// foldsTo tells whether a unit written in the wrong case after a prefix
// can only mean the wanted unit: "pf" after 100 is picofarads, as nothing
// else reads so. Only after p, n, u, µ and k, whose case never changes
// their meaning; after m ("10 mhz") milli and mega cannot be told apart.
func foldsTo(prefix rune, tail string, want Unit) bool {
	return strings.ContainsRune("pnuµk", prefix) && want != None && strings.EqualFold(tail, want.Symbol())
}

// unitExample is a value of each unit as it may be written, so a refusal
// can show an accepted form rather than only say what is wrong.
var unitExample = map[Unit]string{
	Ohm: "4k7", Farad: "100n", Henry: "10m", Volt: "275V", Hertz: "455k",
	Second: "47m", Siemens: "2m", Ampere: "36m", Watt: "12",
}

// notNumber says what a value must look like and, where one word of the
// text reads as a value of the wanted unit on its own (a rating copied
// with its class and a mains sign, "X2 275V~"), offers that word.
func notNumber(t string, want Unit) string {
	msg := "not a number"
	for _, w := range strings.Fields(t) {
		w = strings.TrimFunc(w, func(r rune) bool { return !unicode.IsLetter(r) && !unicode.IsDigit(r) && r != '.' })
		if w == "" || w == t || !isDigit(w[0]) {
			continue
		}
		if _, _, kind := parse(w, want); kind == nil {
			return fmt.Sprintf("%s; did you mean %q?", msg, w)
		}
	}
	if ex, ok := unitExample[want]; ok {
		return fmt.Sprintf("%s: write a number with an optional SI prefix or code letter and unit, as %q", msg, ex)
	}
	return msg
}
