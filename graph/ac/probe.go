// Sweeping one pair of responses (original and reduced) over their bands,
// refining around peaks, and measuring the deviation between them.

package ac

import (
	"fmt"
	"math"
	"math/cmplx"
	"slices"
	"sort"

	"pare/graph/value"
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
}

// newProbe builds the system of one response of the model: the block of
// the matrix the source drives, with the circuit's other inputs held.
func newProbe(m *model, what, from, to string) (*probe, error) {
	c, nl := m.c, m.nl
	fromNode, err := nodeOf(c, nl, from)
	if err != nil {
		return nil, err
	}
	if what == "impedance" {
		if fromNode == 0 {
			return &probe{zero: true}, nil
		}
		held := otherInputs(c, nl, fromNode)
		isHeld := heldSet(len(nl.nodes), -1, held)
		if err := m.floating(-1, held, isHeld); err != nil {
			return nil, err
		}
		if !m.used[fromNode] {
			return nil, fmt.Errorf("net %s is not connected to any part the small-signal model sees", from)
		}
		return &probe{block: block{nl: nl, driven: -1, isHeld: isHeld, sub: m.component(fromNode, isHeld)},
			node: fromNode, impedance: true}, nil
	}
	if fromNode == 0 {
		return nil, fmt.Errorf("input %s is at AC ground: it cannot be driven", from)
	}
	toNode, err := nodeOf(c, nl, to)
	if err != nil {
		return nil, err
	}
	held := otherInputs(c, nl, fromNode)
	isHeld := heldSet(len(nl.nodes), fromNode, held)
	if err := m.floating(fromNode, held, isHeld); err != nil {
		return nil, err
	}
	if toNode != 0 && toNode != fromNode && (!m.used[toNode] || isHeld[toNode]) {
		return nil, fmt.Errorf("output %s is not connected to any part the small-signal model sees", to)
	}
	sub := m.component(fromNode, isHeld)
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

// sweepPair runs the coarse sweep and the refinement for one quantity.
func sweepPair(po, pr *probe, bands []value.Range, points int, tolDB, tolDeg float64, marks []float64) (pairResult, error) {
	sw := &pairSweep{po: po, pr: pr, ho: po.memo, hr: pr.memo}
	if sw.ho == nil {
		sw.ho = map[float64]complex128{}
	}
	if sw.hr == nil {
		sw.hr = map[float64]complex128{}
	}
	freqs := coarseGrid(bands, points, marks)
	if origFailed, err := sw.eval(freqs); err != nil {
		return pairResult{origFailed: origFailed}, err
	}
	// Refine around the peaks of each response and of the deviation.
	const rounds = 5
	for round := 0; round < rounds; round++ {
		add := sw.refinePoints(freqs)
		if len(add) == 0 {
			break
		}
		if origFailed, err := sw.eval(add); err != nil {
			return pairResult{origFailed: origFailed}, err
		}
		freqs = sortUnique(append(freqs, add...))
	}
	return sw.worst(freqs, tolDB, tolDeg), nil
}

// coarseGrid is the first sweep: Points log-spaced frequencies per band.
func coarseGrid(bands []value.Range, points int, marks []float64) []float64 {
	var freqs []float64
	for _, b := range bands {
		freqs = append(freqs, logSweep(b.Min, b.Max, points)...)
		// Resonances too narrow for any grid (a crystal's) are visited
		// directly, with a point either side for the refinement to work on.
		for _, f := range marks {
			if f >= b.Min && f <= b.Max {
				freqs = append(freqs, f*(1-1e-6), f, f*(1+1e-6))
			}
		}
	}
	return sortUnique(freqs)
}

// pairSweep holds both circuits' responses at every frequency visited.
type pairSweep struct {
	po, pr *probe
	ho, hr map[float64]complex128
}

// eval solves both circuits at the frequencies not yet visited (a memo may
// already hold one side, or both when the two systems are the same); on an
// error it says whether the original (rather than the reduced) failed.
func (sw *pairSweep) eval(fs []float64) (bool, error) {
	for _, f := range fs {
		if _, done := sw.ho[f]; !done {
			a, err := sw.po.at(f)
			if err != nil {
				return true, err
			}
			sw.ho[f] = a
		}
		if _, done := sw.hr[f]; !done {
			b, err := sw.pr.at(f)
			if err != nil {
				return false, err
			}
			sw.hr[f] = b
		}
	}
	return false, nil
}

// magnitudes returns both responses' magnitudes over freqs.
func (sw *pairSweep) magnitudes(freqs []float64) (mo, mr []float64) {
	mo = make([]float64, len(freqs))
	mr = make([]float64, len(freqs))
	for i, f := range freqs {
		mo[i], mr[i] = cmplx.Abs(sw.ho[f]), cmplx.Abs(sw.hr[f])
	}
	return mo, mr
}

// refinePoints lists new frequencies on both sides of the highest peaks of
// each response and of the dB and phase deviations.
func (sw *pairSweep) refinePoints(freqs []float64) []float64 {
	const maxPeaks, per = 10, 4
	var add []float64
	mo, mr := sw.magnitudes(freqs)
	floor := floorOf(mo, mr)
	dd := make([]float64, len(freqs))
	dp := make([]float64, len(freqs))
	for i, f := range freqs {
		dd[i], dp[i] = deviationOf(sw.ho[f], sw.hr[f], mo[i], mr[i], floor)
	}
	for _, m := range [][]float64{mo, mr, dd, dp} {
		for _, i := range peaks(m, maxPeaks) {
			if i > 0 {
				add = append(add, logSweepInner(freqs[i-1], freqs[i], per)...)
			}
			if i < len(freqs)-1 {
				add = append(add, logSweepInner(freqs[i], freqs[i+1], per)...)
			}
		}
	}
	return add
}

// worst is the largest deviation in dB and in degrees over freqs.
func (sw *pairSweep) worst(freqs []float64, tolDB, tolDeg float64) pairResult {
	mo, mr := sw.magnitudes(freqs)
	floor := floorOf(mo, mr)
	var res pairResult
	best := -1.0
	for i, f := range freqs {
		d, p := deviationOf(sw.ho[f], sw.hr[f], mo[i], mr[i], floor)
		res.MaxDB = math.Max(res.MaxDB, d)
		res.MaxDeg = math.Max(res.MaxDeg, p)
		// The frequency reported is where the larger of the two deviations,
		// each against its tolerance, peaks.
		if s := math.Max(d/tolDB, p/tolDeg); s > best {
			best, res.AtHz = s, f
		}
	}
	return res
}

// floorOf is the level floorDB below the larger response's peak.
func floorOf(mo, mr []float64) float64 {
	peak := 0.0
	for i := range mo {
		peak = math.Max(peak, math.Max(mo[i], mr[i]))
	}
	f := peak * math.Pow(10, -floorDB/20)
	if f == 0 {
		f = math.SmallestNonzeroFloat64
	}
	return f
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

// peaks returns the indices of the largest local maxima of m (ends count),
// at most n of them, largest first, ties by index.
func peaks(m []float64, n int) []int {
	var idx []int
	for i := range m {
		left := i == 0 || m[i] >= m[i-1]
		right := i == len(m)-1 || m[i] >= m[i+1]
		if left && right && m[i] > 0 {
			idx = append(idx, i)
		}
	}
	sort.SliceStable(idx, func(a, b int) bool { return m[idx[a]] > m[idx[b]] })
	if len(idx) > n {
		idx = idx[:n]
	}
	return idx
}
