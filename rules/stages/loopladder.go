package stages

import (
	"fmt"
	"slices"
	"strings"

	"pare/graph"
)

// The RC feedback network of an oscillator found by its loop. When no
// transformer carries the loop, the feedback runs through the passive
// parts between the device's output electrode and its control electrode:
// a phase-shift ladder, a twin-T, a bridge arm. Gathering by steps from
// the device (loopHops) stops half-way along a three-section ladder and
// reaches the next stage's coupling capacitor instead, so the network is
// found by its nets: those reached from the output electrode without
// passing the control electrode and from the control electrode without
// passing the output one, never through AC ground, an active part or the
// device's other nets. Every part of it belongs to the oscillator; the
// parts on a branch that leads off to another active part (a buffer's
// coupling capacitor and bias) belong to that part's stage.

// phaseShiftLoopTopology is the topology of an oscillator found by its
// loop whose feedback network is a phase-shift ladder.
const phaseShiftLoopTopology = "rc-phase-shift-loop"

// rcNet is a device's passive feedback network.
type rcNet struct {
	nets     map[string]bool // its inner nets: neither the device's nor AC ground
	parts    []string        // its parts, sorted
	sections int             // RC sections in cascade along its trunk (a phase-shift ladder has 3 or more)
}

// phaseShiftSections is how many RC sections in cascade make a phase-shift
// ladder: one section gives less than 90°, so three are the fewest that
// give the 180° an inverting stage needs (handbook analysis of the RC
// phase-shift oscillator).
const phaseShiftSections = 3

// passiveLink reports whether a signal is followed through q: a passive
// part other than a port (which ends a net, it joins none).
func passiveLink(q *graph.Part) bool { return !q.IsActive() && q.Kind != graph.Port }

// rcFeedback finds dev's passive feedback network on c; ground says which
// nets are AC ground, lc is the original circuit (where a supply rail is
// still one: the reduction ties it to ground). A network with no inner
// net is none (ok false).
func rcFeedback(c, lc *graph.Circuit, ground func(string) bool, dev *graph.Part) (n rcNet, ok bool) {
	out := dev.NetOf(dev.PinWithRole(graph.RoleOutput))
	in := dev.NetOf(dev.PinWithRole(graph.RoleControl))
	if out == "" || in == "" || out == in || ground(out) || ground(in) {
		return n, false
	}
	own := map[string]bool{}
	for _, pin := range dev.Pins {
		own[pin.Net] = true
	}
	rail := railNets(lc, func(m string) bool { return lc.RoleOf(m).IsACGround() }, own)
	stop := func(m string) bool { return ground(m) || own[m] || rail[m] || m == graph.NotConnected }
	fromOut, fromIn := reachNets(c, []string{out}, stop), reachNets(c, []string{in}, stop)
	n.nets = map[string]bool{}
	for m := range fromOut {
		if fromIn[m] {
			n.nets[m] = true
		}
	}
	if len(n.nets) == 0 {
		return n, false
	}
	ends := map[string]bool{out: true, in: true}
	for _, q := range c.Parts {
		if !passiveLink(q) || !touches(q, n.nets) {
			continue
		}
		inside := true
		for _, pin := range q.Pins {
			inside = inside && (n.nets[pin.Net] || ends[pin.Net] || ground(pin.Net))
		}
		if inside {
			n.parts = append(n.parts, q.Ref)
		}
	}
	slices.Sort(n.parts)
	n.sections = ladderSections(c, ground, n, out, in)
	return n, true
}

// railNets are the nets fed from a supply rail through parts that carry
// DC (dcPath), not through the device's own nets or a ground: a
// decoupled rail the reduction kept (its capacitor not a bypass at the
// band's low edge), which feeds the loads and the bias and carries no
// feedback. A net with a DC path of its own to chassis and no device on
// it (a divider's tap: the base bias fed from the line, a series base
// resistor and a ladder's last capacitor on it) is a bias point, not a
// line, and ends the walk; one on another device's electrode (a buffer's
// base bias) stays a stop, that device's.
func railNets(c *graph.Circuit, ground func(string) bool, own map[string]bool) map[string]bool {
	rail := map[string]bool{}
	var frontier []string
	for _, n := range c.Nets {
		if n.Role == graph.Supply {
			rail[n.Name] = true
			frontier = append(frontier, n.Name)
		}
	}
	for len(frontier) > 0 {
		var next []string
		for _, m := range frontier {
			for _, cn := range c.ConnsOf(m) {
				if !dcPath(cn.Part) || cn.Part.IsActive() {
					continue
				}
				for _, pin := range cn.Part.Pins {
					if n := pin.Net; !rail[n] && !own[n] && !ground(n) && n != graph.NotConnected && !dcToChassis(c, n) {
						rail[n] = true
						next = append(next, n)
					}
				}
			}
		}
		frontier = next
	}
	return rail
}

