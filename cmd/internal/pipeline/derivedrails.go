package pipeline

import (
	"pare/graph"
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
// (review 20's a05: five of them for HT2). The circuit is copied only when
// there is such a line.
func (r *Result) withDerivedRails(c *graph.Circuit) *graph.Circuit {
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
			if n == nil || n.Role != graph.Signal || rail == nil || r.isEnd(name) {
				continue
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
