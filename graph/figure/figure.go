// Package figure holds the numbers pare computes for a stage (a resonance,
// a tuning range, a gain, a time constant) as typed values: each knows its
// unit, where it came from (a named handbook formula, the AC solver at a
// stated point, or the netlist itself), its stable key and the words a
// person reads before it. One formatter writes them for every medium: a
// sheet, a note or a table, and JSON.
//
// A figure's unit is one of a closed set (Unit) backed by graph/value's SI
// units, so the trade's way of writing a value ("4.7 kΩ", "100 pF", no
// milli on capacitors) comes from the one place that already does it. The
// JSON key of a figure ("osc_f_min_hz") is derived from its name, shape and
// unit, never parsed: code that needs a figure asks for it by name.
package figure

import (
	"math"
	"strconv"

	"pare/graph/value"
)

// Unit is what a figure is measured in.
type Unit int

// The units of the figures pare computes. Ratio is a plain number: a gain,
// a coupling factor, a Q, a share of turns.
const (
	Ratio Unit = iota
	Hertz
	Second
	Farad
	Henry
	Ohm
	Decibel
	Watt
	Volt
	// Degree is an angle: a loop's phase margin.
	Degree
	// Ampere: a DC current at the operating point (a stabiliser's feed)
	Ampere
)

// units is the one table of what each unit means to the formatter: its SI
// unit in graph/value (None where value has no such unit), the unit part
// of a JSON key (kept from the first JSON output, so readers of it keep
// working), and the significant digits in notes and tables (four for
// frequencies and reactive parts, enough to tell an IF can 1 % off 455 kHz:
// 459.6 against 455 kHz; common practice, no source).
var units = [...]struct {
	name   string
	si     value.Unit
	key    string
	digits int
}{
	Ratio:   {"ratio", value.None, "", 3},
	Hertz:   {"hertz", value.Hertz, "_hz", 4},
	Second:  {"second", value.Second, "_s", 3},
	Farad:   {"farad", value.Farad, "_f", 4},
	Henry:   {"henry", value.Henry, "_h", 4},
	Ohm:     {"ohm", value.Ohm, "_ohm", 3},
	Decibel: {"decibel", value.None, "_db", 3},
	Watt:    {"watt", value.Watt, "_w", 3},
	Volt:    {"volt", value.Volt, "_v", 3},
	Degree:  {"degree", value.None, "_deg", 3},
	Ampere:  {"ampere", value.Ampere, "_a", 3},
}

// Units lists every unit, for tests and documentation.
func Units() []Unit {
	out := make([]Unit, len(units))
	for i := range units {
		out[i] = Unit(i)
	}
	return out
}

func (u Unit) known() bool { return u >= 0 && int(u) < len(units) }

// String is the unit's name ("hertz", "ratio").
func (u Unit) String() string {
	if !u.known() {
		return "unknown unit"
	}
	return units[u].name
}

// Symbol is what a person reads after the number: "Hz", "Ω", "dB"; empty
// for a ratio.
func (u Unit) Symbol() string {
	switch {
	case u == Decibel:
		return "dB"
	case u == Degree:
		return "°"
	case u.known():
		return units[u].si.Symbol()
	}
	return ""
}

// Source says how a figure was obtained.
type Source int

const (
	// Formula: a named handbook formula on the part values (the stage's
	// cross-check; the solver is the truth).
	Formula Source = iota
	// Solver: graph/ac's solver on the circuit (or on a network cut from
	// it), at the point Origin.At names.
	Solver
	// Netlist: declared in the netlist: a part's value, a [freqs] entry.
	Netlist
)

var sourceNames = [...]string{Formula: "formula", Solver: "solver", Netlist: "netlist"}

func (s Source) String() string {
	if s < 0 || int(s) >= len(sourceNames) {
		return "unknown source"
	}
	return sourceNames[s]
}

// Origin is where a figure came from.
type Origin struct {
	Source Source
	// Name is the formula ("f = 1/(2π√(LC))"), what the solver solved
	// ("V(out)/V(in)"), or where the netlist declares it ("[freqs] if").
	Name string
	// At is, for the solver, the sweep point and gang setting solved at
	// ("54.8 kHz, gang at mid travel"); empty otherwise.
	At string
	// Piece is, for the solver on a piece of a large set rather than the
	// whole circuit, the piece and why its cut does not move the figure
	// (rules/stages piece.go); empty for a whole-circuit solve.
	Piece string
}

// String is the origin as one phrase: "formula f = 1/(2π√(LC))",
// "solver V(o)/V(g) at 54.8 kHz", "netlist [freqs] if".
func (o Origin) String() string {
	s := o.Source.String()
	if o.Name != "" {
		s += " " + o.Name
	}
	if o.At != "" {
		s += " at " + o.At
	}
	if o.Piece != "" {
		s += ", " + o.Piece
	}
	return s
}

// ByFormula is the origin of a figure computed by the named formula.
func ByFormula(name string) Origin { return Origin{Source: Formula, Name: name} }

