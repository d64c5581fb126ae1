// Sweeping one pair of responses (original and reduced) over their bands,
// refining around peaks, and measuring the deviation between them.

package ac

import (
	"crypto/sha256"
	"fmt"
	"math"
	"math/cmplx"
	"slices"
	"sort"
)

// probe evaluates one response of one circuit at any frequency.
type probe struct {
	block
	s         *system // assembled from block on the first solve
	node      int
	impedance bool
	zero      bool // the net is AC ground: the response is 0
	// silent: no stamp joins the output to the driven input (other than
	// through AC ground or a held input), so the transfer is 0 by structure.
	silent bool
	// memo holds the responses of this very system solved before (Memo);
	// nil without a memo.
	memo map[float64]complex128
	// txn logs what this probe adds to memo when its quantity runs beside
	// others (comparepar.go); nil otherwise.
	txn *memoTxn
	sum *[sha256.Size]byte // digest, once worked out (key)
}

// release drops the probe's assembled system and LU factors and its
// block once its sweep is done: a comparison's probes are each swept once
// (built ahead for every quantity, comparepar.go), and kept assembled to
// the end of the comparison a whole set's final proof held some 250 MB of
// systems no one would solve again (docs/performance.md). The digest, if
// worked out, stays: it is all the memo and the sweeps read afterwards.
// A released probe must not be solved again: its pivots would be chosen
// afresh, which is not the sequence of numbers it gave.
func (p *probe) release() {
	p.s = nil
	if p.sum != nil || p.zero {
		p.sub, p.isHeld = nil, nil
	}
}

// key is the probe's digest (memo.go), worked out once.
func (p *probe) key() [sha256.Size]byte {
	if p.sum == nil {
		d := p.digest()
		p.sum = &d
	}
	return *p.sum
}

// wrote logs that the probe's response at f went into its memo.
func (p *probe) wrote(f float64) {
	if p.txn != nil && p.memo != nil {
		p.txn.writes = append(p.txn.writes, memoWrite{p.memo, f})
	}
}

// newProbe builds the system of one response of the model: the block of
// the matrix the source drives, with the circuit's other inputs held.
func newProbe(m *model, what, from, to string) (*probe, error) {
	return newProbeOpt(m, what, from, to, false)
}

// newProbeOpt is newProbe; with piece set, the system is only the part of
// the block the response read depends on (pieceOf).
func newProbeOpt(m *model, what, from, to string, piece bool) (*probe, error) {
	p, err := buildProbe(m, what, from, to)
	if err == nil && piece {
		pieceOf(m, p)
	}
	return p, err
}

// pieceOf narrows a probe's system to the part of its block the voltage
// it reads depends on (readPiece): the read node, closed under "a row of
// the piece has an entry in this column", the driven node and the held
// ones left out as no unknowns. The matrix is then block triangular and
// the piece alone gives the response read, exactly but for rounding (the
// smaller system is eliminated in another order). What a piece leaves out
// is what lies beyond a device's one-way stamp from the node read: the
// stages after an anode for a response read at the grid, and a stage's
// own anode circuit for a response read before it. A step proof keyed by
// the piece's digest (memo.go) therefore finds a response whose piece the
// step did not touch already solved, and its sweep already made.
func pieceOf(m *model, p *probe) {
	switch {
	case p.zero || p.silent || p.sub == nil:
		return
	case p.impedance:
		p.sub = m.readPiece([]int{p.node}, p.isHeld)
	case p.node > 0 && p.node != p.driven:
		src := m.sourceAt(p.driven)
		p.sub = m.readPiece([]int{p.node}, src.heldDriven(p.driven))
	}
}

