package pipeline

import (
	"errors"
	"fmt"
	"strings"

	"pare/graph"
	"pare/graph/device"
)

// BiasNote says, for a command that shows small-signal figures of the
// circuit c (the original after the bias phase, or its reduction), which
// amplifying parts still take their transconductance from the device
// model's class default rather than from the circuit's DC operating point:
// every part when the operating point was not found, else those the
// solution gave no figure for (a device cut off). Empty when every part's
// figures are given or taken at the bias. The commands print it on
// standard error, so a figure resting on a default bias is never shown as
// if it were the circuit's.
func (r *Result) BiasNote(c *graph.Circuit) string {
	if c == nil {
		return ""
	}
	var refs []string
	for _, p := range c.Parts {
		if p.Kind != graph.BJT && p.Kind != graph.FET && p.Kind != graph.Valve {
			continue
		}
		s, err := device.Of(p)
		if err != nil || s.Given(device.Gm) {
			continue
		}
		refs = append(refs, p.Ref)
	}
	if len(refs) == 0 {
		return ""
	}
	list := strings.Join(refs, ", ")
	if r.DCErr != nil {
		return fmt.Sprintf("no DC operating point (%v): %s at the device model's default bias (docs/devices.md), not the circuit's", r.DCErr, list)
	}
	if r.DC == nil {
		return list + " at the device model's default bias (docs/devices.md): the DC operating point was not solved"
	}
	return list + " at the device model's default bias (docs/devices.md): the DC operating point gave no current to take the figures at (cut off?)"
}

// warnUnsolved says, among the run's warnings, at the netlist's place,
// that the DC operating point is not solved and what rests on it: `pare dc`
// refused review19 a05's surge resistor with a clear message while the
// main job went on silently, naming the mains transformer a tuned stage.
func (r *Result) warnUnsolved() {
	var list graph.ErrorList
	var one *graph.Error
	switch {
	case errors.As(r.DCErr, &list):
	case errors.As(r.DCErr, &one):
		list = graph.ErrorList{one}
	default:
		list.Add(graph.Pos{File: r.Path}, "%v", r.DCErr)
	}
	for _, e := range list {
		r.Warnings.Add(e.Pos, "no DC operating point: %s; the DC chart, the supply's figures and every figure taken at the bias rest on it, so they are missing or at the device model's defaults", e.Msg)
	}
	r.Warnings.Sort()
}
