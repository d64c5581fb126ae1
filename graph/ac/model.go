// One circuit at one gang setting, elaborated once and shared by every
// response a comparison probes in it.

package ac

import (
	"slices"

	"pare/graph"
)

// model is a circuit elaborated at one setting, with the indexes every probe
// of it shares. A whole set is many channels joined only through AC ground
// (the reference node), so its matrix is block diagonal: a probe solves only
// the block its source drives (component), which costs the size of that
// channel, not of the set. The block's numbers are those it has inside the
// whole matrix, to the last bit (assemble says why).
type model struct {
	c  *graph.Circuit
	nl *netlist
	// used marks the nodes any primitive or winding touches.
	used []bool
	// nodePrims and nodeGroups list, per node, the primitives and winding
	// groups with a terminal (or a control terminal) on it.
	nodePrims, nodeGroups [][]int32
	// cond is each node's root among the parts that conduct at AC, and
	// adrift the used nodes whose conducting group holds no ground, in
	// ascending order: the candidates for a floating net.
	cond   []int
	adrift []int
	// Marks for the block search, by generation: no clearing per probe.
	gen                        int
	nodeMark, primMark, grMark []int
	// sources holds, per node, what every probe from it shares (sourceAt).
	sources map[int]*source
	inputs  []int // the nodes of the declared inputs, in their order
	// vccs lists each part's controlled sources by primitive (vccsOf).
	vccs map[string][]int32
	// from is the model this one was made from at another setting
	// (atSetting), nil for one elaborated.
	from *model
}

// newModel elaborates c at the setting o, with c's DC view shared through dc.
func newModel(c *graph.Circuit, o Options, dc *dcShare) (*model, error) {
	nl, err := elaborateShared(c, o, dc)
	if err != nil {
		return nil, err
	}
	return indexModel(c, nl), nil
}

// indexModel builds the indexes of an elaborated netlist.
func indexModel(c *graph.Circuit, nl *netlist) *model {
	n := len(nl.nodes)
	m := &model{c: c, nl: nl, used: make([]bool, n), nodePrims: make([][]int32, n), nodeGroups: make([][]int32, n),
		nodeMark: make([]int, n), primMark: make([]int, len(nl.prims)), grMark: make([]int, len(nl.groups))}
	touch := func(list [][]int32, node, i int) {
		m.used[node] = true
		if l := list[node]; len(l) == 0 || l[len(l)-1] != int32(i) {
			list[node] = append(l, int32(i))
		}
	}
	for i, p := range nl.prims {
		touch(m.nodePrims, p.a, i)
		touch(m.nodePrims, p.b, i)
		if p.kind == primVCCS {
			touch(m.nodePrims, p.c, i)
			touch(m.nodePrims, p.d, i)
		}
	}
	for i, g := range nl.groups {
		for _, w := range g.winds {
			touch(m.nodeGroups, w.a, i)
			touch(m.nodeGroups, w.b, i)
		}
	}
	m.conduction()
	for _, in := range c.Inputs {
		if n, ok := nl.netNode[in]; ok {
			m.inputs = append(m.inputs, n)
		}
	}
	return m
}

// conduction joins the nodes through every part that conducts at AC (as
// checkFloating does, without the driven and held nodes, which differ from
// probe to probe) and lists the used nodes not joined to ground.
func (m *model) conduction() {
	nl := m.nl
	var sets graph.DisjointSets
	find, join := sets.Find, sets.Union
	for _, p := range nl.prims {
		if p.kind != primVCCS {
			join(p.a, p.b)
		}
	}
	for _, g := range nl.groups {
		for _, w := range g.winds {
			join(w.a, w.b)
		}
	}
	m.cond = make([]int, len(nl.nodes))
	for i := range m.cond {
		m.cond[i] = find(i)
	}
	for i := 1; i < len(nl.nodes); i++ {
		if m.used[i] && m.cond[i] != m.cond[0] {
			m.adrift = append(m.adrift, i)
		}
	}
}

// floating is checkFloating of the whole circuit with driven at 1 V and the
// held nodes at 0 V, from the shared conduction groups: the same nets in the
// same order, at the cost of the few nodes not joined to ground.
func (m *model) floating(driven int, held []int, isHeld []bool) error {
	if len(m.adrift) == 0 {
		return nil
	}
	roots := []int{m.cond[0]}
	if driven > 0 {
		roots = append(roots, m.cond[driven])
	}
	for _, h := range held {
		if h > 0 && isHeld[h] {
			roots = append(roots, m.cond[h])
		}
	}
	var nets []string
	for _, i := range m.adrift {
		if i != driven && !isHeld[i] && !slices.Contains(roots, m.cond[i]) {
			nets = append(nets, m.nl.nodes[i])
		}
	}
	if len(nets) == 0 {
		return nil
	}
	return &FloatingError{Nets: nets}
}

