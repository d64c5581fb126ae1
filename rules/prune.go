package rules

import (
	"pare/graph"
)

// prune: what is left hanging carries no current. A two-terminal part with a
// terminal on a net that has nothing else on it (and is no declared end, no
// rail and no ground), or on "nc", or with both terminals on one net, goes;
// so does a port whose net connects nothing else. Exact, so it runs at every
// level.
var prune = Rule{
	Name:    "prune",
	Purpose: "remove parts left dangling or shorted out, and ports whose net connects nothing",
	Level:   LevelTidy,
	Match: func(x *Ctx, a Anchor) *Plan {
		p := a.Part
		if p.Keep {
			return nil
		}
		if p.Kind == graph.Port {
			if len(p.Pins) == 1 && x.dangling(p.Pins[0].Net, p) {
				return &Plan{Parts: []*graph.Part{p}, Why: p.Ref + " (port " + valueText(p) + "): its net " + p.Pins[0].Net + " connects nothing else"}
			}
			return nil
		}
		if len(p.Pins) != 2 || p.IsActive() {
			return nil
		}
		switch p.Kind {
		case graph.Resistor, graph.Capacitor, graph.Inductor, graph.Diode, graph.Crystal, graph.Loudspeaker:
		default:
			return nil
		}
		if p.Kind == graph.Inductor && len(p.Windings) > 1 {
			return nil
		}
		na, nb := Ends(p, false)
		switch {
		case na == "nc" || nb == "nc":
			return &Plan{Parts: []*graph.Part{p}, Why: x.describe(p) + ": a terminal is not connected (nc): no current flows"}
		case na == nb && x.IsACGround(na) && x.level >= LevelSignal:
			return nil // a decoupling part between two rails now joined: dc-feed says why
		case na == nb:
			return &Plan{Parts: []*graph.Part{p}, Why: x.describe(p) + ": both terminals on " + na + ": shorted out, carries no current"}
		case x.dangling(na, p):
			return &Plan{Parts: []*graph.Part{p}, Why: x.describe(p) + ": nothing else on " + na + ": no current flows"}
		case x.dangling(nb, p):
			return &Plan{Parts: []*graph.Part{p}, Why: x.describe(p) + ": nothing else on " + nb + ": no current flows"}
		}
		return nil
	},
	Apply: func(x *Ctx, m *Plan) Step {
		removed := origins(m.Parts[0])
		x.Remove(m.Parts[0])
		return Step{Removed: removed}
	},
}

// dangling reports whether only p is on net, and the net is not somewhere
// the signal comes from (a declared end, a rail or ground, a port net).
func (x *Ctx) dangling(net string, p *graph.Part) bool {
	if x.IsEnd(net) || x.IsACGround(net) || x.RoleOf(net) == graph.PortN {
		return false
	}
	for _, cn := range x.Conns(net) {
		if cn.Part != p {
			return false
		}
	}
	return true
}