// dcToChassis reports whether net is a bare bias point: a two-pin part
// that carries DC joins it to chassis (0 V, not a supply line: the feed
// from the line is one) and no active part has a pin on it.
func dcToChassis(c *graph.Circuit, net string) bool {
	chassis := func(m string) bool { return c.RoleOf(m) == graph.Ground }
	found := false
	for _, cn := range c.ConnsOf(net) {
		q := cn.Part
		if q.IsActive() {
			return false
		}
		if dcPath(q) && len(q.Pins) == 2 && (chassis(q.Pins[0].Net) || chassis(q.Pins[1].Net)) {
			found = true
		}
	}
	return found
}

// reachNets are the nets reached from starts through passive parts, never
// entering a net stop says (the starts are not in the result).
func reachNets(c *graph.Circuit, starts []string, stop func(string) bool) map[string]bool {
	seen := map[string]bool{}
	for _, s := range starts {
		seen[s] = true
	}
	frontier := slices.Clone(starts)
	for len(frontier) > 0 {
		var next []string
		for _, m := range frontier {
			for _, cn := range c.ConnsOf(m) {
				if !passiveLink(cn.Part) {
					continue
				}
				for _, pin := range cn.Part.Pins {
					if !seen[pin.Net] && !stop(pin.Net) {
						seen[pin.Net] = true
						next = append(next, pin.Net)
					}
				}
			}
		}
		frontier = next
	}
	for _, s := range starts {
		delete(seen, s)
	}
	return seen
}

// towardOthers are the nets, outside the device's own and its feedback
// network's, from which another active part is reached through passive
// parts: a branch that leads to the next stage, whose parts are that
// stage's (a buffer's coupling capacitor and base bias).
func towardOthers(c *graph.Circuit, ground func(string) bool, dev *graph.Part, fb rcNet) map[string]bool {
	own := map[string]bool{}
	for _, pin := range dev.Pins {
		own[pin.Net] = true
	}
	stop := func(m string) bool { return ground(m) || own[m] || fb.nets[m] || m == graph.NotConnected }
	var starts []string
	for _, q := range c.Parts {
		if q == dev || !q.IsActive() {
			continue
		}
		for _, pin := range q.Pins {
			if !stop(pin.Net) && !slices.Contains(starts, pin.Net) {
				starts = append(starts, pin.Net)
			}
		}
	}
	far := reachNets(c, starts, stop)
	for _, s := range starts {
		far[s] = true
	}
	return far
}

// ladderSections counts the RC sections in cascade along the network's
// trunk from out to in: a series part of one kind (a capacitor for a
// high-pass ladder, a resistor for a low-pass one) followed, before the
// next, by a net with a shunt of the other kind to AC ground. A branch
// that ends at ground through inner nets (a preset and a resistor in
// series) is a shunt of the kinds it holds. 0 when the trunk is not one
// chain (a bridge, a twin-T) or holds another kind of part.
func ladderSections(c *graph.Circuit, ground func(string) bool, n rcNet, out, in string) int {
	trunk, shunt, ok := ladderTrunk(c, ground, n, out, in)
	if !ok {
		return 0
	}
	best := 0
	for _, k := range []graph.Kind{graph.Capacitor, graph.Resistor} {
		other := graph.Capacitor
		if k == graph.Capacitor {
			other = graph.Resistor
		}
		count, pending := 0, false
		for _, step := range trunk {
			if step.kind == k {
				pending = true
			}
			if pending && shunt[step.to][other] {
				count, pending = count+1, false
			}
		}
		best = max(best, count)
	}
	return best
}

// ladderStep is one series part of a ladder's trunk and the net it leads to.
type ladderStep struct {
	kind graph.Kind
	to   string
}

// rcKind is a part's kind as a ladder sees it: a pot is a resistor.
func rcKind(q *graph.Part) graph.Kind {
	if q.Kind == graph.Pot {
		return graph.Resistor
	}
	return q.Kind
}

