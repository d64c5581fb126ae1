package rules

import (
	"sort"

	"pare/graph"
)

// finish tidies what the netlist keeps about removed things (region lists),
// and fills the log's summary fields.
func finish(x *Ctx, log *Log) {
	c := x.c
	tidyRegions(c)
	// An end with nothing left on it (a focus cut it away) is no end of
	// this circuit; the netlist could not even name it.
	keepEnds := func(list []string) []string {
		var out []string
		for _, n := range list {
			if c.Net(n) != nil && len(x.Conns(n)) > 0 {
				out = append(out, n)
			}
		}
		return out
	}
	c.Inputs, c.Outputs = keepEnds(c.Inputs), keepEnds(c.Outputs)
	for _, r := range c.Regions {
		if r.Input != "" && len(x.Conns(r.Input)) == 0 {
			r.Input = ""
		}
		if r.Output != "" && len(x.Conns(r.Output)) == 0 {
			r.Output = ""
		}
	}
	x.endsMoved()
	c.PruneNets()
	for _, n := range x.orig.Nets {
		if n.Role.IsACGround() || x.grounded[n.Name] {
			log.ACGround = append(log.ACGround, n.Name)
		}
	}
	for n := range x.grounded {
		if x.orig.Net(n) == nil && !contains(log.ACGround, n) {
			log.ACGround = append(log.ACGround, n)
		}
	}
	sort.Strings(log.ACGround)
	log.After = countOf(c)
}

// tidyRegions makes the region lists name what is left: the reduced parts
// that stand for the parts a region named, and its nets that still exist.
func tidyRegions(c *graph.Circuit) {
	refsOf := map[string][]string{} // original ref -> refs of reduced parts standing for it
	for _, p := range c.Parts {
		for _, o := range p.Origins() {
			refsOf[o] = append(refsOf[o], p.Ref)
		}
	}
	for _, r := range c.Regions {
		seen := map[string]bool{}
		var parts []string
		for _, ref := range r.Parts {
			for _, now := range refsOf[ref] {
				if !seen[now] {
					seen[now] = true
					parts = append(parts, now)
				}
			}
		}
		sort.Strings(parts)
		r.Parts = parts
		var nets []string
		for _, n := range r.Nets {
			if c.Net(n) != nil {
				nets = append(nets, n)
			}
		}
		r.Nets = nets
		if r.Input != "" && c.Net(r.Input) == nil {
			r.Input = ""
		}
		if r.Output != "" && c.Net(r.Output) == nil {
			r.Output = ""
		}
	}
}

func contains(list []string, s string) bool {
	for _, x := range list {
		if x == s {
			return true
		}
	}
	return false
}
