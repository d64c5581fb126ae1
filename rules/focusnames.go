package rules

import (
	"sort"
	"strconv"
	"strings"

	"pare/graph"
)

// focusSeeds resolves --focus names: a ref, an original ref inside a merged
// part, or a net name (every part on it).
func focusSeeds(x *Ctx, names []string) ([]*graph.Part, error) {
	c := x.c
	var errs graph.ErrorList
	seen := map[*graph.Part]bool{}
	var out []*graph.Part
	add := func(p *graph.Part) {
		if !seen[p] {
			seen[p] = true
			out = append(out, p)
		}
	}
	var candidates []string
	for _, p := range c.Parts {
		candidates = append(candidates, p.Ref)
	}
	for _, n := range c.Nets {
		candidates = append(candidates, n.Name)
	}
	for _, raw := range names {
		name := strings.TrimSpace(raw)
		if name == "" {
			continue
		}
		if p := x.Part(name); p != nil {
			add(p)
			continue
		}
		found := false
		for _, p := range c.Parts {
			if contains(p.From, name) {
				add(p)
				found = true
			}
		}
		if found {
			continue
		}
		if n := x.Net(name); n != nil {
			if n.Role.IsACGround() {
				errs.Add(graph.Pos{File: c.File}, "focus %q: net %s is AC ground (%s) and joins every stage: name a part or a signal net", name, name, n.Role)
				continue
			}
			if len(x.Conns(name)) == 0 {
				errs.Add(graph.Pos{File: c.File}, "focus %q: nothing is connected to net %s", name, name)
				continue
			}
			for _, cn := range x.Conns(name) {
				add(cn.Part)
			}
			continue
		}
		hint := ""
		if s := graph.Suggest(name, candidates); s != "" {
			hint = " (did you mean " + strconv.Quote(s) + "?)"
		}
		errs.Add(graph.Pos{File: c.File}, "focus %q: no part or net of that name%s", name, hint)
	}
	if len(out) == 0 && len(errs) == 0 {
		errs.Add(graph.Pos{File: c.File}, "focus: no part or net named")
	}
	if err := errs.Err(); err != nil {
		return nil, err
	}
	sort.Slice(out, func(i, j int) bool { return out[i].Ref < out[j].Ref })
	return out, nil
}

// portLabel says what lies beyond a cut net: its label, else the device
// electrode or part it leads to.
func portLabel(x *Ctx, net string, in map[*graph.Part]bool) string {
	if n := x.Net(net); n != nil && n.Label != "" {
		return n.Label
	}
	var firstPassive string
	for _, cn := range x.Conns(net) {
		q := cn.Part
		if in[q] {
			continue
		}
		switch {
		case q.IsActive() && graph.RoleOfPin(q.Kind, cn.Pin) == graph.RoleOutput:
			return "from " + q.Ref + " " + electrode(q, cn.Pin)
		case q.IsActive() || q.Kind == graph.Valve || q.Kind == graph.Diode:
			return "to " + q.Ref + " " + electrode(q, cn.Pin)
		case q.Kind == graph.Port && q.Label != "":
			return q.Label
		}
		if firstPassive == "" && q.Kind == graph.Transformer {
			firstPassive = "to " + q.Ref + " winding " + windingGroup(cn.Pin)
		}
		if firstPassive == "" {
			firstPassive = "to " + q.Ref
			if q.Note != "" && len(q.Note) <= 40 {
				firstPassive += " (" + q.Note + ")"
			}
		}
	}
	if firstPassive == "" {
		firstPassive = "to the rest of the set"
	}
	return firstPassive
}
