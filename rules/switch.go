package rules

import (
	"sort"
	"strconv"
	"strings"

	"pare/graph"
)

// switch-set: a switch is drawn in the position it is set to: each closed
// contact pair joins its two nets, open contacts connect nothing. Exact for
// that position, so it runs at every level.
var switchSet = Rule{
	Name:    "switch-set",
	Purpose: "replace a switch by the connections of its set position",
	Level:   LevelTidy,
	Kinds:   []graph.Kind{graph.Switch},
	Match: func(x *Ctx, a Anchor) *Plan {
		p := a.Part
		if p.Keep || len(p.Closes) == 0 {
			return nil
		}
		pos := int(p.Set)
		if pos < 1 || pos > len(p.Closes) {
			pos = 1
		}
		var pairs []string
		for _, pr := range p.Closes[pos-1] {
			pairs = append(pairs, pr[0]+"-"+pr[1])
		}
		closed := "no contacts closed"
		if len(pairs) > 0 {
			closed = "closes " + strings.Join(pairs, " ")
		}
		why := p.Ref + " (switch) at position " + strconv.Itoa(pos) + " of " + strconv.Itoa(len(p.Closes)) + ": " + closed + "; drawn as the connections it makes"
		return &Plan{Parts: []*graph.Part{p}, Data: pos, Why: why}
	},
	Apply: func(x *Ctx, m *Plan) Step {
		p := m.Parts[0]
		pos := m.Data.(int)
		var pairs [][2]string
		for _, pr := range p.Closes[pos-1] {
			a, b := p.NetOf(pr[0]), p.NetOf(pr[1])
			if a != "" && b != "" && a != b && a != "nc" && b != "nc" {
				pairs = append(pairs, [2]string{a, b})
			}
		}
		removed := origins(p)
		x.Remove(p)
		var joined []string
		// Joining renames nets, so follow each name through earlier joins.
		alias := map[string]string{}
		find := func(n string) string {
			for alias[n] != "" {
				n = alias[n]
			}
			return n
		}
		for _, pr := range pairs {
			a, b := find(pr[0]), find(pr[1])
			if a == b {
				continue
			}
			keep, gone := x.ChooseKeep(a, b)
			x.Join(keep, gone)
			alias[gone] = keep
			joined = append(joined, keep+"="+gone)
		}
		sort.Strings(joined)
		return Step{Removed: removed, Joined: joined}
	},
}
