package pipeline

import (
	"fmt"
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
			if !ok || v == 0 || math.IsNaN(v) || math.IsInf(v, 0) {
				continue
			}
			sign := "+"
			if v < 0 {
				sign = "−" // U+2212 MINUS SIGN, as typeset
			}
			// four figures, as the DC chart prints it (note.Volts); the
			// voltage kept at the same figures, so the tag states it once
			text := fmt.Sprintf("%.4g", math.Abs(v))
			if r, err := strconv.ParseFloat(text, 64); err == nil {
				n.Volts = math.Copysign(r, v)
			}
			n.Label = strings.TrimSpace(n.Label + " " + sign + text + " V")
		}
	}
	return out
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