// ladderTrunk walks the network from out to in. Series parts join two of
// its nets (the inner ones, out and in); a series part to an inner net
// with no other series part is a shunt branch, folded into the net it
// hangs on, until every inner net left has two. The trunk is then one
// chain or the network is no ladder.
func ladderTrunk(c *graph.Circuit, ground func(string) bool, n rcNet, out, in string) ([]ladderStep, map[string]map[graph.Kind]bool, bool) {
	shunt := map[string]map[graph.Kind]bool{}
	mark := func(net string, ks ...graph.Kind) {
		if shunt[net] == nil {
			shunt[net] = map[graph.Kind]bool{}
		}
		for _, k := range ks {
			shunt[net][k] = true
		}
	}
	edges := map[string][2]string{} // series part → its two nets
	for _, r := range n.parts {
		q := c.Part(r)
		var nets []string
		for _, pin := range q.Pins {
			if !ground(pin.Net) && !slices.Contains(nets, pin.Net) {
				nets = append(nets, pin.Net)
			}
		}
		switch len(nets) {
		case 1:
			mark(nets[0], rcKind(q))
		case 2:
			edges[r] = [2]string{nets[0], nets[1]}
		default:
			return nil, nil, false
		}
	}
	for _, end := range []string{out, in} { // the bias at the control electrode ends the last section
		for _, cn := range c.ConnsOf(end) {
			if q := cn.Part; passiveLink(q) && len(q.Pins) == 2 && ground(q.Pins[0].Net) != ground(q.Pins[1].Net) {
				mark(end, rcKind(q))
			}
		}
	}
	for pruned := true; pruned; {
		pruned = false
		for net := range n.nets {
			var only []string
			for r, e := range edges {
				if e[0] == net || e[1] == net {
					only = append(only, r)
				}
			}
			if len(only) != 1 {
				continue
			}
			e, r := edges[only[0]], only[0]
			to := e[0]
			if to == net {
				to = e[1]
			}
			mark(to, rcKind(c.Part(r)))
			for k := range shunt[net] {
				mark(to, k)
			}
			delete(edges, r)
			pruned = true
		}
	}
	return walkTrunk(c, edges, shunt, out, in)
}

// walkTrunk follows the series parts left from out to in, each net met
// once; any part left off the walk (a parallel path) makes it no ladder.
func walkTrunk(c *graph.Circuit, edges map[string][2]string, shunt map[string]map[graph.Kind]bool, out, in string) ([]ladderStep, map[string]map[graph.Kind]bool, bool) {
	var trunk []ladderStep
	used := map[string]bool{}
	at, seen := out, map[string]bool{out: true}
	for at != in {
		var refs []string
		for r, e := range edges {
			if !used[r] && (e[0] == at || e[1] == at) {
				refs = append(refs, r)
			}
		}
		if len(refs) != 1 {
			return nil, nil, false
		}
		e := edges[refs[0]]
		to := e[0]
		if to == at {
			to = e[1]
		}
		if seen[to] {
			return nil, nil, false
		}
		used[refs[0]], seen[to] = true, true
		trunk = append(trunk, ladderStep{kind: rcKind(c.Part(refs[0])), to: to})
		at = to
	}
	return trunk, shunt, len(used) == len(edges)
}

// rcLoopParts gathers the parts of an oscillator whose loop runs through
// the passive network fb: the device's own (as loopParts gathers them,
// less those on a branch toward another active part) and every part of
// the network, taken from a stage of passive parts that holds it (a
// coupling pattern's match on a ladder capacitor), which is then gone.
func rcLoopParts(c *graph.Circuit, acg map[string]bool, dev *graph.Part, fb rcNet, claimed map[string]*found, gone map[*found]bool) []string {
	far := towardOthers(c, groundOf(c, acg), dev, fb)
	refs := loopPartsFrom(c, acg, dev, "", claimed, gone, func(graph.Pin) bool { return true },
		func(q *graph.Part) bool { return touches(q, far) })
	in := map[string]bool{}
	for _, r := range refs {
		in[r] = true
	}
	for _, r := range fb.parts {
		f := claimed[r]
		switch {
		case in[r]:
			continue
		case f != nil && (gone[f] || !passiveOnly(c, f)):
			continue // another oscillator took it, or a stage with a device of its own holds it
		case f != nil:
			gone[f] = true
			for _, s := range f.Parts {
				in[s] = true
			}
		}
		in[r] = true
	}
	return slices.Sorted(func(yield func(string) bool) {
		for r := range in {
			if !yield(r) {
				return
			}
		}
	})
}

// passiveOnly reports whether stage f holds no active part.
func passiveOnly(c *graph.Circuit, f *found) bool {
	for _, r := range f.Parts {
		if q := c.Part(r); q != nil && q.IsActive() {
			return false
		}
	}
	return true
}

// phaseShiftStage names an oscillator found by its loop whose feedback is
// a ladder of phaseShiftSections or more RC sections: the trade's RC
// phase-shift oscillator. The loop's 0° point, the solver's, confirms it
// (the caller names it so only when the loop has one).
func phaseShiftStage(st *Stage, dev *graph.Part, l Loop, fb rcNet) {
	st.Topology = phaseShiftLoopTopology
	st.Title = expandTitle("RC phase-shift oscillator ({family})", st.Family)
	fMin, _, _, _, _ := l.Range()
	st.Notes = append(st.Notes, fmt.Sprintf("%s's feedback runs through a ladder of %d RC sections in cascade (%s) from its output electrode back to its control electrode; the loop's phase is 0° at %s (solver)",
		dev.Ref, fb.sections, strings.Join(fb.parts, " "), hzText(fMin)))
}
