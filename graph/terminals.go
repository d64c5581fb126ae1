package graph

import (
	"sort"
	"strings"
)

// TermRole is what a terminal does in a stage. Roles let one stage pattern
// serve valves, BJTs and FETs alike: the control electrode is a grid, a base
// or a gate; the common electrode a cathode, an emitter or a source; the
// output electrode an anode, a collector or a drain.
type TermRole string

// Terminal roles.
const (
	RoleControl TermRole = "control"
	RoleCommon  TermRole = "common"
	RoleOutput  TermRole = "output"
	RoleGrid    TermRole = "grid"   // a further grid: screen, suppressor, injector, oscillator anode
	RoleHeater  TermRole = "heater" // heater pins
	RoleShield  TermRole = "shield" // internal screen / shield
	RolePassive TermRole = "passive"
)

// Valve types and the electrodes each has, in the trade's names. Heater pins
// (h1, h2, or a single h where the heater is drawn to one net) and an internal
// shield s are allowed on every type.
var valveElectrodes = map[string][]string{
	"diode":        {"a", "k"},
	"double-diode": {"a1", "a2", "k"},
	"triode":       {"a", "g1", "k"},
	"tetrode":      {"a", "g1", "g2", "k"},
	"pentode":      {"a", "g1", "g2", "g3", "k"},
	"hexode":       {"a", "g1", "g2", "g3", "g4", "k"},
	"heptode":      {"a", "g1", "g2", "g3", "g4", "g5", "k"},
	"octode":       {"a", "g1", "g2", "g3", "g4", "g5", "g6", "k"},
}

// ValveTypes lists the valve types in sorted order, for messages.
func ValveTypes() []string { return sortedKeys(valveElectrodes) }

// Device types for transistors and diodes.
var (
	BJTTypes   = []string{"npn", "pnp"}
	FETTypes   = []string{"njfet", "nmos", "pjfet", "pmos"}
	DiodeTypes = []string{"signal", "rectifier", "zener", "varicap"}
)

// Terminals lists the pin names a part of this kind and type may use, in the
// order they are written out. Two-terminal parts use "1" and "2"; an
// electrolytic uses "+" and "-"; a tapped inductor "1", "t", "2"; a pot "1",
// "w", "2". Transformers, switches and generic parts name their own pins and
// return nil here.
func Terminals(k Kind, typ string) []string {
	switch k {
	case Resistor, Crystal, Loudspeaker:
		return []string{"1", "2"}
	case Capacitor:
		if typ == CapElectrolytic {
			return []string{"+", "-"}
		}
		return []string{"1", "2"}
	case Inductor:
		return []string{"1", "t", "2"}
	case Pot:
		return []string{"1", "w", "2"}
	case Diode:
		return []string{"a", "k"}
	case BJT:
		return []string{"b", "c", "e"}
	case FET:
		return []string{"g", "d", "s", "b"}
	case Port:
		return []string{"1"}
	case Valve:
		el, ok := valveElectrodes[typ]
		if !ok {
			return nil
		}
		return append(append([]string(nil), el...), "h", "h1", "h2", "s")
	}
	return nil
}

// ArrayPins is the pin order for a part whose pins are written as an array:
// ["net1", "net2"] for a two-terminal part, three nets for a tapped inductor
// or a pot. Kinds without a natural order (valves, transistors) need a table.
func ArrayPins(k Kind, typ string, n int) []string {
	switch k {
	case Resistor, Crystal, Capacitor, Diode, Loudspeaker:
		if n == 2 {
			return Terminals(k, typ)
		}
	case Inductor:
		if n == 2 {
			return []string{"1", "2"}
		}
		if n == 3 {
			return []string{"1", "t", "2"}
		}
	case Pot:
		if n == 3 {
			return []string{"1", "w", "2"}
		}
	case Port:
		if n == 1 {
			return []string{"1"}
		}
	}
	return nil
}

// RoleOfPin says what a terminal does. Passive parts' terminals are passive.
func RoleOfPin(k Kind, pin string) TermRole {
	switch k {
	case Valve:
		switch {
		case pin == "g1":
			return RoleControl
		case pin == "k":
			return RoleCommon
		case pin == "a" || pin == "a1" || pin == "a2":
			return RoleOutput
		case strings.HasPrefix(pin, "g"):
			return RoleGrid
		case pin == "h" || pin == "h1" || pin == "h2":
			return RoleHeater
		case pin == "s":
			return RoleShield
		}
	case BJT:
		switch pin {
		case "b":
			return RoleControl
		case "e":
			return RoleCommon
		case "c":
			return RoleOutput
		}
	case FET:
		switch pin {
		case "g":
			return RoleControl
		case "s":
			return RoleCommon
		case "d":
			return RoleOutput
		case "b":
			return RoleShield
		}
	}
	return RolePassive
}

