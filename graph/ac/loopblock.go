package ac

import (
	"fmt"
	"slices"

	"pare/graph"
)

// A device's loop system cut from the model of the whole circuit at one
// setting, indexed once for every device (Loops), instead of a copy of
// the netlist without the device's sources indexed afresh per device:
// at a set of a thousand parts that index was most of a loop system's
// cost, and every device at every gang setting built one.

// loopSystemIn is loopSystemOf of part ref on the indexed model m of the
// whole netlist: the same system, stamp for stamp. The device's controlled
// sources are left out of the block search and of the stamps, and a node
// only they touch counts as unused, as in the copy without them.
func loopSystemIn(c *graph.Circuit, m *model, ref string) (*loopSystem, error) {
	nl := m.nl
	own := m.vccsOf(ref)
	idx := -1
	if len(own) > 0 {
		idx = int(own[0])
	}
	if idx < 0 {
		if c.Part(ref) == nil {
			return nil, fmt.Errorf("no part %s in %s", ref, circuitName(c))
		}
		return nil, fmt.Errorf("%s has no controlled source in the small-signal model (not an amplifying part, or its output is shorted to its common terminal)", ref)
	}
	src := nl.prims[idx]
	removed := map[int32]bool{}
	var srcs []loopSource
	for _, i := range own {
		if p := nl.prims[i]; p.c == src.c && p.d == src.d {
			srcs = append(srcs, loopSource{gm: p.v, a: p.a, b: p.b})
			removed[i] = true
		}
	}
	used := func(n int) bool {
		if len(m.nodeGroups[n]) > 0 {
			return true
		}
		for _, i := range m.nodePrims[n] {
			if !removed[i] {
				return true
			}
		}
		return false
	}
	held := loopHeld(c, nl, srcs, src.c, src.d)
	isHeld := heldSet(len(nl.nodes), -1, held)
	if err := m.floatingUsed(held, isHeld, used); err != nil {
		return nil, err
	}
	reach := []int{src.c, src.d}
	for _, q := range srcs {
		reach = append(reach, q.a, q.b)
	}
	var seeds []int
	for _, n := range reach {
		if n > 0 && !isHeld[n] && used(n) && !slices.Contains(seeds, n) {
			seeds = append(seeds, n)
		}
	}
	sub := m.blockWithout(seeds, isHeld, removed)
	s := assemble(nl, -1, isHeld, sub)
	return &loopSystem{s: s, srcs: srcs, sign: 1, c: src.c, d: src.d}, nil
}

// vccsOf lists, in order, the controlled sources of part ref in m's
// netlist. The index of every part's is built on the first call: each
// loop system scanned every primitive of the set for its own device's,
// which over a set's devices cost the square of the set. A model made at
// another setting (atSetting) has the same primitives in the same order,
// so it may share the index.
func (m *model) vccsOf(ref string) []int32 {
	if m.vccs == nil {
		m.vccs = map[string][]int32{}
		for i, p := range m.nl.prims {
			if p.kind == primVCCS {
				m.vccs[p.ref] = append(m.vccs[p.ref], int32(i))
			}
		}
	}
	return m.vccs[ref]
}

// floatingUsed is floating with nothing driven, for the netlist without
// the primitives that leave the nodes used reports unused: the same nets
// in the same order as the index of that netlist would give (conduction
// never counts a controlled source, so only which nodes are used differs).
func (m *model) floatingUsed(held []int, isHeld []bool, used func(int) bool) error {
	err := m.floating(-1, held, isHeld)
	fe, ok := err.(*FloatingError)
	if !ok {
		return err
	}
	var nets []string
	for _, i := range m.adrift {
		if slices.Contains(fe.Nets, m.nl.nodes[i]) && used(i) {
			nets = append(nets, m.nl.nodes[i])
		}
	}
	if len(nets) == 0 {
		return nil
	}
	return &FloatingError{Nets: nets}
}

// blockWithout is the union of the blocks of the seeds (component), the
// primitives in removed neither followed nor listed.
func (m *model) blockWithout(seeds []int, isHeld []bool, removed map[int32]bool) *part {
	return m.floodFrom(seeds, isHeld, removed, false)
}

// floodFrom is flood from the seeds that are unknowns (not ground, not
// held), each queued once.
func (m *model) floodFrom(seeds []int, isHeld []bool, removed map[int32]bool, oneWay bool) *part {
	m.gen++
	var queue []int
	for _, n := range seeds {
		if n > 0 && !isHeld[n] && m.nodeMark[n] != m.gen {
			m.nodeMark[n] = m.gen
			queue = append(queue, n)
		}
	}
	return m.flood(queue, isHeld, removed, oneWay)
}
