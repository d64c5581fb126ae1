package pipeline

import (
	"math"
	"strconv"
	"strings"

	"pare/graph"
)

// withLineVolts is the reduced circuit for its sheet, each decoupled line
// (a rail the reduction made of a net fed from a rail through a resistor
// or choke, graph.Net.Fed) tagged with its own DC voltage from the
// operating point, the chart's ("HT +241 V" where the rail it is fed from
// is "HT +250 V"). A line the solution does not give keeps its name
// without a voltage. The circuit is copied only when there is a line to
// tag, so the reduced netlist written beside the sheet is untouched.
func (r *Result) withLineVolts(c *graph.Circuit) *graph.Circuit {
	if r.DC == nil || !hasFedLine(c) {
		return c
	}
	out := c.Clone()
	for _, list := range [][]*graph.Net{out.Nets, out.Rails} {
		for _, n := range list {
			if n.Fed == "" {
				continue
			}
			v, ok := r.DC.Volts(n.Name)
			label, printed, tagged := withVolts(n.Label, v)
			if !ok || !tagged {
				continue
			}
			n.Label, n.Volts = label, printed // the voltage kept as printed, so the tag states it once
		}
	}
	return out
}

// withVolts is a line's label with its DC voltage v added as a tag
// prints it, and that voltage as printed; tagged is false for a voltage
// no tag states (none, or 0 V).
func withVolts(label string, v float64) (string, float64, bool) {
	text, tagged := tagVolts(v)
	if !tagged {
		return label, 0, false
	}
	printed, _ := strconv.ParseFloat(text, 64)
	text = strings.Replace(text, "-", "−", 1) // U+2212 MINUS SIGN, as typeset
	if v > 0 {
		text = "+" + text
	}
	sep := " "
	if graph.WithoutVolts(label) != label {
		sep = ", " // named after a rail known by its voltage: "+9 V via R5, +8.3 V"
	}
	return strings.TrimSpace(label + sep + text + " V"), printed, true
}

func hasFedLine(c *graph.Circuit) bool {
	for _, list := range [][]*graph.Net{c.Nets, c.Rails} {
		for _, n := range list {
			if n.Fed != "" {
				return true
			}
		}
	}
	return false
}

// tagVolts is a line's DC voltage as its tag prints it: rounded to
// tagFigures significant figures in plain notation ("242.7", "1235"), never
// in exponent form, signed by the caller. A voltage that is zero to rounding (under the
// chart's half millivolt, note.Volts: an AGC line at rest solves to
// 5.785e-28 V) or that the solution does not give is not printed: the
// line keeps its name alone, as one the solver holds at exactly 0 V does.
func tagVolts(v float64) (string, bool) {
	if math.IsNaN(v) || math.IsInf(v, 0) || math.Abs(v) < 5e-4 {
		return "", false
	}
	r, _ := strconv.ParseFloat(strconv.FormatFloat(v, 'g', tagFigures, 64), 64)
	return strconv.FormatFloat(r, 'f', -1, 64), true
}

// tagFigures is the significant figures of a line's tag: four, as the DC
// chart prints a voltage (note.Volts). Three, as a sheet's other figures
// have, shortens the tags, and the layout round them read worse: on the
// gallery, wires beside another net's 1220 → 1226 and symbol ends near
// another net's wire 18 → 26 (TestSheetsReadAsDrawn, measured when tried).
const tagFigures = 4
