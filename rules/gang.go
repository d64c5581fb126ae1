package rules

import (
	"sort"

	"pare/graph"
)

// Gang marks are annotations, not rewrites: the mechanical link between the
// sections of a tuning gang is not drawn on the reduced sheet, so the log
// keeps it (gang name → original refs of the sections), and every reduced
// part made from a section keeps its Gang. Reducing a reduced circuit finds
// the same gangs through the parts' origins.
func gangsOf(c *graph.Circuit) map[string][]string {
	out := map[string][]string{}
	for _, p := range c.Parts {
		if p.Gang == "" {
			continue
		}
		for _, o := range p.Origins() {
			if !contains(out[p.Gang], o) {
				out[p.Gang] = append(out[p.Gang], o)
			}
		}
	}
	for g := range out {
		sort.Strings(out[g])
	}
	return out
}
