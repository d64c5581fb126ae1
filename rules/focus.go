package rules

import (
	"slices"
	"sort"
	"strconv"
	"strings"

	"pare/graph"
)

// A focus keeps the stage(s) around the named parts: everything reachable
// from them without crossing an AC-ground net, the output of another active
// device, or the coupling between two windings of a transformer (an
// interstage transformer belongs to both stages: it is kept, the far side of
// it is not followed). From a device's own output the load is followed up to
// the next device (which starts the next stage), and nets that a bypass capacitor holds at AC ground are taken one
// level deep too (the cathode resistor and its bypass, the screen feed), so
// the reduction can still explain them. Each net that crosses the cut gets a
// port part labelled with what lies beyond ("from V1 anode", "to V3 grid", or
// the net's label), so the sheet still says what enters and leaves.
func focusCut(x *Ctx, names []string, log *Log) error {
	c := x.c
	seeds, err := focusSeeds(x, names)
	if err != nil {
		return err
	}
	ground, detected := focusGround(x)
	isGround := func(n string) bool { return ground[n] || detected[n] || n == "nc" }
	in := focusStage(x, seeds, ground, detected, isGround)
	focusLeaves(x, in, detected, isGround)
	focusWindingTuning(x, in, isGround)
	crossing := crossingNets(x, in, isGround)
	labels := map[string]string{}
	for _, n := range crossing {
		labels[n] = portLabel(x, n, in)
	}
	c.Inputs, c.Outputs = focusEnds(x, in, crossing, isGround)
	x.endsMoved()
	st := applyCut(x, seeds, in, crossing, labels)
	st.N = len(log.Steps) + 1
	log.Steps = append(log.Steps, st)
	return nil
}

// focusGround finds the nets at AC ground for the cut: by role, or (at the
// signal level) held there by a bypass capacitor, which the rule judges.
func focusGround(x *Ctx) (ground, detected map[string]bool) {
	c := x.c
	ground, detected = map[string]bool{}, map[string]bool{}
	for _, n := range c.Nets {
		if n.Role.IsACGround() {
			ground[n.Name] = true
		}
	}
	if x.level >= LevelSignal {
		scratch := newCtx(c, x.ratio, x.level)
		for _, p := range c.Parts {
			for _, flip := range []bool{false, true} {
				if m := bypass.Match(scratch, Anchor{Part: p, Flip: flip}); m != nil {
					if ok, _ := bypassGuard(scratch, m); ok {
						detected[m.Nets[0]] = true
					}
				}
			}
		}
	}
	return ground, detected
}

// focusStage walks from the seeds to the edges of their stage (see focusCut)
// and returns the parts inside.
func focusStage(x *Ctx, seeds []*graph.Part, ground, detected map[string]bool, isGround func(string) bool) map[*graph.Part]bool {
	c := x.c
	outputs := map[string][]*graph.Part{} // net -> active devices whose output is on it
	for _, p := range c.Parts {
		if p.IsActive() {
			for _, pin := range p.Pins {
				if graph.RoleOfPin(p.Kind, pin.Name) == graph.RoleOutput {
					outputs[pin.Net] = append(outputs[pin.Net], p)
				}
			}
		}
	}
	in := map[*graph.Part]bool{}
	type visit struct {
		p     *graph.Part
		entry string // the pin it was reached through; "" for a seed
		down  bool   // reached from a device's output: its load, up to the next device
	}
	var queue []visit
	for _, p := range seeds {
		if !in[p] {
			in[p] = true
			queue = append(queue, visit{p, "", false})
		}
	}
	for len(queue) > 0 {
		v := queue[0]
		queue = queue[1:]
		p := v.p
		for _, pin := range p.Pins {
			n := pin.Net
			if p.Kind == graph.Transformer && v.entry != "" && windingGroup(pin.Name) != windingGroup(v.entry) {
				continue // coupling to another winding ends the stage: an interstage transformer
			}
			switch {
			case n == "nc" || ground[n]:
				continue
			case detected[n]:
				for _, cn := range x.Conns(n) {
					if q := cn.Part; !in[q] && allAt(q, isGround) {
						in[q] = true // a leaf: its other terminals are at AC ground
					}
				}
				continue
			}
			own := graph.RoleOfPin(p.Kind, pin.Name) == graph.RoleOutput && p.IsActive()
			if !own && len(outputs[n]) > 0 && !containsPart(outputs[n], p) {
				continue // another device's output: the previous stage ends here
			}
			down := own || v.down
			for _, cn := range x.Conns(n) {
				q := cn.Part
				if in[q] || (down && q.IsActive()) {
					continue // the next device starts the next stage
				}
				in[q] = true
				queue = append(queue, visit{q, cn.Pin, down})
			}
		}
	}
	return in
}

