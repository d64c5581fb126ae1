package render

import (
	"sort"

	"pare/graph"
)

// Electrodes of an active part by what they do, whatever the device:
// the one the signal drives (base, grid, gate), the one both halves of a
// long-tailed or push-pull pair may share (emitter, cathode, source) and
// the one that drives the load (collector, anode, drain).
var (
	controlPins = map[string]bool{"b": true, "g": true, "g1": true}
	commonPins  = map[string]bool{"e": true, "k": true, "s": true}
	outputPins  = map[string]bool{"c": true, "a": true, "d": true}
)

// units are the groups of parts that work as one and that a cut between
// stretches must never separate, each sorted, found by wiring alone:
//   - the two halves of a push-pull pair: two active parts sharing an
//     emitter or cathode net that is not at AC ground, or whose control
//     electrodes are on two pins of one winding (the ends of a centre-
//     tapped secondary), with their output electrodes on two pins of one
//     transformer (the ends of the output winding), the transformer with
//     them;
//   - a loudspeaker and a network across it: passive parts joined among
//     themselves by nets nothing else touches, whose other ends are all
//     on the loudspeaker's two nets, both of them (a Zobel); and the
//     transformer whose winding it is on (the output transformer), so a
//     pair's unit and its speaker's are one.
//
// Cut apart, the halves of a pair stood on two pages with connectors at
// both ends of the output winding, and a Zobel on another page from the
// speaker it loads: a technician reads neither as what it is.
func units(c *graph.Circuit) [][]string {
	out := pushPullPairs(c)
	for _, p := range c.Parts {
		if p.Kind == graph.Loudspeaker && len(p.Pins) == 2 {
			g := across(c, p)
			if t := feeding(c, p); t != nil {
				g = append(g, t.Ref)
			}
			if len(g) > 0 {
				out = append(out, append(g, p.Ref))
			}
		}
	}
	for _, u := range out {
		sort.Strings(u)
	}
	return out
}

// pinNet is the net on the first pin of a part whose name is in names, ""
// for none.
func pinNet(p *graph.Part, names map[string]bool) string {
	for _, pn := range p.Pins {
		if names[pn.Name] && pn.Net != "" && pn.Net != graph.NotConnected {
			return pn.Net
		}
	}
	return ""
}

// pushPullPairs are the push-pull pairs of units, each with its output
// transformer.
func pushPullPairs(c *graph.Circuit) [][]string {
	var act []*graph.Part
	for _, p := range c.Parts {
		if p.IsActive() && pinNet(p, outputPins) != "" {
			act = append(act, p)
		}
	}
	var out [][]string
	for i, a := range act {
		for _, b := range act[i+1:] {
			if a.Kind != b.Kind {
				continue
			}
			if !drivenTogether(c, a, b) {
				continue
			}
			if t := oneWinding(c, pinNet(a, outputPins), pinNet(b, outputPins)); t != nil {
				out = append(out, []string{a.Ref, b.Ref, t.Ref})
			}
		}
	}
	return out
}

// drivenTogether says whether two active parts are driven as the halves
// of one pair: they share an emitter or cathode net that is not at AC
// ground (a long tail, a shared cathode resistor), their control
// electrodes are on the two ends of one winding (a centre-tapped driver
// secondary), or each control electrode is fed, directly or through one
// capacitor, from another electrode of one third device (a phase
// splitter's anode and cathode).
func drivenTogether(c *graph.Circuit, a, b *graph.Part) bool {
	ca, cb := pinNet(a, commonPins), pinNet(b, commonPins)
	if ca != "" && ca == cb && !c.RoleOf(ca).IsACGround() {
		return true
	}
	ga, gb := pinNet(a, controlPins), pinNet(b, controlPins)
	if oneWinding(c, ga, gb) != nil {
		return true
	}
	fa, fb := feeders(c, ga), feeders(c, gb)
	for k, pa := range fa {
		if pb, ok := fb[k]; ok && pa != pb {
			return true
		}
	}
	return false
}

// feeders are the active parts whose electrodes reach a net directly or
// through one capacitor, by ref, each with the electrode's pin name.
func feeders(c *graph.Circuit, n string) map[string]string {
	out := map[string]string{}
	if n == "" || c.RoleOf(n).IsACGround() {
		return out
	}
	var walk func(net string, hop bool)
	walk = func(net string, hop bool) {
		for _, cn := range c.ConnsOf(net) {
			p := cn.Part
			switch {
			case p.IsActive() && !controlPins[cn.Pin]:
				out[p.Ref] = cn.Pin
			case hop && p.Kind == graph.Capacitor && len(p.Pins) == 2:
				for _, pn := range p.Pins {
					if pn.Net != net && !c.RoleOf(pn.Net).IsACGround() {
						walk(pn.Net, false)
					}
				}
			}
		}
	}
	walk(n, true)
	return out
}

// oneWinding is a transformer with the two ends of one winding (pins named
// alike but for a closing 1 and 2) on two different nets that carry
// signal, nil when there is none.
func oneWinding(c *graph.Circuit, n1, n2 string) *graph.Part {
	if n1 == "" || n2 == "" || n1 == n2 || c.RoleOf(n1).IsACGround() || c.RoleOf(n2).IsACGround() {
		return nil
	}
	for _, cn := range c.ConnsOf(n1) {
		t := cn.Part
		if t.Kind != graph.Transformer {
			continue
		}
		for _, pn := range t.Pins {
			if pn.Net == n2 && windingEnds(cn.Pin, pn.Name) {
				return t
			}
		}
	}
	return nil
}

