// Package value reads and writes component values the way they are marked on
// parts and written on service sheets: SI prefixes ("47 kΩ", "100 pF"), the
// IEC 60062 letter-and-digit code where the letter stands in for the decimal
// point ("4k7", "R47", "2n2"), spans for trimmers and bands ("12p..420p"),
// tolerances ("±5 %", "+80/-20 %") and the IEC 60063 E-series used to pick a
// replacement part.
//
// Everything is held in SI base units as float64, so the rest of the program
// never has to know which notation a netlist author preferred. Formatting
// rounds to a few significant digits because that is what a marking carries;
// Parse(Format(v)) gives v back to that precision.
//
// Nothing here panics on user input: every malformed text yields an error that
// quotes the text and, where a common slip is recognisable, says how to fix it.
// The errors carry no file position; the caller knows where the text came from.
package value
