package rules

import (
	"strings"

	"pare/graph"
)

// prune: what is left hanging carries no current. A two-terminal part with a
// terminal on a net that has nothing else on it (and is no declared end, no
// rail and no ground), or on "nc", or with both terminals on one net, goes;
// so does a port whose net connects nothing else, and a coil or transformer
// every winding of which has an end left open (the coil of the band a
// wavechange switch does not select: its ends sit on the switch's idle
// contacts). Exact, so it runs at every level.
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
		if why, ok := x.openWindings(p); ok {
			return &Plan{Parts: []*graph.Part{p}, Why: why}
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

// openWindings reports whether every winding of a coil or transformer with
// windings has an end (a pin of that winding alone, never a tap between two
// sections) on "nc" or on a net with nothing else on it: no winding
// can carry current, so none couples anything, whatever the other windings
// are joined to. It gives the why, naming the open ends.
func (x *Ctx) openWindings(p *graph.Part) (string, bool) {
	if (p.Kind != graph.Inductor && p.Kind != graph.Transformer) || len(p.Windings) == 0 {
		return "", false
	}
	var open []string
	seen := map[string]bool{}
	for _, w := range p.Windings {
		end := ""
		for _, pin := range []string{w.From, w.To} {
			if sharedPin(p, pin) {
				continue // a tap: the sections either side still carry current end to end
			}
			if n := p.NetOf(pin); n == "nc" || x.dangling(n, p) {
				end = n
				break
			}
		}
		if end == "" {
			return "", false
		}
		if !seen[end] {
			seen[end] = true
			open = append(open, end)
		}
	}
	return x.describe(p) + ": every winding has an end left open (nothing else on " + strings.Join(open, ", ") +
		"; at this setting no switch contact reaches it): no winding carries current", true
}

// sharedPin reports whether two windings of p meet at pin: a tap.
func sharedPin(p *graph.Part, pin string) bool {
	n := 0
	for _, w := range p.Windings {
		if w.From == pin || w.To == pin {
			n++
		}
	}
	return n > 1
}