// BySolver is the origin of a figure the solver gave for what, at at.
func BySolver(what, at string) Origin { return Origin{Source: Solver, Name: what, At: at} }

// FromNetlist is the origin of a figure the netlist declares.
func FromNetlist(where string) Origin { return Origin{Source: Netlist, Name: where} }

// Figure is one number a repairer checks on a stage. Exactly one of Value,
// Range and Points holds it; At, when set, says where the value occurs.
type Figure struct {
	// Name is the stable stem of the figure's keys, without unit: "f",
	// "osc_f", "tau", "track_fit". A pattern's prefix is part of it.
	Name string
	// Label is the words a person reads before the value: "osc f", "IF".
	Label string
	Unit  Unit
	Value float64
	// Range holds a figure that spans the travel of a gang or trimmer:
	// Min at one end, Max at the other (keys NAME_min, NAME_max).
	Range *value.Range
	// Points holds a list of like values (keys NAME1, NAME2, …): the dial
	// frequencies where an oscillator tracks exactly.
	Points []float64
	// At is where the value occurs, a figure of its own: the dial
	// frequency of the worst tracking error.
	At *Figure
	// Group names an item several figures make together ("suggested
	// 3-point design"); members follow each other in a stage's order.
	Group string
	// Working marks a value that goes into another figure (the C and L of
	// a resonance): in JSON, not in the line a person reads.
	Working bool
	Origin  Origin
	// Check is the named formula's value of the same quantity, kept beside
	// a solver figure as its cross-check (the solver is the truth): notes
	// and tables show both, a sheet the solver's value alone. Its Name is
	// the figure's; its Origin names the formula.
	Check *Figure
	// Why says in words why Check differs from the value by more than
	// CheckAgreement (loading, ro, rπ, partial bypass); empty when they
	// agree.
	Why string
}

// CheckAgreement is how far a formula cross-check may differ from the
// solver's in-circuit value before a figure says why: 2 % (common
// practice, no source: about the tolerance of the parts themselves).
const CheckAgreement = 0.02

// Differs tells whether a formula's value b strays from the solver's a by
// more than CheckAgreement of a.
func Differs(a, b float64) bool {
	return math.Abs(a-b) > CheckAgreement*math.Abs(a)
}

// CheckDiffers tells whether the figure's cross-check strays from it by more
// than CheckAgreement: at either end of a range.
func (f Figure) CheckDiffers() bool {
	c := f.Check
	switch {
	case c == nil:
		return false
	case f.Points != nil || c.Points != nil:
		if len(f.Points) != len(c.Points) {
			return true
		}
		for i, v := range f.Points {
			if Differs(v, c.Points[i]) {
				return true
			}
		}
		return false
	case f.Range != nil && c.Range != nil:
		return Differs(f.Range.Min, c.Range.Min) || Differs(f.Range.Max, c.Range.Max)
	case f.Range == nil && c.Range == nil:
		return Differs(f.Value, c.Value)
	}
	return true // a range checked by a single value, or the other way round
}

// Finite tells whether every number of the figure is a real number: a
// formula that divides by zero gives no figure.
func (f Figure) Finite() bool {
	ok := func(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }
	switch {
	case f.Range != nil:
		if !ok(f.Range.Min) || !ok(f.Range.Max) {
			return false
		}
	case f.Points != nil:
		for _, v := range f.Points {
			if !ok(v) {
				return false
			}
		}
	default:
		if !ok(f.Value) {
			return false
		}
	}
	return (f.At == nil || f.At.Finite()) && (f.Check == nil || f.Check.Finite())
}

// Entry is one key and its number, as JSON shows a figure.
type Entry struct {
	Key   string
	Value float64
}

// Entries are the figure's keys and numbers in SI base units: one for a
// value ("f_hz"), two for a range ("f_min_hz", "f_max_hz"), one per point
// ("track_fit1_hz"), then those of At.
func (f Figure) Entries() []Entry {
	suffix := ""
	if f.Unit.known() {
		suffix = units[f.Unit].key
	}
	var out []Entry
	switch {
	case f.Range != nil:
		out = append(out, Entry{f.Name + "_min" + suffix, f.Range.Min}, Entry{f.Name + "_max" + suffix, f.Range.Max})
	case f.Points != nil:
		for i, v := range f.Points {
			out = append(out, Entry{f.Name + strconv.Itoa(i+1) + suffix, v})
		}
	default:
		out = append(out, Entry{f.Name + suffix, f.Value})
	}
	if f.At != nil {
		out = append(out, f.At.Entries()...)
	}
	if c := f.checkFigure(); c != nil {
		out = append(out, c.Entries()...)
	}
	return out
}

// checkSuffix marks a cross-check's keys in JSON: "gain_formula",
// "f_formula_min_hz".
const checkSuffix = "_formula"

// checkFigure is the cross-check under its own name, for JSON; nil when
// there is none.
func (f Figure) checkFigure() *Figure {
	if f.Check == nil {
		return nil
	}
	c := *f.Check
	c.Name, c.At, c.Check = f.Name+checkSuffix, nil, nil
	return &c
}
