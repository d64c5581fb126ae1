package stages

import (
	"fmt"
	"sort"

	"pare/graph"
)

// A variant is a pattern with each optional part decided: present, or left
// out (and, for optional = "short", its two nets made one). Matching works on
// variants only, so the search itself never thinks about optional parts.
type variant struct {
	p      *Pattern
	nets   []vnet
	parts  []vpart // in search order
	absent []string
}

type vnet struct {
	names   []string // pattern nets merged into this one
	at      string
	outside string
	degree  int // terminals of the pattern on it
	parts   int // distinct pattern parts on it: a lower bound on the bound net's parts
}

type vpart struct {
	pp    *PPart
	slots []int // vnet per terminal: Pins in order, or the windings flattened
	link  int   // slot whose net is already placed when this part's turn comes; -1 = none
	kinds []graph.Kind
}

// maxOptional bounds the variants per pattern (2^n): 64 keeps the search quick.
const maxOptional = 6

// deviceRarity orders the search: the rarer the kind, the fewer candidates
// for the first part, and the earlier a dead end shows.
var deviceRarity = map[string]int{
	"active": 0, "valve": 0, "bjt": 0, "fet": 0,
	"transformer": 1, "double-diode": 1,
	"tapped-coil": 2, "crystal": 2, "loudspeaker": 2,
	"diode": 3, "pot": 3, "inductor": 4, "capacitor": 5, "resistor": 6, "element": 7,
}

func (p *Pattern) compile() error {
	var optional []int
	for i, pp := range p.Parts {
		if pp.Optional != "" {
			optional = append(optional, i)
		}
	}
	if len(optional) > maxOptional {
		return fmt.Errorf("pattern %s has %d optional parts; at most %d keep the search small", p.ID, len(optional), maxOptional)
	}
	netIdx := map[string]int{}
	for i, n := range p.Nets {
		netIdx[n.Name] = i
	}
	p.variants = nil
	for mask := 0; mask < 1<<len(optional); mask++ {
		absent := map[int]bool{}
		for b, pi := range optional {
			if mask&(1<<b) != 0 {
				absent[pi] = true
			}
		}
		if v := p.variant(absent, netIdx); v != nil {
			p.variants = append(p.variants, v)
		}
	}
	if len(p.variants) == 0 {
		return fmt.Errorf("pattern %s can never match: every variant shorts a part out", p.ID)
	}
	sort.SliceStable(p.variants, func(i, j int) bool { return len(p.variants[i].parts) > len(p.variants[j].parts) })
	return nil
}

func (p *Pattern) variant(absent map[int]bool, netIdx map[string]int) *variant {
	parent := make([]int, len(p.Nets))
	for i := range parent {
		parent[i] = i
	}
	find := func(i int) int {
		for parent[i] != i {
			parent[i] = parent[parent[i]]
			i = parent[i]
		}
		return i
	}
	v := &variant{p: p}
	for i, pp := range p.Parts {
		if !absent[i] {
			continue
		}
		v.absent = append(v.absent, pp.Name)
		if pp.Optional == "short" {
			a, b := find(netIdx[pp.Pins[0].Net]), find(netIdx[pp.Pins[1].Net])
			if a != b {
				parent[max(a, b)] = min(a, b)
			}
		}
	}
	// One vnet per class, in order of the first pattern net of each class.
	classOf := map[int]int{}
	for i, n := range p.Nets {
		r := find(i)
		ci, ok := classOf[r]
		if !ok {
			ci = len(v.nets)
			classOf[r] = ci
			v.nets = append(v.nets, vnet{at: n.At})
		}
		vn := &v.nets[ci]
		vn.names = append(vn.names, n.Name)
		vn.at = mergeAt(vn.at, n.At)
		if outsideRank(n.Outside) > outsideRank(vn.outside) {
			vn.outside = n.Outside
		}
	}
	var parts []vpart
	for i := range p.Parts {
		if absent[i] {
			continue
		}
		pp := &p.Parts[i]
		vp := vpart{pp: pp, link: -1, kinds: kindsFor(pp.Device)}
		for _, n := range pp.netList() {
			vp.slots = append(vp.slots, classOf[find(netIdx[n])])
		}
		same := true
		counted := map[int]bool{}
		for _, s := range vp.slots {
			if s != vp.slots[0] {
				same = false
			}
			v.nets[s].degree++
			if !counted[s] {
				counted[s] = true
				v.nets[s].parts++
			}
		}
		if same && len(vp.slots) > 1 && !isActiveDevice(pp.Device) {
			return nil // a short has put this part across one net
		}
		parts = append(parts, vp)
	}
	if !connected(parts, v.nets) {
		return nil // a part tied on only through AC ground: not one stage
	}
	v.parts = searchOrder(parts, v.nets)
	return v
}

