package graph

// How values, keys and strings are written in the canonical netlist: bare
// keys where TOML allows them, quoted strings with escapes, numbers in the
// shortest form that loads back to the same value with its unit.

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"pare/graph/value"
	"pare/internal/esc"
)

func inline(kv []string) string {
	if len(kv) == 0 {
		return "{}"
	}
	return "{ " + strings.Join(kv, ", ") + " }"
}

func strList(list []string) string {
	q := make([]string, len(list))
	for i, s := range list {
		q[i] = quote(s)
	}
	return "[" + strings.Join(q, ", ") + "]"
}

// bareKey quotes a key unless TOML allows it bare.
func bareKey(k string) string {
	if k == "" {
		return `""`
	}
	for _, r := range k {
		if !isBareKey(r) {
			return quote(k)
		}
	}
	return k
}

// quote writes a TOML basic string. Go's strconv.Quote is not used because
// its \x escapes are not TOML.
func quote(s string) string {
	var b strings.Builder
	b.WriteByte('"')
	for _, r := range s {
		switch {
		case r == '"':
			b.WriteString(`\"`)
		case r == '\\':
			b.WriteString(`\\`)
		case r == '\n':
			b.WriteString(`\n`)
		case r == '\t':
			b.WriteString(`\t`)
		case esc.Hidden(r):
			// Controls and bidi overrides as escapes: the text loads back
			// the same, and a netlist shown in a terminal or an editor
			// shows them rather than obeying them.
			fmt.Fprintf(&b, `\u%04X`, r)
		default:
			b.WriteRune(r)
		}
	}
	b.WriteByte('"')
	return b.String()
}

// fmtNum writes a value in the letter code when that is exact, else with six
// significant digits, so that a written circuit loads back the same.
func fmtNum(v float64, u value.Unit) string {
	if u != value.Ohm && u != value.Farad && u != value.Henry {
		return fmtDecimal(v, u)
	}
	return fmtCode(v, u)
}

// fmtCode writes v in the letter code, in the fewest digits that read back
// as v itself.
func fmtCode(v float64, u value.Unit) string {
	for _, digits := range []int{3, 6, 9, 15} {
		s := value.FormatPrec(v, u, value.Code, digits)
		if back, err := value.Parse(s, u); err == nil && closeEnough(back, v, digits) {
			return s
		}
	}
	return strconv.FormatFloat(v, 'g', -1, 64)
}

// closeEnough reports whether text printed with the given number of digits
// read back as the value itself (to 1e-12, what survives a decimal round trip
// of a float64), so the shortest faithful form is chosen. Rounding to the
// digits is never accepted: "4k70" for 4702 Ω would change the circuit.
func closeEnough(a, b float64, digits int) bool {
	_ = digits
	if a == b {
		return true
	}
	return math.Abs(a-b) <= 1e-12*math.Max(math.Abs(a), math.Abs(b))
}

func fmtRange(r value.Range, u value.Unit) string {
	if !r.IsSpan() {
		return fmtNum(r.Max, u)
	}
	return fmtNum(r.Min, u) + ".." + fmtNum(r.Max, u)
}

func fmtFloat(f float64) string { return strconv.FormatFloat(f, 'g', -1, 64) }

// fmtDecimal writes frequencies, voltages and conductances with an SI prefix
// and a decimal point ("1.7M", "2.5m"): the letter code is a habit for
// resistors, capacitors and inductors only.
func fmtDecimal(v float64, u value.Unit) string {
	if v == 0 {
		return "0"
	}
	prefixes := []string{"p", "n", "u", "m", "", "k", "M", "G"}
	e := int(math.Floor(math.Log10(math.Abs(v)) / 3))
	e = max(-4, min(3, e))
	mant := v / math.Pow(10, float64(3*e))
	for _, digits := range []int{6, 9, 15} {
		s := strconv.FormatFloat(mant, 'g', digits, 64) + prefixes[e+4]
		if strings.ContainsAny(s, "e") {
			break
		}
		if back, err := value.Parse(s, u); err == nil && closeEnough(back, v, digits) {
			return s
		}
	}
	return strconv.FormatFloat(v, 'g', -1, 64)
}

// paramText writes a device parameter in the unit a data sheet uses: mutual
// conductance in mA/V, resistances in the letter code, plain numbers bare.
func paramText(name string, v float64) string {
	u := paramUnit(name)
	switch {
	case name == "vz":
		// a zener's voltage as its body is marked: 8V2, 12V
		return quote(fmtCode(v, u))
	case u == value.None:
		return fmtFloat(v)
	case u == value.Siemens:
		if s, ok := withUnit(v*1e3, "mA/V", v, u); ok {
			return quote(s)
		}
	case u == value.Ampere:
		if s, ok := withUnit(v*1e3, "mA", v, u); ok {
			return quote(s)
		}
	}
	return quote(fmtNum(v, u))
}

// withUnit writes x (v in a scaled unit) as the shortest decimal that reads
// back as v, followed by the unit text.
func withUnit(x float64, unit string, v float64, u value.Unit) (string, bool) {
	for _, digits := range []int{6, 9, 15, 17} {
		s := strconv.FormatFloat(x, 'f', -1, 64)
		if digits < 17 {
			s = strconv.FormatFloat(x, 'g', digits, 64)
		}
		if strings.ContainsAny(s, "eE") {
			continue
		}
		if back, err := value.Parse(normaliseUnit(s+unit, u), u); err == nil && closeEnough(back, v, digits) {
			return s + unit, true
		}
	}
	return "", false
}
