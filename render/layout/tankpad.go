package layout

import (
	"slices"

	"pare/graph"
)

// An oscillator coil's tuned winding reaches its gang section through a
// padder (hot end, series padder, then the section and its trimmer down to
// chassis): nothing is across the winding itself, so Tanks does not see it
// as tuned. The symbol's core mark needs to.

// tunedWindings lists, per transformer, the ends of each winding with a
// capacitor across it (tanks, from Tanks) or tuned through a padder (a
// series capacitor from its hot end to a capacitor to chassis: an
// oscillator coil's tuned winding with its padder and gang section), for
// the symbol's core mark.
func tunedWindings(c *graph.Circuit, tanks []TankCap) map[string][][2]string {
	out := map[string][][2]string{}
	add := func(ref string, ends [2]string) {
		if !slices.Contains(out[ref], ends) {
			out[ref] = append(out[ref], ends)
		}
	}
	for _, t := range tanks {
		if p := c.Part(t.Coil); p != nil && p.Kind == graph.Transformer {
			add(t.Coil, t.Ends)
		}
	}
	var onNet map[string][]*graph.Part
	for _, p := range c.Parts {
		if p.Kind != graph.Transformer || !slices.Contains(p.Adjust, graph.CoreWhole) {
			continue // the padder search serves only a core marked once for the whole part
		}
		if onNet == nil {
			onNet = map[string][]*graph.Part{}
			for _, q := range c.Parts {
				for _, pn := range q.Pins {
					onNet[pn.Net] = append(onNet[pn.Net], q)
				}
			}
		}
		for _, ends := range WindingEnds(p) {
			if padded(c, onNet, p.NetOf(ends[0]), p.NetOf(ends[1])) || padded(c, onNet, p.NetOf(ends[1]), p.NetOf(ends[0])) {
				add(p.Ref, ends)
			}
		}
	}
	return out
}

// padded says whether a winding from hot to cold (AC ground) is tuned
// through a padder: a capacitor from hot to a net that a gang section
// takes on to AC ground (padParts).
func padded(c *graph.Circuit, onNet map[string][]*graph.Part, hot, cold string) bool {
	return len(padParts(c, onNet, hot, cold)) > 0
}

// padParts are a padded winding's padder and the capacitors from the
// padder's far net to AC ground (its gang section and trimmer), the padder
// first; none when the winding is not padded. A gang section must be among
// them: a series capacitor and a fixed one to chassis on an output or
// driver winding are a filter, not a tuned winding's padder.
func padParts(c *graph.Circuit, onNet map[string][]*graph.Part, hot, cold string) []*graph.Part {
	acg := func(n string) bool { return c.RoleOf(n).IsACGround() }
	if !wired(hot) || acg(hot) || !acg(cold) {
		return nil
	}
	for _, pad := range onNet[hot] {
		if pad.Kind != graph.Capacitor || len(pad.Pins) != 2 {
			continue
		}
		var mid string
		switch hot {
		case pad.Pins[0].Net:
			mid = pad.Pins[1].Net
		case pad.Pins[1].Net:
			mid = pad.Pins[0].Net
		default:
			continue
		}
		if !wired(mid) || acg(mid) {
			continue
		}
		out := []*graph.Part{pad}
		for _, q := range onNet[mid] {
			if q != pad && q.Kind == graph.Capacitor && len(q.Pins) == 2 &&
				(q.Pins[0].Net == mid && acg(q.Pins[1].Net) || q.Pins[1].Net == mid && acg(q.Pins[0].Net)) {
				out = append(out, q)
			}
		}
		if len(out) > 1 && slices.ContainsFunc(out[1:], func(q *graph.Part) bool { return q.Type == graph.CapVariable }) {
			return out
		}
	}
	return nil
}
