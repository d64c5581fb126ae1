package rules

import (
	"sort"
	"strings"

	"pare/graph"
)

// dc-feed: a part whose every terminal sits at AC ground carries no signal:
// screen feed resistors, decoupling resistors, HT droppers, heater wiring,
// cathode resistors once their bypass has done its work.
var dcFeed = Rule{
	Name:    "dc-feed",
	Purpose: "remove parts whose every terminal is at AC ground (DC-only feeds)",
	Level:   LevelSignal,
	Match: func(x *Ctx, a Anchor) *Plan {
		p := a.Part
		if p.Keep || len(p.Pins) == 0 {
			return nil
		}
		for _, pin := range p.Pins {
			if pin.Net != "nc" && !x.IsACGround(pin.Net) {
				return nil
			}
		}
		what := "carries no signal (a DC-only feed)"
		switch {
		case p.IsActive():
			what = "passes no signal: every electrode is at AC ground"
		case p.Kind == graph.Port:
			what = "a connection to a rail, not to the signal"
		case p.Kind == graph.Capacitor:
			what = "a decoupling capacitor between AC grounds: carries no signal"
		}
		return &Plan{Parts: []*graph.Part{p}, Why: x.describe(p) + ": every terminal at AC ground now; " + what}
	},
	Apply: func(x *Ctx, m *Plan) Step {
		removed := origins(m.Parts[0])
		x.Remove(m.Parts[0])
		return Step{Removed: removed}
	},
}

// no-signal: a group of parts that reaches the declared signal inputs and
// outputs only through AC-ground nets carries no signal to them: a power
// supply, a dial lamp, a DC control line fed in at a port and decoupled to
// ground. Needs declared inputs or outputs (or, failing those, ports) to
// know where the signal is; without any it does nothing.
var noSignal = Rule{
	Name:    "no-signal",
	Purpose: "remove groups of parts joined to the signal path only through AC ground (power supply, lamps)",
	Level:   LevelSignal,
	Whole:   true,
	Match: func(x *Ctx, _ Anchor) *Plan {
		groups := x.signalGroups()
		var seeds []string
		seeds = append(seeds, x.c.Inputs...)
		seeds = append(seeds, x.c.Outputs...)
		for _, r := range x.c.Regions {
			if r.Input != "" {
				seeds = append(seeds, r.Input)
			}
			if r.Output != "" {
				seeds = append(seeds, r.Output)
			}
		}
		live := map[int]bool{}
		for _, n := range seeds {
			for _, cn := range x.Conns(n) {
				live[groups.of[cn.Part.Ref]] = true
			}
		}
		// Ports say where the signal goes when no end is declared (or all
		// were cut away by a focus); the ports a focus made always do.
		for _, p := range x.c.Parts {
			if p.Kind == graph.Port && (len(live) == 0 || x.focusPorts[p.Ref]) {
				live[groups.of[p.Ref]] = true
			}
		}
		if len(live) == 0 {
			return nil
		}
		for gi, refs := range groups.list {
			if live[gi] {
				continue
			}
			var parts []*graph.Part
			keep := false
			for _, ref := range refs {
				p := x.Part(ref)
				keep = keep || p.Keep
				parts = append(parts, p)
			}
			if keep {
				continue
			}
			var via []string
			for _, p := range parts {
				written := x.netsAsWritten(p)
				for i, pin := range p.Pins {
					n := pin.Net
					if i < len(written) {
						n = written[i]
					}
					if x.IsACGround(pin.Net) && !contains(via, n) {
						via = append(via, n)
					}
				}
			}
			sort.Strings(via)
			why := strings.Join(refs, ", ") + " reach the signal inputs and outputs only through AC ground"
			if len(via) > 0 {
				why += " (" + strings.Join(via, ", ") + ")"
			}
			why += ": no signal passes through them to the declared inputs and outputs (a supply, an indicator, a decoupled DC control line)"
			return &Plan{Parts: parts, Why: why}
		}
		return nil
	},
	Apply: func(x *Ctx, m *Plan) Step {
		removed := origins(m.Parts...)
		for _, p := range m.Parts {
			x.Remove(p)
		}
		return Step{Removed: removed}
	},
}

// groups are the parts connected through nets that are not AC ground (nor "nc").
type groups struct {
	of   map[string]int
	list [][]string
}

func (x *Ctx) signalGroups() groups {
	g := groups{of: map[string]int{}}
	for _, p := range x.c.Parts {
		if _, done := g.of[p.Ref]; done {
			continue
		}
		id := len(g.list)
		var refs []string
		stack := []*graph.Part{p}
		g.of[p.Ref] = id
		for len(stack) > 0 {
			q := stack[len(stack)-1]
			stack = stack[:len(stack)-1]
			refs = append(refs, q.Ref)
			for _, pin := range q.Pins {
				if pin.Net == "nc" || x.IsACGround(pin.Net) {
					continue
				}
				for _, cn := range x.Conns(pin.Net) {
					if _, done := g.of[cn.Part.Ref]; !done {
						g.of[cn.Part.Ref] = id
						stack = append(stack, cn.Part)
					}
				}
			}
		}
		sort.Strings(refs)
		g.list = append(g.list, refs)
	}
	return g
}
