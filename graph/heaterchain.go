package graph

import (
	"slices"
	"strings"
	"unicode"
)

// A series heater chain (an AC/DC set's: the mains through a dropper, each
// valve's heater in turn, a dial lamp and its shunt, to chassis) is one
// circuit whose order matters to a technician: an open heater darkens
// every valve after it, and the chain's junctions read a known voltage.
// A tag that only says "heater chain" at every heater pin loses that
// order, so the chain is walked here and each junction named by what lies
// on either side of it.

// HeaterChain is a series heater chain: Links[i] are the refs of one link
// (a valve's envelope, or the parts at one end: the dropper, a lamp and
// its shunt), and Nets[i] the junction between Links[i] and Links[i+1].
// Directed: Links run from the mains end to chassis (or, of a chain whose
// one end is open as captured, from the end fed through a dropper);
// otherwise the order is only a walk's.
type HeaterChain struct {
	Links    [][]string
	Nets     []string
	Directed bool
}

// HeaterChainAt is the series heater chain net lies in as a junction, if
// it is one: a chain of at least two valves' heaters in series, each
// junction holding the heater pins of one or two envelopes.
func (c *Circuit) HeaterChainAt(net string) (HeaterChain, bool) {
	envs, ok := c.heaterEnvelopes(net)
	if !ok || len(envs) == 0 {
		return HeaterChain{}, false
	}
	seen := map[string]bool{}
	for _, v := range envs {
		seen[v.envelope()] = true
	}
	// each side of net, walked away from it; a net with one envelope is an
	// end of the chain, its other side the end's parts
	sides := make([]chainSide, 2)
	for i, v := range envs {
		sides[i] = c.walkHeaters(v, net, seen)
	}
	if len(envs) == 1 {
		sides[1] = chainSide{end: net}
	}
	if sides[0].end == sides[1].end && len(envs) == 2 {
		return HeaterChain{}, false // both ways back to one net: heaters in parallel across it
	}
	if len(sides[0].valves)+len(sides[1].valves) < 2 || sides[0].broken || sides[1].broken {
		return HeaterChain{}, false
	}
	// the chain from the far end of side 0 to the far end of side 1
	var ch HeaterChain
	ch.add(c.endLink(sides[0].end), "")
	for i := len(sides[0].valves) - 1; i >= 0; i-- {
		// joined to the link walked after it: the next valve's net, or
		// the far end's
		far := sides[0].end
		if i+1 < len(sides[0].nets) {
			far = sides[0].nets[i+1]
		}
		ch.add([]string{sides[0].valves[i]}, far)
	}
	for i, v := range sides[1].valves {
		ch.add([]string{v}, sides[1].nets[i])
	}
	ch.add(c.endLink(sides[1].end), sides[1].end)
	first, last := c.endKind(sides[0].end), c.endKind(sides[1].end)
	ch.Directed = first != last
	if first == chassisEnd || first == openEnd && last == mainsEnd {
		slices.Reverse(ch.Links)
		slices.Reverse(ch.Nets)
	}
	return ch, true
}

// What a chain's end is: it goes on to chassis, on through its end link
// to some other net (the dropper to the mains: the feed), or nowhere (an
// open end, as captured).
const (
	openEnd = iota
	chassisEnd
	mainsEnd
)

func (c *Circuit) endKind(net string) int {
	switch {
	case c.toChassis(net):
		return chassisEnd
	case len(c.endLink(net)) > 0:
		return mainsEnd
	}
	return openEnd
}

// Junction names what the chain joins at net: the refs on the mains side
// and on the chassis side; ok is false when net is no junction of it.
func (ch HeaterChain) Junction(net string) (before, after []string, ok bool) {
	i := slices.Index(ch.Nets, net)
	if i < 0 {
		return nil, nil, false
	}
	return ch.Links[i], ch.Links[i+1], true
}

// JunctionText is a heater junction's tag: "htr" (the trade's short
// form on service sheets) and the links either side, "htr V5→V1", the
// arrow pointing to chassis; a chain with no known direction joins them
// with a dash. It stands in for the net's label (label), which on a chain
// repeats at every junction ("heater chain"), and is kept short because a
// tag's width is room the sheet's wires must go round. ok is false when
// net is no junction of a series chain, or when label names a neighbour
// already (the user has said where it sits).
func (c *Circuit) JunctionText(net, label string) (string, bool) {
	ch, ok := c.HeaterChainAt(net)
	if !ok {
		return "", false
	}
	before, after, _ := ch.Junction(net)
	if len(before) == 0 || len(after) == 0 {
		return "", false
	}
	if namesAny(label, before) || namesAny(label, after) {
		return "", false
	}
	join := "–"
	if ch.Directed {
		join = "→"
	}
	return "htr " + strings.Join(before, ",") + join + strings.Join(after, ","), true
}

