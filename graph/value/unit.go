package value

import "strconv"

// Unit is the physical quantity a value is measured in. It exists so that a
// capacitor field cannot silently accept "47uH".
type Unit int

// The units a circuit description needs. None is for plain ratios and counts.
const (
	None Unit = iota
	Ohm
	Farad
	Henry
	Volt
	Hertz
	Second
	Siemens
	Ampere
	// Watt is for figures pare computes (a dissipation, an output power);
	// the netlist gives watts as plain numbers (pmax, watts), so it has no
	// symbol or word to parse.
	Watt
)

var unitInfo = [...]struct{ sym, name string }{
	None:    {"", "dimensionless"},
	Ohm:     {"\u03a9", "ohm"},
	Farad:   {"F", "farad"},
	Henry:   {"H", "henry"},
	Volt:    {"V", "volt"},
	Hertz:   {"Hz", "hertz"},
	Second:  {"s", "second"},
	Siemens: {"S", "siemens"},
	Ampere:  {"A", "ampere"},
	Watt:    {"W", "watt"},
}

func (u Unit) known() bool { return u >= 0 && int(u) < len(unitInfo) }

// Symbol is the SI symbol, empty for None or an unknown unit.
func (u Unit) Symbol() string {
	if !u.known() {
		return ""
	}
	return unitInfo[u].sym
}

// String is the unit's name as used in messages ("ohm", "farad", ...).
func (u Unit) String() string {
	if !u.known() {
		return "Unit(" + strconv.Itoa(int(u)) + ")"
	}
	return unitInfo[u].name
}

// withArticle reads naturally in "does not fit an ohm value".
func (u Unit) withArticle() string {
	n := u.String()
	switch n[0] {
	case 'a', 'e', 'i', 'o', 'u':
		return "an " + n
	}
	return "a " + n
}

// Exact symbols are case-sensitive because S/s and F/f mean different things;
// spelled-out words are not, since nobody confuses "OHM" with anything.
var unitSymbols = map[string]Unit{
	"\u03a9": Ohm, // Greek capital omega, what keyboards produce
	"\u2126": Ohm, // the legacy OHM SIGN code point, same meaning
	"F":      Farad,
	"H":      Henry,
	"V":      Volt,
	"Hz":     Hertz,
	"s":      Second,
	"S":      Siemens,
	"A":      Ampere,
}

var unitWords = map[string]Unit{
	"ohm":     Ohm,
	"ohms":    Ohm,
	"farad":   Farad,
	"farads":  Farad,
	"henry":   Henry,
	"henries": Henry,
	"henrys":  Henry,
	"volt":    Volt,
	"volts":   Volt,
	"hertz":   Hertz,
	"sec":     Second,
	"second":  Second,
	"seconds": Second,
	"siemens": Siemens,
	"amp":     Ampere,
	"amps":    Ampere,
	"ampere":  Ampere,
	"amperes": Ampere,
}

func lookupUnit(s string) (Unit, bool) {
	if u, ok := unitSymbols[s]; ok {
		return u, true
	}
	if len(s) < 3 {
		return None, false
	}
	u, ok := unitWords[lowerASCII(s)]
	return u, ok
}

// lowerASCII avoids strings.ToLower so that odd Unicode case mappings can
// never turn some foreign word into a unit name.
func lowerASCII(s string) string {
	b := []byte(s)
	for i, c := range b {
		if 'A' <= c && c <= 'Z' {
			b[i] = c + 'a' - 'A'
		}
	}
	return string(b)
}
