package pipeline

import (
	"slices"

	"pare/graph"
	"pare/render"
)

// SupplyLineRule is the reduction rule that takes an undeclared line fed
// from a supply through a resistor or choke, and held by a capacitor of its
// own, as a supply rail (rules' supply-line).
const SupplyLineRule = "supply-line"

// withDerivedRails is the original circuit for the full and faded sheets
// with each line the reduction took as a supply (SupplyLineRule) made a
// supply rail, named as the reduced sheet names it ("HT1 via R21", with its
// DC voltage from the operating point where the solution gives one). The
// layout draws a rail as a tag at each terminal on it: a smoothed HT line
// left a signal net was drawn as black wires from every load it feeds, the
// whole distribution run out to off-row connectors on another page
// (review 20's a05: five of them for HT2). A line that feeds one stage
// (a decoupled collector feed inside a small set's one frame) stays wired
// there: the wire is short and tags at both ends of its feed would only
// part the section from what it serves. So does a line fed from a
// reservoir the netlist does not declare: that reservoir is drawn wired,
// with its smoothing section, and the line's tags would part the section
// from it (the note asks for both to be declared). The circuit is copied only when
// there is such a line.
func (r *Result) withDerivedRails(c *graph.Circuit, frames []render.Frame) *graph.Circuit {
	if r.Log == nil || r.Reduced == nil {
		return c
	}
	var out *graph.Circuit
	for _, st := range r.Log.Steps {
		if st.Rule != SupplyLineRule || st.Refused != "" {
			continue
		}
		for _, name := range st.Grounded {
			n := c.Net(name)
			rail := reducedRail(r.Reduced, name)
			if n == nil || n.Role != graph.Signal || rail == nil || r.isEnd(name) || stagesFed(c, name, frames, st.Refs) < 2 {
				continue
			}
			if !fedFromRail(c, out, rail.Fed) {
				continue // fed from a reservoir only estimated: wired, as that reservoir is
			}
			if out == nil {
				out = c.Clone()
			}
			m := out.Net(name)
			m.Role, m.Fed, m.Label = graph.Supply, rail.Fed, rail.Label
			if r.DC == nil {
				continue
			}
			if v, ok := r.DC.Volts(name); ok {
				if label, printed, tagged := withVolts(rail.Label, v); tagged {
					m.Label, m.Volts = label, printed
				}
			}
		}
	}
	if out == nil {
		return c
	}
	return out
}

// reducedRail is the record of a rail the reduction joined away, by name.
func reducedRail(c *graph.Circuit, name string) *graph.Net {
	for _, n := range c.Rails {
		if n.Name == name {
			return n
		}
	}
	return nil
}

// isEnd says whether a net is a declared signal end of the circuit or of a
// region: such a net keeps its wires, whatever the reduction made of it.
func (r *Result) isEnd(name string) bool { return r.Circuit.IsEnd(name) }

// stagesFed counts the signal stages (frames not of a supply) holding a
// part with a terminal on line, leaving out the parts the step took away
// (its capacitor), the feed from a supply and the supply frames' parts; a
// part in no frame counts as a stage of its own.
func stagesFed(c *graph.Circuit, line string, frames []render.Frame, removed []string) int {
	seen := map[int]bool{}
	loose := 0
	for _, cn := range c.ConnsOf(line) {
		ref := cn.Part.Ref
		if slices.Contains(removed, ref) || slices.ContainsFunc(cn.Part.Pins, func(pn graph.Pin) bool { return c.RoleOf(pn.Net) == graph.Supply }) {
			continue // the section's capacitor, or its feed from the rail
		}
		at, supply := -1, false
		for i, f := range frames {
			if slices.Contains(f.Parts, ref) {
				if f.Supply {
					supply = true
				} else if at < 0 {
					at = i
				}
			}
		}
		switch {
		case supply:
		case at >= 0:
			seen[at] = true
		default:
			loose++
		}
	}
	return len(seen) + loose
}

// fedFromRail says whether the net a line is fed from is drawn as a rail:
// declared a supply, or a line made one before it (out, when made).
func fedFromRail(c, out *graph.Circuit, fed string) bool {
	if out != nil {
		c = out
	}
	n := c.Net(fed)
	return n != nil && n.Role == graph.Supply
}