// namesAny says whether label names one of refs as a word of its own
// ("heater chain V4-V5" names V4 and V5, "V40" does not name V4).
func namesAny(label string, refs []string) bool {
	words := strings.FieldsFunc(label, func(r rune) bool {
		return !unicode.IsLetter(r) && !unicode.IsDigit(r)
	})
	for _, r := range refs {
		if slices.Contains(words, r) {
			return true
		}
	}
	return false
}

// add appends a link and the net that joins it to the one before (none
// before the first link); an empty link (an end with no part: the chain's
// last heater on chassis itself) adds nothing.
func (ch *HeaterChain) add(link []string, net string) {
	if len(link) == 0 {
		return
	}
	if len(ch.Links) > 0 {
		ch.Nets = append(ch.Nets, net)
	}
	ch.Links = append(ch.Links, link)
}

// chainSide is a walk along heaters from a junction: the envelopes met in
// order, the net before each, the net the walk ended on, and broken when
// it met a parallel heater line (several envelopes on one net).
type chainSide struct {
	valves []string
	nets   []string
	end    string
	broken bool
}

// walkHeaters walks from net through valve v's heater and on while each
// next net holds exactly one unseen envelope's heater.
func (c *Circuit) walkHeaters(v *Part, net string, seen map[string]bool) chainSide {
	var s chainSide
	for {
		s.valves = append(s.valves, v.envelope())
		s.nets = append(s.nets, net)
		net = otherHeaterPin(v, net)
		envs, ok := c.heaterEnvelopes(net)
		var next *Part
		for _, e := range envs {
			switch {
			case e.envelope() == v.envelope():
			case seen[e.envelope()] || next != nil:
				// back to a heater already walked (two heaters in
				// parallel across a winding) or a fork: no series chain
				s.broken = true
				return s
			default:
				next = e
			}
		}
		if !ok || next == nil {
			s.end = net
			return s
		}
		seen[next.envelope()] = true
		v = next
	}
}

// heaterEnvelopes are the valves (one per envelope, by ref) with a heater
// pin on net; ok is false for chassis, a rail, a net holding more than two
// envelopes' heaters (a parallel heater line) or a directly heated
// filament's (its cathode on the net: the HT line, no chain).
func (c *Circuit) heaterEnvelopes(net string) ([]*Part, bool) {
	switch c.RoleOf(net) {
	case Ground, Supply, Bias:
		return nil, false
	}
	var out []*Part
	for _, cn := range c.ConnsOf(net) {
		p := cn.Part
		if p.Kind != Valve || RoleOfPin(Valve, cn.Pin) != RoleHeater {
			continue
		}
		if p.NetOf("k") == net {
			return nil, false
		}
		if !slices.ContainsFunc(out, func(q *Part) bool { return q.envelope() == p.envelope() }) {
			out = append(out, p)
		}
	}
	return out, len(out) <= 2
}

// endLink are the parts at a chain's end net that carry its current on:
// two-terminal parts other than capacitors (a heater bypass carries none),
// the dropper at the mains end, a lamp and its shunt at the chassis end.
func (c *Circuit) endLink(net string) []string {
	var out []string
	for _, cn := range c.ConnsOf(net) {
		p := cn.Part
		if len(p.Pins) != 2 || p.Kind == Capacitor || p.Kind == Valve || slices.Contains(out, p.Ref) {
			continue
		}
		out = append(out, p.Ref)
	}
	slices.Sort(out)
	return out
}

// toChassis says whether a chain end reaches chassis: the end net is
// chassis, or every part of its end link goes on to chassis.
func (c *Circuit) toChassis(net string) bool {
	if c.RoleOf(net) == Ground {
		return true
	}
	link := c.endLink(net)
	for _, ref := range link {
		p := c.Part(ref)
		other := p.Pins[0].Net
		if other == net {
			other = p.Pins[1].Net
		}
		if c.RoleOf(other) != Ground {
			return false
		}
	}
	return len(link) > 0
}

// otherHeaterPin is the net of v's heater pin that is not net, "" if none.
func otherHeaterPin(v *Part, net string) string {
	for _, pin := range v.Pins {
		if RoleOfPin(Valve, pin.Name) == RoleHeater && pin.Net != net {
			return pin.Net
		}
	}
	return ""
}

func (p *Part) envelope() string {
	if p.Envelope != "" {
		return p.Envelope
	}
	return p.Ref
}