// focusLeaves adds what the stage needs besides the walk: the leaves of
// bypassed nets it touches, parts marked keep, and the input's ports on its
// nets.
func focusLeaves(x *Ctx, in map[*graph.Part]bool, detected map[string]bool, isGround func(string) bool) {
	c := x.c
	// A net held at AC ground by a bypass that an inside part touches keeps
	// its leaves (the bypass, the feed to the rail) even when the walk never
	// stepped onto it, e.g. the cold end of an interstage transformer's far
	// winding: without them that end would dangle and the winding carry no
	// current.
	for _, n := range c.Nets {
		if !detected[n.Name] {
			continue
		}
		touched := false
		for _, cn := range x.Conns(n.Name) {
			touched = touched || in[cn.Part]
		}
		if !touched {
			continue
		}
		for _, cn := range x.Conns(n.Name) {
			if q := cn.Part; !in[q] && allAt(q, isGround) {
				in[q] = true
			}
		}
	}
	// Parts marked keep are never removed, not even by a focus.
	for _, p := range c.Parts {
		if p.Keep {
			in[p] = true
		}
	}
	// A port of the input on a net the stage uses stays: it already says
	// what lies beyond.
	for _, n := range c.Nets {
		if isGround(n.Name) {
			continue
		}
		used := false
		for _, cn := range x.Conns(n.Name) {
			used = used || in[cn.Part]
		}
		for _, cn := range x.Conns(n.Name) {
			if used && cn.Part.Kind == graph.Port {
				in[cn.Part] = true
			}
		}
	}
}

// focusWindingTuning keeps the capacitors across each winding of a kept
// transformer: the walk does not follow one winding to the next, yet the
// transformer is kept whole, and a winding without the capacitor that tunes
// it (an IF can's secondary) resonates nowhere near where it does in the
// set. Nets at AC ground count as one, so a capacitor from the hot end to
// chassis tunes a winding whose cold end is on a decoupled line.
func focusWindingTuning(x *Ctx, in map[*graph.Part]bool, isGround func(string) bool) {
	key := func(n string) string {
		if isGround(n) {
			return "" // every AC-ground net is the same node here
		}
		return n
	}
	for _, t := range x.c.Parts {
		if !in[t] || t.Kind != graph.Transformer {
			continue
		}
		nets := map[string]map[string]bool{} // winding group → its nets
		for _, pin := range t.Pins {
			g := windingGroup(pin.Name)
			if nets[g] == nil {
				nets[g] = map[string]bool{}
			}
			nets[g][key(pin.Net)] = true
		}
		for _, pin := range t.Pins {
			for _, cn := range x.Conns(pin.Net) {
				q := cn.Part
				if in[q] || q.Kind != graph.Capacitor || len(q.Pins) != 2 {
					continue
				}
				a, b := key(q.Pins[0].Net), key(q.Pins[1].Net)
				if w := nets[windingGroup(pin.Name)]; a != b && w[a] && w[b] {
					in[q] = true
				}
			}
		}
	}
}

// crossingNets lists the nets that cross the cut, in name order: each
// becomes a port.
func crossingNets(x *Ctx, in map[*graph.Part]bool, isGround func(string) bool) []string {
	c := x.c
	var crossing []string
	for _, n := range c.Nets {
		if isGround(n.Name) {
			continue
		}
		inside, outside, ported := false, false, false
		for _, cn := range x.Conns(n.Name) {
			if in[cn.Part] {
				inside = true
				ported = ported || cn.Part.Kind == graph.Port
			} else {
				outside = true
			}
		}
		if inside && outside && !ported {
			crossing = append(crossing, n.Name)
		}
	}
	return crossing
}

