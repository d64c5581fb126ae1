// Stages for the devices no pattern names, and the parts that serve a
// device kept beside it.

package stages

import (
	"maps"
	"slices"
	"sort"

	"pare/graph"
)

// deviceTopology is the topology of a stage made for a device no pattern
// recognises: titled by the device alone, claiming nothing about its work.
const deviceTopology = "device"

// deviceStages gives every valve or transistor that no stage holds a stage
// of its own, titled by the device ("V2b stage"): a device left loose was
// drawn inside whatever frame happened to surround it (a detector and an
// audio triode inside a "Coupling capacitor" frame), a title that tells a
// wrong story. Each takes the parts no stage holds that serve it
// (devicePartsOf), the better served device first (electrodeRank); held
// are the ones a stage of the original circuit keeps.
func deviceStages(c *graph.Circuit, acg map[string]bool, tops []*found, held map[string]bool) []*found {
	claimed, _ := claims(tops)
	var out []*found
	for _, p := range c.Parts {
		if claimed[p.Ref] != nil || !isDevice(p) {
			continue
		}
		st := &Stage{Topology: deviceTopology, group: "device", Family: deviceFamily(p),
			Title: p.Ref + " stage", Parts: []string{p.Ref}}
		out = append(out, &found{Stage: st, set: map[string]bool{p.Ref: true}})
	}
	ground := func(net string) bool { return acg[net] || c.RoleOf(net).IsACGround() }
	owner := map[string]*found{} // part ref → the device stage it serves
	for _, f := range out {
		dev := c.Part(f.Parts[0])
		for _, ref := range devicePartsOf(c, dev, ground) {
			if held[ref] || claimed[ref] != nil {
				continue
			}
			if prev := owner[ref]; prev == nil || electrodeRank(c, dev, ref) < electrodeRank(c, c.Part(prev.Parts[0]), ref) {
				owner[ref] = f
			}
		}
	}
	for ref, f := range owner {
		f.Parts = append(f.Parts, ref)
		f.set[ref] = true
	}
	for _, f := range out {
		sort.Strings(f.Parts)
	}
	return out
}

// isDevice says whether a part is a valve or transistor: an amplifying
// device, or a diode valve (a detector's envelope half).
func isDevice(p *graph.Part) bool {
	return p.IsActive() || p.Kind == graph.Valve && len(p.Pins) > 1
}

// refold moves each resistor foldShunts gave a stage by signal order alone
// (folded) to the stage holding the device whose output or common
// electrode it serves (a splitter's anode load from the coupling its anode
// feeds, electrodeRank 0), unless its stage holds such a device already.
// A grid leak stays where signal order put it: a coupling capacitor and
// its leak are one coupling, as the rc-coupling pattern has them, and an
// oscillator's grid leak on the net of a mixer's injector grid, moved to
// the oscillator, left the gallery's triode-heptode sheets reading worse
// (review-osc-c2b full and faded: wires in line across a gap 6 → 20).
// Tried again for review15 a02 (moved only when its stage holds it
// through a further grid alone): the reduced sheets read better (a02's
// leak in the oscillator's frame, review-align-c1's misreads 6 → 2), but
// the full and faded views of review-align-c1 and review-osc-c2b gained
// 22 wires beside another net's, 10 in line and 4 crossings near a dot,
// the leak standing in the channel the mixer's wires take to the
// oscillator; kept here until the full view routes that channel.
func refold(c *graph.Circuit, tops []*found, folded map[string]bool) {
	claimed, _ := claims(tops)
	for _, ref := range slices.Sorted(maps.Keys(folded)) {
		from := claimed[ref]
		if from == nil {
			continue
		}
		best, rank := from, holderRank(c, from, ref)
		for _, f := range tops {
			if r := holderRank(c, f, ref); r < rank && r == 0 {
				best, rank = f, r
			}
		}
		if best == from {
			continue
		}
		from.Parts = slices.DeleteFunc(from.Parts, func(r string) bool { return r == ref })
		delete(from.set, ref)
		best.Parts = append(best.Parts, ref)
		sort.Strings(best.Parts)
		best.set[ref] = true
	}
}

