package ac

import (
	"fmt"
	"slices"

	"pare/graph"
)

// Responses builds many single responses of one circuit, which must not
// change while it is in use. The circuit is elaborated once per gang
// setting for all of them, with one DC view (a set's diode detectors make
// each elaboration a DC solve without it), and each response is solved on
// the blocks of the matrix its source drives and its output is read in:
// nets at AC ground cut a set into blocks that no stamp joins (model.go),
// and a block the source does not reach carries no current, so its
// voltages are zero whether it is solved or not. A block's numbers are
// those it has inside the whole matrix, to the last bit (assemble), so a
// response costs the size of its block, not of the circuit, and reads the
// same digits. A transimpedance or an impedance across two nets is solved
// on less: the part of its block the voltages read depend on (readPiece),
// exact to rounding; and carried from setting to setting without being
// assembled again (retune.go), to the bit.
type Responses struct {
	c      *graph.Circuit
	dc     dcShare
	models map[[2]float64]respModel
	// base is the first setting elaborated; the others are made from it
	// (atSetting).
	base *model
	// shapes holds each transimpedance and impedance across asked for, as
	// assembled at the first setting of the base's shape (retune.go).
	shapes map[shapeKey]*shape
}

type respModel struct {
	m   *model
	err error
}

// NewResponses prepares the responses of circuit c.
func NewResponses(c *graph.Circuit) *Responses {
	return &Responses{c: c, models: map[[2]float64]respModel{}}
}

// model is c elaborated and indexed at setting o; settings with
// terminations are elaborated afresh.
func (rs *Responses) model(o Options) (*model, error) {
	if o.Terminate != nil {
		return newModel(rs.c, o, &rs.dc)
	}
	set := 0.0
	if o.VarSet {
		set = 1
	}
	k := [2]float64{set, o.VarFrac}
	e, ok := rs.models[k]
	if !ok {
		if rs.base != nil {
			e.m = rs.base.atSetting(o)
		}
		if e.m == nil {
			e.m, e.err = newModel(rs.c, o, &rs.dc)
		}
		if rs.base == nil && e.err == nil && capsStamped(rs.c, o) {
			rs.base = e.m
		}
		rs.models[k] = e
	}
	return e.m, e.err
}

// atSetting is the model m of the same circuit at gang setting o, made
// from m's netlist with each capacitor's value taken at o: the setting
// moves nothing else an elaboration stamps (windings, devices, detector
// loads and joined nets do not depend on it), and a capacitor's value is
// p.Capacitance, as the stamper takes it, so the netlist is the one an
// elaboration at o gives, value for value. nil where a capacitor is
// stamped at one setting and not at the other (a span from zero), which
// changes the netlist's shape: that setting is elaborated afresh.
func (m *model) atSetting(o Options) *model {
	frac := 0.5
	if o.VarSet {
		frac = o.VarFrac
	}
	if !capsStamped(m.c, o) {
		return nil
	}
	caps := map[string]*graph.Part{}
	for _, p := range m.c.Parts {
		if p.Kind == graph.Capacitor {
			caps[p.Ref] = p
		}
	}
	nl := *m.nl
	nl.prims = slices.Clone(m.nl.prims)
	for i := range nl.prims {
		q := &nl.prims[i]
		if p := caps[q.ref]; p != nil && q.kind == primC {
			q.v = p.Capacitance(frac)
		}
	}
	out := *m
	out.nl, out.from = &nl, m
	n := len(nl.nodes)
	out.gen, out.nodeMark, out.primMark, out.grMark = 0, make([]int, n), make([]int, len(nl.prims)), make([]int, len(nl.groups))
	return &out
}

// nodes elaborates at o and finds the solver nodes of nets a and b.
func (rs *Responses) nodes(o Options, a, b string) (*model, int, int, error) {
	m, err := rs.model(o)
	if err != nil {
		return nil, 0, 0, err
	}
	n, k, err := twoNodes(rs.c, m.nl, a, b)
	return m, n, k, err
}