// applyCut removes what lies outside, puts a port on each crossing net and
// returns the logged step.
func applyCut(x *Ctx, seeds []*graph.Part, in map[*graph.Part]bool, crossing []string, labels map[string]string) Step {
	c := x.c
	var cut []*graph.Part
	var kept []string
	for _, p := range c.Parts {
		if in[p] {
			kept = append(kept, p.Ref)
		} else {
			cut = append(cut, p)
		}
	}
	st := Step{Rule: "focus"}
	for _, p := range seeds {
		st.Refs, st.Where = append(st.Refs, p.Ref), append(st.Where, p.Pos)
	}
	st.Removed = origins(cut...)
	// New ports take refs no part of the input used, not even one the cut
	// removes, so that every ref keeps one meaning in the log.
	taken := map[string]bool{}
	for _, p := range c.Parts {
		taken[p.Ref] = true
		for _, o := range p.From {
			taken[o] = true
		}
	}
	x.dropped = nil
	for _, p := range cut {
		x.Remove(p)
	}
	var ports []string
	next := 1
	for _, n := range crossing {
		ref := ""
		for ; ref == "" || taken[ref]; next++ {
			ref = "P" + strconv.Itoa(next)
		}
		port := &graph.Part{Ref: ref, Kind: graph.Port, Label: labels[n], Pins: []graph.Pin{{Name: "1", Net: n}}}
		if net := x.Net(n); net != nil && net.Role == graph.Signal && !x.IsEnd(n) {
			net.Role = graph.PortN
		}
		x.Add(port)
		if x.focusPorts == nil {
			x.focusPorts = map[string]bool{}
		}
		x.focusPorts[ref] = true
		st.Added = append(st.Added, ref)
		ports = append(ports, ref+" \""+labels[n]+"\" on "+n)
	}
	st.Dropped = append(st.Dropped, x.dropped...)
	sort.Strings(st.Dropped)
	x.dropped = nil
	var seedRefs []string
	for _, p := range seeds {
		seedRefs = append(seedRefs, p.Ref)
	}
	st.Why = "focus on " + strings.Join(seedRefs, ", ") + ": keeps the " + strconv.Itoa(len(kept)) +
		" parts of the stage around it (reached without crossing AC ground or another device's output), cuts away " +
		strconv.Itoa(len(cut))
	if len(ports) > 0 {
		st.Why += "; nets crossing the cut become ports: " + strings.Join(ports, ", ")
	}
	return st
}

// focusEnds gives the focused circuit its declared ends, so that it can be
// verified and swept on its own. The original inputs and outputs that the
// stage still holds stay. A cut net on which signal enters becomes an input
// too: one driven by a device output outside the cut ("from V1 anode"), or
// one the signal reaches from an original input through the parts cut away,
// following devices from their control (or common) terminal to their output
// only. When no original output is left, the other cut nets, where the
// signal leaves, become the outputs. Both lists are in the original order,
// then the cut nets by name.
func focusEnds(x *Ctx, in map[*graph.Part]bool, crossing []string, isGround func(string) bool) (inputs, outputs []string) {
	c := x.c
	inside := func(net string) bool {
		for _, cn := range x.Conns(net) {
			if in[cn.Part] {
				return true
			}
		}
		return false
	}
	for _, n := range c.Inputs {
		if inside(n) {
			inputs = append(inputs, n)
		}
	}
	for _, n := range c.Outputs {
		if inside(n) {
			outputs = append(outputs, n)
		}
	}
	// Nets the signal reaches from the original inputs through parts outside,
	// crossing a device only from its control or common terminal to its output.
	w := graph.NewWalk(c.View())
	w.Follow = func(n string) bool { return !isGround(n) }
	w.Enter = func(q *graph.Part, pin string) bool {
		return !in[q] && (!q.IsActive() || graph.RoleOfPin(q.Kind, pin) != graph.RoleOutput)
	}
	w.Leave = func(q *graph.Part, pin string) bool {
		return !q.IsActive() || graph.RoleOfPin(q.Kind, pin) == graph.RoleOutput
	}
	w.FromNets(c.Inputs, 0)
	reached := func(n string) bool { _, ok := w.NetDist(n); return ok }
	var leaving []string
	for _, n := range crossing {
		entering := reached(n)
		for _, cn := range x.Conns(n) {
			if q := cn.Part; !in[q] && q.IsActive() && graph.RoleOfPin(q.Kind, cn.Pin) == graph.RoleOutput {
				entering = true
			}
		}
		switch {
		case slices.Contains(c.Inputs, n) || slices.Contains(c.Outputs, n):
			// listed above
		case entering:
			// a region's input (the IF strip's mix_a, fed by the mixer's
			// anode) is where the signal enters a cut of the IF amplifier
			// as much as any other net
			inputs = append(inputs, n)
		case x.IsEnd(n):
			// a region's output that the signal leaves by: not a port of the
			// cut (the detector beyond it is cut away)
		default:
			leaving = append(leaving, n)
		}
	}
	if len(outputs) == 0 {
		outputs = leaving
	}
	return inputs, outputs
}

// windingGroup names the winding a transformer pin belongs to: the loader
// names them NAME1, NAME2 and NAMEt for a tap.
func windingGroup(pin string) string {
	if len(pin) < 2 {
		return pin
	}
	return pin[:len(pin)-1]
}

func allAt(p *graph.Part, isGround func(string) bool) bool {
	inner := 0
	for _, pin := range p.Pins {
		if !isGround(pin.Net) {
			inner++
		}
	}
	return inner <= 1 // one terminal on the bypassed net itself, the rest at AC ground
}

func containsPart(list []*graph.Part, p *graph.Part) bool {
	for _, q := range list {
		if q == p {
			return true
		}
	}
	return false
}