// PinWithRole returns the pin of an active part that has the given role
// ("" if none); for a valve with two anodes it gives the first.
func (p *Part) PinWithRole(r TermRole) string {
	for _, pin := range p.Pins {
		if RoleOfPin(p.Kind, pin.Name) == r {
			return pin.Name
		}
	}
	return ""
}

// IsActive reports whether the part amplifies: a valve with a grid, a BJT or a FET.
func (p *Part) IsActive() bool {
	switch p.Kind {
	case BJT, FET:
		return true
	case Valve:
		return p.Type != "diode" && p.Type != "double-diode"
	}
	return false
}

// Device parameters a part may carry, by kind, with the unit each is read in.
// The AC models document their defaults.
var paramNames = map[Kind][]string{
	// rd, off, perveance: a valve diode's; mu2, share, vknee: a screen-grid
	// valve's DC law; kg: grid current; gmo: a pentagrid converter's g1-to-g2
	// transconductance (loadpart.go checks which).
	// ih: the heater's rated current (graph/dc: a series heater chain's
	// dropper). A diode's n, is: the Shockley law's ideality and saturation
	// current (graph/dc); vz, rz: a zener's breakdown voltage and dynamic
	// resistance (graph/device).
	Valve:       {"gm", "gmo", "ra", "mu", "rd", "off", "ia", "pmax", "mu2", "share", "vknee", "kg", "perveance", "ih"},
	BJT:         {"beta", "ic", "gm", "ro", "rpi", "vbe"},
	FET:         {"gm", "rd", "idss", "vp", "vth", "k"}, // idss, vp: JFET; vth, k: MOSFET (loadpart.go checks which)
	Diode:       {"rd", "off", "vf", "n", "is", "vz", "rz"},
	Crystal:     {"rm", "lm", "cm", "c0", "q"},
	Inductor:    {"q", "q_at", "rdc"},              // q_at: the frequency q is stated at (graph/qref.go)
	Transformer: {"q", "q_at", "rdc", "vac", "hz"}, // vac, hz: a mains transformer's rectifier winding (graph/dc)
	// vac, hz: the mains an inlet brings to a rectifier straight off it (an
	// AC/DC set, graph/dc rectmains.go).
	Port:    {"vac", "hz"},
	Generic: {"vac", "hz"},
	// DC-only attributes (graph/dc): a resistor's power rating in watts, a
	// capacitor's leakage resistance.
	Resistor:  {"watts"},
	Capacitor: {"leak"},
}

// ParamNames lists the device parameters a kind accepts.
func ParamNames(k Kind) []string { return paramNames[k] }

func sortedKeys[V any](m map[string]V) []string {
	out := make([]string, 0, len(m))
	for k := range m {
		out = append(out, k)
	}
	sort.Strings(out)
	return out
}

// Suggest returns the candidate closest to s by edit distance when it is close
// enough to be a likely typo, or "".
func Suggest(s string, candidates []string) string {
	best, bestD := "", 1<<30
	for _, c := range candidates {
		d := editDistance(strings.ToLower(s), strings.ToLower(c))
		// On a tie, a candidate that starts with what was typed wins: "g"
		// is far more likely a short "g1" than a slipped "a".
		if d < bestD || (d == bestD && strings.HasPrefix(c, s) && !strings.HasPrefix(best, s)) {
			best, bestD = c, d
		}
	}
	limit := 1
	if len(s) > 4 {
		limit = 2
	}
	if bestD <= limit && best != s {
		return best
	}
	return ""
}

func editDistance(a, b string) int {
	ra, rb := []rune(a), []rune(b)
	prev := make([]int, len(rb)+1)
	cur := make([]int, len(rb)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(ra); i++ {
		cur[0] = i
		for j := 1; j <= len(rb); j++ {
			cost := 1
			if ra[i-1] == rb[j-1] {
				cost = 0
			}
			cur[j] = min(prev[j]+1, cur[j-1]+1, prev[j-1]+cost)
		}
		prev, cur = cur, prev
	}
	return prev[len(rb)]
}
