package stages

import (
	"errors"
	"fmt"
	"sort"
	"strings"

	"pare/graph"
)

// match is one place where a pattern variant fits.
type match struct {
	v     *variant
	parts []int // circuit part per variant part (search order)
	nets  []int // circuit net per vnet
	bind  []int // which binding of each part was used (for transformers: the coil assignment)
	coils [][]int
	refs  []string // sorted refs
}

// ErrSearchLimit is wrapped by the error Find returns when its step budget
// ran out; the stages found until then are still returned.
var ErrSearchLimit = errors.New("search limit reached")

type searcher struct {
	w        *world
	steps    int
	limit    int
	partUsed []bool
	netOwner []int // circuit net → vnet bound to it, -1 none (ground is shared)
	found    []*match
	// eval, when set, evaluates a match as it is found (its formulas'
	// figures and its pattern's guards) and keeps it, in cands, only if
	// it passes: nil keeps every match. A pattern loose enough to match
	// every pair of parts on a shared rail (a supply filter section: any
	// element and any capacitor to ground on one net) then holds the
	// sections that are sections, not every pair it tried.
	eval    func(*match) *found
	cands   []*found
	seen    map[string]bool
	scratch [][]binding // per search depth, reused
}

func (s *searcher) run(v *variant) error {
	for len(s.scratch) < len(v.parts) {
		s.scratch = append(s.scratch, nil)
	}
	m := &match{v: v, parts: make([]int, len(v.parts)), nets: make([]int, len(v.nets)), bind: make([]int, len(v.parts)), coils: make([][]int, len(v.parts))}
	for i := range m.nets {
		m.nets[i] = -1
	}
	return s.place(m, 0)
}

func (s *searcher) place(m *match, depth int) error {
	v := m.v
	if depth == len(v.parts) {
		s.complete(m)
		return s.tooMany(v)
	}
	vp := &v.parts[depth]
	cands, ok := s.linked(m, vp)
	if !ok {
		for _, k := range vp.kinds {
			cands = append(cands, s.w.byKind[k]...)
		}
		if len(vp.kinds) > 1 {
			sort.Ints(cands)
		}
	}
	for _, ci := range cands {
		if s.partUsed[ci] || !s.accepts(vp, ci) {
			continue
		}
		s.scratch[depth] = s.bindings(vp.pp, ci, s.scratch[depth][:0])
		for bi := range s.scratch[depth] {
			b := &s.scratch[depth][bi]
			s.steps++
			if s.steps > s.limit {
				return fmt.Errorf("%w: pattern %s stopped after %d steps (raise the limit, or reduce the circuit first)", ErrSearchLimit, v.p.ID, s.limit)
			}
			var newly []int
			ok := true
			for slot, net := range b.nets() {
				vn := vp.slots[slot]
				if cur := m.nets[vn]; cur >= 0 {
					if cur != net {
						ok = false
						break
					}
					continue
				}
				if !s.netFits(&v.nets[vn], net) {
					ok = false
					break
				}
				if net != groundNet && s.netOwner[net] >= 0 {
					ok = false
					break
				}
				m.nets[vn] = net
				if net != groundNet {
					s.netOwner[net] = vn
				}
				newly = append(newly, vn)
			}
			if ok {
				s.partUsed[ci] = true
				m.parts[depth], m.bind[depth] = ci, bi
				m.coils[depth] = append(m.coils[depth][:0], b.coil[:b.ncoil]...)
				if err := s.place(m, depth+1); err != nil {
					return err
				}
				s.partUsed[ci] = false
			}
			for _, vn := range newly {
				if net := m.nets[vn]; net != groundNet {
					s.netOwner[net] = -1
				}
				m.nets[vn] = -1
			}
		}
	}
	return nil
}

// linked draws a part's candidates from the terminals already placed: the
// placed non-ground net with the fewest connections, or, when every terminal
// is placed at AC ground, the parts that sit wholly on ground. ok is false
// when the part must be looked for among all parts of its kind.
func (s *searcher) linked(m *match, vp *vpart) ([]int, bool) {
	var best []int
	found, allPlaced := false, true
	for _, vn := range vp.slots {
		net := m.nets[vn]
		switch {
		case net < 0:
			allPlaced = false
		case net != groundNet:
			if l := s.w.conns[net]; !found || len(l) < len(best) {
				best, found = l, true
			}
		}
	}
	if found {
		return best, true
	}
	if allPlaced {
		return s.w.onGround, true
	}
	return nil, false
}

// netFits checks a vnet's "at" and degree against a circuit net.
func (s *searcher) netFits(vn *vnet, net int) bool {
	w := s.w
	switch vn.at {
	case "ground":
		if net != groundNet {
			return false
		}
	case "signal":
		if net == groundNet || w.full && w.role[net].IsACGround() {
			return false
		}
	case "rail":
		if net == groundNet || !w.role[net].IsACGround() {
			return false
		}
	case "not-ground":
		if net == groundNet {
			return false
		}
	case "bias":
		if w.role[net] != graph.Bias {
			return false
		}
	}
	// Degree: the circuit net carries at least as many parts as the
	// pattern puts on it (parts are matched one to one).
	return net == groundNet || len(w.conns[net]) >= vn.parts
}

// complete checks the constraints that need the whole match, then records it.
func (s *searcher) complete(m *match) {
	w := s.w
	in := map[int]bool{}
	for _, ci := range m.parts {
		in[ci] = true
	}
	matchedNet := map[int]bool{}
	for _, n := range m.nets {
		matchedNet[n] = true
	}
	for vi, vn := range m.v.nets {
		net := m.nets[vi]
		if net <= groundNet || vn.outside == "" {
			continue // at AC ground, unconstrained, or used by absent parts only
		}
		var others []int
		for _, ci := range w.conns[net] {
			if !in[ci] {
				others = append(others, ci)
			}
		}
		switch vn.outside {
		case "none":
			if len(others) > 0 {
				return
			}
		case "some":
			if len(others) == 0 {
				return
			}
		case "source":
			fed := false
			for _, ci := range others {
				if k := w.parts[ci].Kind; k != graph.Resistor && k != graph.Capacitor {
					fed = true
				}
			}
			if !fed {
				return
			}
		case "signal":
			fed := w.isEnd[net]
			for _, ci := range others {
				if w.parts[ci].Kind == graph.Port {
					fed = true
				}
				for _, id := range w.pins[ci] {
					if id != groundNet && !matchedNet[id] && !(w.full && w.role[id].IsACGround()) {
						fed = true
					}
				}
			}
			if !fed {
				return
			}
		}
	}
	refs := make([]string, len(m.parts))
	for i, ci := range m.parts {
		refs[i] = w.parts[ci].Ref
	}
	sort.Strings(refs)
	key := m.v.p.ID + ":" + strings.Join(refs, ",")
	if s.seen[key] {
		return
	}
	s.seen[key] = true
	cp := &match{v: m.v, parts: append([]int(nil), m.parts...), nets: append([]int(nil), m.nets...),
		bind: append([]int(nil), m.bind...), coils: make([][]int, len(m.coils)), refs: refs}
	for i, c := range m.coils {
		cp.coils[i] = append([]int(nil), c...)
	}
	if s.eval != nil {
		f := s.eval(cp)
		if f == nil {
			return // its pattern's figures or guards refuse it: not held
		}
		s.cands = append(s.cands, f)
	}
	s.found = append(s.found, cp)
}