// component finds the block of the matrix that start belongs to: every node
// a chain of stamps joins to it without passing through ground or a held
// node, with the primitives and winding groups on them. The driven node,
// when start is driven, is not an unknown but its neighbours are (the
// right-hand side), so the search starts there all the same.
func (m *model) component(start int, isHeld []bool) *part {
	m.gen++
	m.nodeMark[start] = m.gen
	return m.flood([]int{start}, isHeld, nil, false)
}

// flood grows a block from the nodes queued (already marked with m.gen):
// every node a stamp or a winding group joins to one in the block, ground
// and held nodes left out, the primitives in removed neither followed nor
// listed. component and blockWithout share it; readPiece floods oneWay,
// a VCCS followed from its output nodes only (a control node's column
// brings no row).
func (m *model) flood(queue []int, isHeld []bool, removed map[int32]bool, oneWay bool) *part {
	g := m.gen
	sub := &part{}
	visit := func(n int) {
		if n > 0 && !isHeld[n] && m.nodeMark[n] != g {
			m.nodeMark[n] = g
			queue = append(queue, n)
		}
	}
	for h := 0; h < len(queue); h++ {
		v := queue[h]
		sub.nodes = append(sub.nodes, v)
		for _, i := range m.nodePrims[v] {
			if m.primMark[i] == g || removed[i] {
				continue
			}
			if p := &m.nl.prims[i]; oneWay && p.kind == primVCCS && v != p.a && v != p.b {
				continue // a control node's column only: no row of v
			}
			m.primMark[i] = g
			sub.prims = append(sub.prims, int(i))
			p := &m.nl.prims[i]
			visit(p.a)
			visit(p.b)
			if p.kind == primVCCS {
				visit(p.c)
				visit(p.d)
			}
		}
		for _, i := range m.nodeGroups[v] {
			if m.grMark[i] == g {
				continue
			}
			m.grMark[i] = g
			sub.groups = append(sub.groups, int(i))
			for _, w := range m.nl.groups[i].winds {
				visit(w.a)
				visit(w.b)
			}
		}
	}
	slices.Sort(sub.nodes)
	slices.Sort(sub.prims)
	slices.Sort(sub.groups)
	return sub
}

// source is what every probe from one node of a model shares: the other
// declared inputs, held at 0 V while the node is driven or measured, and
// the block of the matrix the node lies in. A whole set compares every
// input with every output, so the probes from one input are as many as
// there are outputs (and three settings of each): their held set and block
// search, each the size of the circuit or of the block, are made once.
type source struct {
	held   []int
	isHeld []bool
	sub    *part
	// float holds floating's verdict with the node driven ([0]) and with
	// nothing driven ([1]), once asked.
	float     [2]error
	floatDone [2]bool
	// pieceHeld is isHeld with the source's own node held too (heldDriven).
	pieceHeld []bool
}

// heldDriven is isHeld with the driven node marked as well: a read piece
// (readPiece) stops at the driven node, whose voltage is given, rather than
// flooding on through the parts behind it, which the voltages read from
// it cannot depend on.
func (src *source) heldDriven(node int) []bool {
	if src.pieceHeld == nil {
		src.pieceHeld = slices.Clone(src.isHeld)
		src.pieceHeld[node] = true
	}
	return src.pieceHeld
}

// sourceAt returns the shared part of the probes from node (not ground).
func (m *model) sourceAt(node int) *source {
	if src := m.sources[node]; src != nil {
		return src
	}
	if m.sources == nil {
		m.sources = map[int]*source{}
	}
	var held []int
	for _, n := range m.inputs {
		if n != node {
			held = append(held, n)
		}
	}
	src := &source{held: held, isHeld: heldSet(len(m.nl.nodes), node, held)}
	m.sources[node] = src
	return src
}

// floating is model.floating for the source's node driven (driven true)
// or for nothing driven, worked out once each.
func (src *source) floating(m *model, node int, driven bool) error {
	k, d := 1, -1
	if driven {
		k, d = 0, node
	}
	if !src.floatDone[k] {
		src.float[k], src.floatDone[k] = m.floating(d, src.held, src.isHeld), true
	}
	return src.float[k]
}

// block is the block of the matrix the source's node lies in (component).
func (src *source) block(m *model, node int) *part {
	if src.sub == nil {
		src.sub = m.component(node, src.isHeld)
	}
	return src.sub
}