// windingEnds says whether two pin names are the two ends of one winding
// (p1 and p2, s1 and s2; a tap is pt).
func windingEnds(x, y string) bool {
	if len(x) < 2 || len(x) != len(y) || x[:len(x)-1] != y[:len(y)-1] {
		return false
	}
	e := x[len(x)-1:] + y[len(y)-1:]
	return e == "12" || e == "21"
}

// acrossMax is the most parts a network across a loudspeaker holds: a
// Zobel is two, a Zobel with a damping resistor three or four.
const acrossMax = 4

// across are the parts of the networks across a two-terminal load (units),
// none when there are none. Nets at AC ground count as one: a Zobel's foot
// on chassis is across a speaker whose cold end is on chassis.
func across(c *graph.Circuit, load *graph.Part) []string {
	key := func(n string) string {
		if c.RoleOf(n).IsACGround() {
			return "\x00ground"
		}
		return n
	}
	ends := map[string]bool{key(load.Pins[0].Net): true, key(load.Pins[1].Net): true}
	if len(ends) != 2 {
		return nil
	}
	seen := map[string]bool{load.Ref: true}
	var out []string
	for _, pn := range load.Pins {
		if c.RoleOf(pn.Net).IsACGround() {
			continue // the network is found from the load's live end
		}
		for _, cn := range c.ConnsOf(pn.Net) {
			if g, ok := network(c, cn.Part, ends, key, seen); ok {
				out = append(out, g...)
			}
		}
	}
	return out
}

// network grows the group of passive parts from p through nets that are
// not the load's ends, and says whether it is a network across them: no
// more than acrossMax parts, each passive, every net it reaches other than
// the ends touched by its own parts only, and both ends reached.
func network(c *graph.Circuit, p *graph.Part, ends map[string]bool, key func(string) string, seen map[string]bool) ([]string, bool) {
	if seen[p.Ref] {
		return nil, false
	}
	group, queue, at, ok := []string{}, []*graph.Part{p}, map[string]bool{}, true
	seen[p.Ref] = true
	for len(queue) > 0 {
		q := queue[0]
		queue = queue[1:]
		group = append(group, q.Ref)
		ok = ok && passive(q) && len(group) <= acrossMax
		for _, pn := range q.Pins {
			if pn.Net == "" || pn.Net == graph.NotConnected {
				ok = false
				continue
			}
			if k := key(pn.Net); ends[k] {
				at[k] = true
				continue
			}
			for _, cn := range c.ConnsOf(pn.Net) {
				if !seen[cn.Part.Ref] {
					seen[cn.Part.Ref] = true
					queue = append(queue, cn.Part)
				}
			}
		}
	}
	return group, ok && len(at) == 2
}

// passive says whether a part may be in a network across a load.
func passive(p *graph.Part) bool {
	switch p.Kind {
	case graph.Resistor, graph.Capacitor, graph.Inductor:
		return len(p.Pins) == 2
	}
	return false
}

// unitsWhole joins the stretches holding the parts of each unit into one,
// standing where the first of them stood: the cut between stretches then
// cannot fall inside a unit. Stretches of different channels, ports and
// the loose parts are never joined. It reports whether it joined any: the
// stretches' x are then measured afresh in line (inLine).
func unitsWhole(c *graph.Circuit, bs []block) ([]block, bool) {
	joined := false
	for _, u := range units(c) {
		var at []int
		for i, b := range bs {
			if holdsAny(b, u) {
				at = append(at, i)
			}
		}
		if len(at) < 2 || !sameChannel(bs, at) {
			continue
		}
		one := bs[at[0]]
		for _, i := range at[1:] {
			one = join(one, bs[i])
		}
		one.port = false
		var out []block
		for i, b := range bs {
			switch {
			case i == at[0]:
				out = append(out, one)
			case !holdsAny(b, u):
				out = append(out, b)
			}
		}
		bs, joined = out, true
	}
	return bs, joined
}

// holdsAny says whether a stretch holds one of refs.
func holdsAny(b block, refs []string) bool {
	for _, r := range b.refs {
		for _, u := range refs {
			if r == u {
				return true
			}
		}
	}
	return false
}

// sameChannel says whether the stretches at are all of one channel, none
// a port nor the loose parts.
func sameChannel(bs []block, at []int) bool {
	for _, i := range at {
		if b := bs[i]; b.port || b.loose || b.ch != bs[at[0]].ch {
			return false
		}
	}
	return true
}

// feeding is the transformer with a pin on a load's live net (its output
// transformer's secondary), nil when there is none or several.
func feeding(c *graph.Circuit, load *graph.Part) *graph.Part {
	var t *graph.Part
	for _, pn := range load.Pins {
		if c.RoleOf(pn.Net).IsACGround() {
			continue
		}
		for _, cn := range c.ConnsOf(pn.Net) {
			if cn.Part.Kind != graph.Transformer || cn.Part == t {
				continue
			}
			if t != nil {
				return nil
			}
			t = cn.Part
		}
	}
	return t
}