// connected reports whether the parts hang together through nets that are
// not AC ground. A variant that leaves a part joined to the rest only by
// ground would match that part anywhere in the set.
func connected(parts []vpart, nets []vnet) bool {
	if len(parts) == 0 {
		return false
	}
	reached := map[int]bool{0: true}
	netSeen := map[int]bool{}
	for changed := true; changed; {
		changed = false
		for i, vp := range parts {
			if !reached[i] {
				continue
			}
			for _, n := range vp.slots {
				if nets[n].at != "ground" && !netSeen[n] {
					netSeen[n] = true
					changed = true
				}
			}
		}
		for i, vp := range parts {
			if reached[i] {
				continue
			}
			for _, n := range vp.slots {
				if netSeen[n] {
					reached[i] = true
					changed = true
					break
				}
			}
		}
	}
	return len(reached) == len(parts)
}

// netList is the pattern nets of a part's terminals in binding order.
func (pp *PPart) netList() []string {
	if pp.Device == "transformer" {
		var out []string
		for _, w := range pp.Windings {
			out = append(out, w...)
		}
		return out
	}
	out := make([]string, len(pp.Pins))
	for i, pin := range pp.Pins {
		out[i] = pin.Net
	}
	return out
}

func isActiveDevice(d string) bool {
	return d == "active" || d == "valve" || d == "bjt" || d == "fet"
}

// mergeAt combines the constraints of two pattern nets made one: ground is
// the strongest (a shorted coupling to ground is ground), then signal, rail.
func mergeAt(a, b string) string {
	rank := map[string]int{"any": 0, "not-ground": 1, "rail": 2, "bias": 2, "signal": 3, "ground": 4}
	if rank[b] > rank[a] {
		return b
	}
	return a
}

func outsideRank(s string) int {
	switch s {
	case "none":
		return 3
	case "signal", "source":
		return 2
	case "some":
		return 1
	}
	return 0
}

// searchOrder puts the rarest part first, then repeatedly the part best
// tied to the nets placed so far: through a signal net (few terminals) rather
// than AC ground (every decoupled part of the set).
func searchOrder(parts []vpart, nets []vnet) []vpart {
	placed := make([]bool, len(nets))
	used := make([]bool, len(parts))
	var out []vpart
	for len(out) < len(parts) {
		best, bestScore, bestLink := -1, 1<<30, -1
		for i, vp := range parts {
			if used[i] {
				continue
			}
			link := -1
			for s, n := range vp.slots {
				if placed[n] && nets[n].at != "ground" {
					if link < 0 || nets[n].at == "signal" && nets[vp.slots[link]].at != "signal" {
						link = s
					}
				}
			}
			score := deviceRarity[vp.pp.Device]
			if link >= 0 && nets[vp.slots[link]].at != "signal" {
				score += 50 // an "any" net may turn out to be ground
			}
			if link < 0 {
				score += 100
				if len(out) == 0 {
					score -= 100
				}
			}
			if score < bestScore {
				best, bestScore, bestLink = i, score, link
			}
		}
		used[best] = true
		vp := parts[best]
		vp.link = bestLink
		for _, n := range vp.slots {
			placed[n] = true
		}
		out = append(out, vp)
	}
	return out
}
