package stages

import (
	"fmt"
	"math"

	"pare/graph"
	"pare/graph/dc"
	"pare/graph/value"
)

// cutOffAtRest is the output-electrode current at the operating point under
// which an amplifying device is taken as cut off as captured: a microamp,
// far below the working current of any small-signal stage (common practice;
// an RF or IF transistor runs at a few hundred microamps and up, a valve at
// a milliamp and up).
const cutOffAtRest = 1e-6

// cutOffFlags flags each stage whose device the operating point of the
// original circuit (op) shows cut off: its small-signal figures are then
// taken at cut-off, a gain of next to nothing, which a reader would
// otherwise take for the working stage's (an IF amplifier captured without
// the AGC line's volts that bias its base). Stages found on the original
// circuit carry their own devices' figures and are flagged the same way.
func cutOffFlags(top []*found, c *graph.Circuit, op *dc.Point) {
	if op == nil {
		return
	}
	var walk func(fs []*found)
	walk = func(fs []*found) {
		for _, f := range fs {
			for _, ref := range f.Parts {
				if flag, ok := cutOffFlag(c.Part(ref), op); ok {
					f.Flags = append(f.Flags, flag)
				}
			}
			walk(f.subs)
		}
	}
	walk(top)
}

// cutOffFlag is the flag for p if it is an amplifying device that the
// operating point shows cut off.
func cutOffFlag(p *graph.Part, op *dc.Point) (string, bool) {
	if p == nil || !p.IsActive() || op.Circuit == nil {
		return "", false
	}
	// The captured part: the reduced circuit's carries what the operating
	// point filled in.
	if p = op.Circuit.Part(p.Ref); p == nil || !gainFromPoint(p) {
		return "", false
	}
	out := p.PinWithRole(graph.RoleOutput)
	if out == "" {
		return "", false
	}
	i := math.Abs(op.Current(p.Ref, out))
	if i >= cutOffAtRest {
		return "", false
	}
	return fmt.Sprintf("%s is cut off at rest as captured (%s into its %s at the DC operating point): its figures here are taken at cut-off and show next to no gain; check its bias feed with pare dc (a bias network left out, or a line such as AGC whose volts the capture does not give)",
		p.Ref, value.FormatPrec(i, value.Ampere, value.Symbol, 3), outputPinName(p)), true
}

// gainFromPoint says whether p's small-signal figures come from the
// operating point: a device whose netlist states its working current or
// slope (ic, gm, ra and µ) is figured at that, as graph/dc's Biased fills
// only what the netlist leaves open, and pare dc warns when the solved
// current falls far from the stated one.
func gainFromPoint(p *graph.Part) bool {
	has := func(k string) bool { _, ok := p.Param(k); return ok }
	switch p.Kind {
	case graph.BJT:
		return !has("ic")
	case graph.FET:
		return !has("gm")
	case graph.Valve:
		return !has("gm") && !(has("ra") && has("mu"))
	}
	return false
}

// outputPinName is the trade's name of a device's output electrode.
func outputPinName(p *graph.Part) string {
	switch p.Kind {
	case graph.Valve:
		return "anode"
	case graph.FET:
		return "drain"
	}
	return "collector"
}
