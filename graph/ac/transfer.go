package ac

// Transfers between named nets: the public entry points that elaborate a
// circuit, solve it at each frequency and read the ratio of two voltages.

import (
	"fmt"

	"pare/graph"
)

func hz(f float64) string { return fmt.Sprintf("%.6g Hz", f) }

// nodeOf finds the node of a named net, with a clear error when the net is
// not there or carries nothing the small-signal model sees.
func nodeOf(c *graph.Circuit, nl *netlist, net string) (int, error) {
	id, ok := nl.netNode[net]
	if !ok {
		if net == ncNet {
			return 0, fmt.Errorf("net %q marks an unconnected terminal, not a node", net)
		}
		return 0, fmt.Errorf("no net %q in %s", net, circuitName(c))
	}
	return id, nil
}

func circuitName(c *graph.Circuit) string {
	if c.File != "" {
		return c.File
	}
	if c.Title != "" {
		return fmt.Sprintf("%q", c.Title)
	}
	return "the circuit"
}

// Transfer returns V(out)/V(in) at each frequency, with in driven by an ideal
// 1 V source to ground, the circuit's other declared inputs held at 0 V by
// their own sources (superposition) and every port open.
func Transfer(c *graph.Circuit, in, out string, freqs []float64, o Options) ([]complex128, error) {
	res, err := transferMany(c, in, []string{out}, freqs, o)
	if err != nil {
		return nil, err
	}
	return res[0], nil
}

// transferMany solves once per frequency for several outputs.
func transferMany(c *graph.Circuit, in string, outs []string, freqs []float64, o Options) ([][]complex128, error) {
	return transferWatched(c, in, outs, freqs, o, nil)
}

// transferWatched is transferMany that, given lost (one slice of len(freqs)
// per output), also says at each point whether the solve resolves each
// output (resolution.go).
func transferWatched(c *graph.Circuit, in string, outs []string, freqs []float64, o Options, lost [][]Beyond) ([][]complex128, error) {
	nl, err := elaborate(c, o)
	if err != nil {
		return nil, err
	}
	inNode, err := nodeOf(c, nl, in)
	if err != nil {
		return nil, err
	}
	if inNode == 0 {
		return nil, fmt.Errorf("input %s is at AC ground (its role, or a part joining it to ground): it cannot be driven", in)
	}
	outNodes := make([]int, len(outs))
	for i, out := range outs {
		if outNodes[i], err = nodeOf(c, nl, out); err != nil {
			return nil, err
		}
	}
	s, err := newSystem(nl, inNode, otherInputs(c, nl, inNode)...)
	if err != nil {
		return nil, err
	}
	for i, n := range outNodes {
		if n != 0 && n != inNode && s.unk[n] < 0 {
			return nil, fmt.Errorf("output %s is not connected to any part the small-signal model sees", outs[i])
		}
	}
	res := make([][]complex128, len(outs))
	for i := range res {
		res[i] = make([]complex128, len(freqs))
	}
	if lost != nil {
		s.watch = &watch{}
	}
	err = sweepPoints(s, freqs, s.lowestStep(outNodes), nil, func(k int, s *system) {
		for i, n := range outNodes {
			res[i][k] = s.voltage(n)
			if lost != nil {
				lost[i][k] = s.beyond(n)
			}
		}
	})
	if err != nil {
		return nil, err
	}
	return res, nil
}

// otherInputs lists the nodes of the circuit's declared inputs other than
// skip: while an impedance is measured they are held at 0 V, as the ideal
// sources that drive them would hold them.
func otherInputs(c *graph.Circuit, nl *netlist, skip int) []int {
	var out []int
	for _, in := range c.Inputs {
		if n, ok := nl.netNode[in]; ok && n != skip {
			out = append(out, n)
		}
	}
	return out
}

// Impedance returns the driving-point impedance between net and ground: the
// voltage a 1 A source into net produces, with the circuit's other declared
// inputs held at 0 V by their ideal sources and nothing else driven.
func Impedance(c *graph.Circuit, net string, freqs []float64, o Options) ([]complex128, error) {
	return impedance(c, net, freqs, o, nil)
}

// impedance is Impedance that, given lost (of len(freqs)), also says at
// each point whether the solve resolves it (resolution.go).
func impedance(c *graph.Circuit, net string, freqs []float64, o Options, lost []Beyond) ([]complex128, error) {
	nl, err := elaborate(c, o)
	if err != nil {
		return nil, err
	}
	n, err := nodeOf(c, nl, net)
	if err != nil {
		return nil, err
	}
	out := make([]complex128, len(freqs))
	if n == 0 {
		return out, nil // a net at AC ground: zero impedance
	}
	s, err := impedanceSystem(c, nl, n, lost == nil)
	if err != nil {
		return nil, err
	}
	if s == nil || s.unk[n] < 0 {
		return nil, fmt.Errorf("net %s is not connected to any part the small-signal model sees: its impedance is unbounded", net)
	}
	// The net is driven with 1 A: the right-hand side is that alone.
	drive := func(s *system) {
		clear(s.b)
		s.b[s.unk[n]] = 1
	}
	if lost != nil {
		s.watch = &watch{}
	}
	err = sweepPoints(s, freqs, s.lowestStep([]int{n}), drive, func(k int, s *system) {
		out[k] = s.voltage(n)
		if lost != nil {
			lost[k] = s.beyond(n)
		}
	})
	if err != nil {
		return nil, err
	}
	return out, nil
}

// impedanceSystem is the system a driving-point impedance at node n is
// solved on: with block, only the block of the matrix n lies in (model.go),
// as Responses solves a response: a set's other channels, joined to this
// one only through AC ground, carry no current from n, and the block's
// numbers are those it has inside the whole matrix, to the last bit
// (assemble; TestBlockProbeMatchesWhole), so a tank's peak in a bank of 22
// sets costs one set's solve, not the bank's (cmd/internal/align's reach
// search solves the whole dial per tank). Without block, the whole matrix:
// a resolution check (ImpedanceChecked) reads the work vector of the whole
// solve. The floating check is the whole circuit's either way, with the
// same nets in the same words. nil (and no error) where n is no unknown.
func impedanceSystem(c *graph.Circuit, nl *netlist, n int, block bool) (*system, error) {
	held := otherInputs(c, nl, n)
	if !block {
		return newSystem(nl, -1, held...)
	}
	m := indexModel(c, nl)
	isHeld := heldSet(len(nl.nodes), -1, held)
	if err := m.floating(-1, held, isHeld); err != nil {
		return nil, err
	}
	if !m.used[n] || isHeld[n] {
		return nil, nil // no unknown at n: the caller says it is not connected
	}
	return assemble(nl, -1, isHeld, m.component(n, isHeld)), nil
}