// devicePartsOf lists the resistors and capacitors that serve a device: on
// one of its electrodes' signal nets, running to AC ground (a load, a grid
// leak, a cathode resistor and its bypass) or to another of its electrodes
// (a cathodyne's bias resistor from cathode to grid), and those of a foot
// net one part away that holds no device or port (a split cathode
// resistor's lower half, a cathodyne's cathode load below its bias
// resistor), save one that leaves for a further net (the feedback
// resistor that comes into the foot).
func devicePartsOf(c *graph.Circuit, dev *graph.Part, ground func(string) bool) []string {
	own := map[string]bool{}
	for _, pn := range dev.Pins {
		if !ground(pn.Net) {
			own[pn.Net] = true
		}
	}
	foot := map[string]bool{}
	for _, p := range c.Parts {
		if a, b, ok := passiveEnds(p); ok && own[a] != own[b] && !ground(a) && !ground(b) {
			if own[a] {
				a = b
			}
			foot[a] = quietNet(c, a)
		}
	}
	var out []string
	for _, p := range c.Parts {
		a, b, ok := passiveEnds(p)
		if !ok {
			continue
		}
		near := func(n string) bool { return own[n] || foot[n] }
		if near(a) && (ground(b) || near(b)) || near(b) && ground(a) {
			out = append(out, p.Ref)
		}
	}
	return out
}

// passiveEnds is the two nets of a resistor or capacitor.
func passiveEnds(p *graph.Part) (a, b string, ok bool) {
	if p.Kind != graph.Resistor && p.Kind != graph.Capacitor || len(p.Pins) != 2 {
		return "", "", false
	}
	return p.Pins[0].Net, p.Pins[1].Net, true
}

// quietNet says whether only resistors and capacitors touch a net, and it
// is no declared end: a foot of a device's network, not a stage's input.
func quietNet(c *graph.Circuit, net string) bool {
	if slices.Contains(c.Inputs, net) || slices.Contains(c.Outputs, net) {
		return false
	}
	for _, cn := range c.ConnsOf(net) {
		if _, _, ok := passiveEnds(cn.Part); !ok {
			return false
		}
	}
	return true
}

// holderRank is the best electrodeRank of the devices a stage holds.
func holderRank(c *graph.Circuit, f *found, ref string) int {
	best := 3
	for _, r := range f.Parts {
		if d := c.Part(r); d != nil && r != ref {
			best = min(best, electrodeRank(c, d, ref))
		}
	}
	return best
}

// nestStoppers makes each grid stopper the sub-stage of the stage that
// holds the device it stops (the push-pull pair, a device's own stage), so
// the stopper is framed beside its valve's grid, not boxed on its own at
// the sheet's edge with long wires back to the grid; its figures stay its
// own. A stopper whose device no other stage holds stays a stage.
func nestStoppers(c *graph.Circuit, tops []*found) []*found {
	claimed, _ := claims(tops)
	var gone []*found
	for _, f := range tops {
		if f.Topology != "grid-stopper" {
			continue
		}
		g := f.nets["g"]
		var host *found
		for _, cn := range c.ConnsOf(g) {
			if h := claimed[cn.Part.Ref]; h != nil && h != f && cn.Part.IsActive() && graph.RoleOfPin(cn.Part.Kind, cn.Pin) == graph.RoleControl {
				host = h
			}
		}
		if host == nil || slices.Contains(gone, host) {
			continue
		}
		host.subs = append(host.subs, f)
		for _, r := range f.Parts {
			host.set[r] = true
			host.Parts = append(host.Parts, r)
		}
		sort.Strings(host.Parts)
		sortTree(host.subs)
		gone = append(gone, f)
	}
	return slices.DeleteFunc(tops, func(f *found) bool { return slices.Contains(gone, f) })
}

// electrodeRank is how closely a device is served by part ref: 0 when
// its output or common electrode sits on one of the part's nets (an anode
// load, a cathode resistor), 1 its control electrode (a grid leak), 2 a
// further grid (the injector grid a grid leak's net also feeds), 3 none;
// a diode valve one step further than an amplifying device, so a cathode
// shared by a detector diode and a triode is the triode's to bias.
func electrodeRank(c *graph.Circuit, dev *graph.Part, ref string) int {
	p := c.Part(ref)
	if p == nil || !isDevice(dev) {
		return 3
	}
	rank := 3
	for _, pn := range dev.Pins {
		if c.RoleOf(pn.Net).IsACGround() || !slices.ContainsFunc(p.Pins, func(q graph.Pin) bool { return q.Net == pn.Net }) {
			continue
		}
		switch graph.RoleOfPin(dev.Kind, pn.Name) {
		case graph.RoleOutput, graph.RoleCommon:
			rank = min(rank, 0)
		case graph.RoleControl:
			rank = min(rank, 1)
		default:
			rank = min(rank, 2)
		}
	}
	if rank < 3 && !dev.IsActive() {
		rank++
	}
	return rank
}