// Transfer is NewTransfer of the circuit.
func (rs *Responses) Transfer(in, out string, o Options) (*Response, error) {
	m, n, k, err := rs.nodes(o, in, out)
	if err != nil {
		return nil, err
	}
	if n == 0 {
		return nil, fmt.Errorf("input %s is at AC ground: it cannot be driven", in)
	}
	held := otherInputs(rs.c, m.nl, n)
	isHeld := heldSet(len(m.nl.nodes), n, held)
	if err := m.floating(n, held, isHeld); err != nil {
		return nil, err
	}
	if k != 0 && k != n && (!m.used[k] || isHeld[k]) {
		return nil, fmt.Errorf("output %s is not connected to any part the small-signal model sees", out)
	}
	sub := m.component(n, isHeld)
	if _, reached := slices.BinarySearch(sub.nodes, k); k != 0 && k != n && !reached {
		return &Response{zero: true}, nil // no stamp joins out to in: 0 by structure
	}
	if k != 0 && k != n {
		sub = m.outPiece(n, k, isHeld)
	}
	s := assemble(m.nl, n, isHeld, sub)
	return &Response{s: s, in: n, out: k, zero: k == 0}, nil
}

// outPiece is the piece of the block driven from n that holds out (k): the
// block without n, whose voltage the source fixes, falls apart into pieces
// no stamp joins but through n, and the others cannot move V(k). A supply
// rail driven to read one decoupler's response otherwise brings in every
// stage it feeds (all 22 channels of the 1,010-part bank). The piece holds
// every primitive and winding group at its nodes, those that join it to n
// included, and assemble orders each connected piece of the pattern on
// its own, so its system is the block it is inside the whole, to the bit.
func (m *model) outPiece(n, k int, isHeld []bool) *part {
	n0 := isHeld[n]
	isHeld[n] = true // not followed: the source's node
	sub := m.component(k, isHeld)
	isHeld[n] = n0
	return sub
}

// Transimpedance is NewTransimpedance of the circuit.
func (rs *Responses) Transimpedance(in, out string, o Options) (*Response, error) {
	m, n, k, err := rs.nodes(o, in, out)
	if err != nil {
		return nil, err
	}
	if n == 0 || k == 0 {
		return &Response{zero: true}, nil // into AC ground, or read there
	}
	key := shapeKey{shapeTransimpedance, n, k}
	if r, ok := rs.reshaped(key, m); ok {
		return r, nil
	}
	held := otherInputs(rs.c, m.nl, n)
	isHeld := heldSet(len(m.nl.nodes), -1, held)
	if err := m.floating(-1, held, isHeld); err != nil {
		return nil, err
	}
	if !m.used[n] || isHeld[n] || !m.used[k] || isHeld[k] {
		return nil, fmt.Errorf("net %s or %s is not connected to any part the small-signal model sees", in, out)
	}
	sub := m.readPiece([]int{k}, isHeld)
	if _, reached := slices.BinarySearch(sub.nodes, n); !reached {
		return rs.keep(key, m, &Response{zero: true}, sub), nil // no row V(out) depends on holds in: 0 by structure
	}
	s := assemble(m.nl, -1, isHeld, sub)
	return rs.keep(key, m, &Response{s: s, in: n, out: k, current: true}, sub), nil
}

// Across is NewAcross of the circuit.
func (rs *Responses) Across(a, b string, o Options) (*Response, error) {
	m, n, k, err := rs.nodes(o, a, b)
	if err != nil {
		return nil, err
	}
	if n == 0 {
		n, k = k, n
	}
	if n == 0 || n == k {
		return &Response{zero: true}, nil
	}
	key := shapeKey{shapeAcross, n, k}
	if r, ok := rs.reshaped(key, m); ok {
		return r, nil
	}
	held := otherInputs(rs.c, m.nl, -1)
	isHeld := heldSet(len(m.nl.nodes), -1, held)
	if err := m.floating(-1, held, isHeld); err != nil {
		return nil, err
	}
	if !m.used[n] || isHeld[n] || k != 0 && (!m.used[k] || isHeld[k]) {
		return nil, fmt.Errorf("net %s or %s is not connected to any part the small-signal model sees", a, b)
	}
	// both ends are driven and read; where the current leaves through
	// another block, the piece holds both
	sub := m.readPiece([]int{n, k}, isHeld)
	s := assemble(m.nl, -1, isHeld, sub)
	return rs.keep(key, m, &Response{s: s, in: n, out: n, back: k, current: true}, sub), nil
}

// capsStamped tells whether every capacitor of c has a value above zero at
// setting o (an elaboration stamps it there), and o is a setting.
func capsStamped(c *graph.Circuit, o Options) bool {
	frac := 0.5
	if o.VarSet {
		frac = o.VarFrac
	}
	if !(frac >= 0 && frac <= 1) {
		return false // elaborate's own message
	}
	for _, p := range c.Parts {
		if p.Kind == graph.Capacitor && !(p.Capacitance(frac) > 0) {
			return false
		}
	}
	return true
}
