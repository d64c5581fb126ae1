package pipeline

import (
	"sort"

	"pare/graph"
)

// localJournal is localPair(j.Before(), j.Circuit()) read from the journal
// of the step (graph.Journal) instead of from two whole circuits: the same
// groups, found from the parts and nets the step touched by walking the
// connection index of each circuit, at the cost of the groups rather than
// of the set. A whole set's reduction proves thousands of steps; a walk
// over every part per step made it quadratic in the set.
// TestLocalJournalIsLocalPair holds the two to the same sub-circuits.
func localJournal(j *graph.Journal) (b, a *graph.Circuit, whole, none bool) {
	after := j.Circuit()
	declB := j.BeforeDeclared()
	if !sameDeclarations(declB, after) {
		return j.Before(), after, true, false
	}
	sides := [2]side{
		{c: declB, net: j.BeforeNet, conns: j.BeforeConns, part: j.BeforePart,
			crystals: func() []*graph.Part { return j.BeforeOfKind(graph.Crystal) }},
		{c: after, net: after.Net, conns: after.ConnsOf, part: after.Part,
			crystals: func() []*graph.Part { return after.Index().OfKind(graph.Crystal) }},
	}
	seen := map[string]bool{} // the nets of the touched groups, in either circuit
	var queue []string
	visit := func(n string) {
		if !seen[n] {
			seen[n] = true
			queue = append(queue, n)
		}
	}
	for _, n := range journalSeeds(j) {
		if sides[0].live(n) || sides[1].live(n) {
			visit(n)
		}
	}
	if len(queue) == 0 {
		return nil, nil, false, true
	}
	for len(queue) > 0 {
		n := queue[0]
		queue = queue[1:]
		for i := range sides {
			s := &sides[i]
			if !s.live(n) {
				continue
			}
			for _, cn := range s.conns(n) {
				for _, pin := range cn.Part.Pins {
					if s.live(pin.Net) {
						visit(pin.Net)
					}
				}
			}
		}
	}
	var all [2]bool
	var sub [2]*graph.Circuit
	for i := range sides {
		sub[i], all[i] = sides[i].cut(j, seen)
	}
	b, a = sub[0], sub[1]
	if (all[0] && all[1]) || !regionsFit(b) || !regionsFit(a) {
		return j.Before(), after, true, false
	}
	in := func(c *graph.Circuit, net string) bool {
		if c == declB {
			return sides[0].live(net) && seen[net]
		}
		return sides[1].live(net) && seen[net]
	}
	filterEnds(declB, after, b, a, in)
	return b, a, false, false
}

// side is one of the two circuits of a step as localJournal reads it: its
// declarations (c) and its lookups.
type side struct {
	c        *graph.Circuit
	net      func(string) *graph.Net
	conns    func(string) []graph.Conn
	part     func(string) *graph.Part
	crystals func() []*graph.Part
}

// live is !deadNets(c)[net]: a net not at AC ground and not "nc".
func (s *side) live(net string) bool {
	if net == graph.NotConnected {
		return false
	}
	n := s.net(net)
	return n == nil || !n.Role.IsACGround()
}

// cut is subCircuit on one side: the parts with a pin on a live net of
// the touched groups, by ref, the nets they use, every region, and the
// resonances of the crystals left out; all reports that no part with a
// live net was left out.
func (s *side) cut(j *graph.Journal, seen map[string]bool) (*graph.Circuit, bool) {
	kept := map[string]*graph.Part{}
	for n := range seen {
		if s.live(n) {
			for _, cn := range s.conns(n) {
				kept[cn.Part.Ref] = cn.Part
			}
		}
	}
	refs := make([]string, 0, len(kept))
	for ref := range kept {
		refs = append(refs, ref)
	}
	sort.Strings(refs)
	parts := make([]*graph.Part, len(refs))
	for i, ref := range refs {
		parts[i] = kept[ref]
	}
	// subCircuit on a circuit of the kept parts alone keeps them all, the
	// nets they use and every region; the crystals left out are added here.
	out, _ := subCircuit(cutView(s.c, parts, s.net), nil, func(*graph.Circuit, string) bool { return true })
	for _, p := range s.crystals() {
		if kept[p.Ref] == nil && s.livePart(p) {
			crystalMarks(out.Freqs, p)
		}
	}
	return out, !s.leftOutLive(j, kept)
}

func (s *side) livePart(p *graph.Part) bool {
	for _, pin := range p.Pins {
		if s.live(pin.Net) {
			return true
		}
	}
	return false
}

// leftOutLive reports whether a part with a live net is not among the
// kept: the first part left out is live on a set of many channels, so the
// walk stops at once.
func (s *side) leftOutLive(j *graph.Journal, kept map[string]*graph.Part) bool {
	after := j.Circuit()
	for _, ref := range j.Parts() { // parts only the circuit before the step has
		if p := s.part(ref); p != nil && after.Part(ref) == nil && kept[ref] == nil && s.livePart(p) {
			return true
		}
	}
	for _, p := range after.Parts {
		if q := s.part(p.Ref); q != nil && kept[q.Ref] == nil && s.livePart(q) {
			return true
		}
	}
	return false
}

// cutView is a circuit holding the declarations of whole, the given parts
// and the nets they use (looked up by net), for subCircuit to copy.
func cutView(whole *graph.Circuit, parts []*graph.Part, net func(string) *graph.Net) *graph.Circuit {
	v := *whole
	v.Parts = parts
	names := map[string]bool{}
	for _, p := range parts {
		for _, pin := range p.Pins {
			names[pin.Net] = true
		}
	}
	v.Nets = nil
	for name := range names {
		if n := net(name); n != nil {
			v.Nets = append(v.Nets, n)
		}
	}
	sort.Slice(v.Nets, func(a, b int) bool { return v.Nets[a].Name < v.Nets[b].Name })
	return &v
}

// journalSeeds is changedNets read from the journal: the nets of every
// part the step added, removed or changed, and every net it created,
// deleted or gave another role.
func journalSeeds(j *graph.Journal) []string {
	after := j.Circuit()
	var out []string
	for _, ref := range j.Parts() {
		p, q := after.Part(ref), j.BeforePart(ref)
		if p != nil && q != nil && samePart(p, q) {
			continue
		}
		for _, x := range []*graph.Part{p, q} {
			if x != nil {
				for _, pin := range x.Pins {
					out = append(out, pin.Net)
				}
			}
		}
	}
	for _, name := range j.Nets() {
		n, m := j.BeforeNet(name), after.Net(name)
		if (n == nil) != (m == nil) || (n != nil && n.Role != m.Role) {
			out = append(out, name)
		}
	}
	return out
}
