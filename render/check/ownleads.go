package check

import (
	"fmt"
	"sort"

	"pare/render/geom"
)

// OwnLeadCrossings lists, for every drawn part with three or more pins
// (transistor, valve, transformer, potentiometer), the crossings of one of
// its pins' leads with the lead of another of its pins on a different net.
// A lead is the pin's wire from its tip to the first junction or pin
// (leadRun), what a reader follows out of the part: a collector lead
// crossing the same transistor's emitter lead reads as a tangle on a
// service sheet, where common practice has the leads of one part leave it
// without crossing each other (review22 b01 and b05: "Q3's collector
// crosses its own emitter lead"). One line per pair of leads, sorted.
func OwnLeadCrossings(g *geom.Sheet) []string {
	var out []string
	for _, s := range g.Symbols {
		if s.Kind == "" || len(s.Pins) < 3 {
			continue
		}
		leads := make([][]geom.Seg, len(s.Pins))
		for i, p := range s.Pins {
			if p.Net != "" {
				leads[i] = leadRun(g, p)
			}
		}
		for i := range s.Pins {
			for j := i + 1; j < len(s.Pins); j++ {
				if s.Pins[i].Net == s.Pins[j].Net {
					continue
				}
				if n := CrossCount(leads[i], leads[j]); n > 0 {
					out = append(out, fmt.Sprintf("%s: lead of %s (%s) crosses lead of %s (%s) %d time(s)",
						s.Ref, s.Pins[i].Name, s.Pins[i].Net, s.Pins[j].Name, s.Pins[j].Net, n))
				}
			}
		}
	}
	sort.Strings(out)
	return out
}