// buildProbe is newProbe.
func buildProbe(m *model, what, from, to string) (*probe, error) {
	c, nl := m.c, m.nl
	fromNode, err := nodeOf(c, nl, from)
	if err != nil {
		return nil, err
	}
	if what == "impedance" {
		if fromNode == 0 {
			return &probe{zero: true}, nil
		}
		src := m.sourceAt(fromNode)
		if err := src.floating(m, fromNode, false); err != nil {
			return nil, err
		}
		if !m.used[fromNode] {
			return nil, fmt.Errorf("net %s is not connected to any part the small-signal model sees", from)
		}
		return &probe{block: block{nl: nl, driven: -1, isHeld: src.isHeld, sub: src.block(m, fromNode)},
			node: fromNode, impedance: true}, nil
	}
	if fromNode == 0 {
		return nil, fmt.Errorf("input %s is at AC ground: it cannot be driven", from)
	}
	toNode, err := nodeOf(c, nl, to)
	if err != nil {
		return nil, err
	}
	src := m.sourceAt(fromNode)
	if err := src.floating(m, fromNode, true); err != nil {
		return nil, err
	}
	isHeld := src.isHeld
	if toNode != 0 && toNode != fromNode && (!m.used[toNode] || isHeld[toNode]) {
		return nil, fmt.Errorf("output %s is not connected to any part the small-signal model sees", to)
	}
	sub := src.block(m, fromNode)
	// The output is an unknown of the block when the search reached it
	// (the driven node itself is reached but not an unknown).
	_, reached := slices.BinarySearch(sub.nodes, toNode)
	silent := toNode != 0 && toNode != fromNode && !reached
	return &probe{block: block{nl: nl, driven: fromNode, isHeld: isHeld, sub: sub}, node: toNode, silent: silent}, nil
}

// block is what a probe's system is assembled from, kept until the first
// solve: with a memo (memo.go) that already holds every point asked for,
// the system is never assembled.
type block struct {
	nl     *netlist
	driven int
	isHeld []bool
	sub    *part
}

func (p *probe) at(f float64) (complex128, error) {
	if p.zero {
		return 0, nil
	}
	if p.s == nil {
		p.s = assemble(p.nl, p.driven, p.isHeld, p.sub)
	}
	if err := p.s.solveAt(f); err != nil {
		return 0, err
	}
	if p.impedance {
		for i := range p.s.b {
			p.s.b[i] = 0
		}
		p.s.b[p.s.unk[p.node]] = 1
	}
	if err := p.s.solveRHS(f); err != nil {
		return 0, err
	}
	return p.s.voltage(p.node), nil
}

type pairResult struct {
	Pair
	origFailed bool
}

// deviationOf is the dB and degree difference between two responses a and
// b of magnitudes ma and mb (the sweep has them for its floor), with
// magnitudes measured against the floor so a null does not dominate.
func deviationOf(a, b complex128, ma, mb, floor float64) (dB, deg float64) {
	if ma == 0 && mb == 0 {
		return 0, 0
	}
	dB = math.Abs(20 * math.Log10(math.Max(mb, floor)/math.Max(ma, floor)))
	if ma > floor && mb > floor {
		deg = phaseDiff(a, b)
	}
	return dB, deg
}

// phaseDiff is |arg b − arg a| in degrees, wrapped into 0..180. (Taking the
// phase of b/a instead leaves rounding noise when a == b.)
func phaseDiff(a, b complex128) float64 {
	d := math.Abs(cmplx.Phase(b) - cmplx.Phase(a))
	if d > math.Pi {
		d = 2*math.Pi - d
	}
	return d * 180 / math.Pi
}

// peaks returns the indices of the largest local maxima of m (ends count)
// above the value above, at most n of them, largest first, ties by index.
func peaks(m []float64, n int, above float64) []int {
	var idx []int
	for i := range m {
		left := i == 0 || m[i] >= m[i-1]
		right := i == len(m)-1 || m[i] >= m[i+1]
		if left && right && m[i] > above {
			idx = append(idx, i)
		}
	}
	sort.SliceStable(idx, func(a, b int) bool { return m[idx[a]] > m[idx[b]] })
	if len(idx) > n {
		idx = idx[:n]
	}
	return idx
}
