// The sweep of one pair of responses: a coarse grid, then rounds of points
// added around the peaks of each response and of the deviation.

package ac

import (
	"crypto/sha256"
	"encoding/binary"
	"math"
	"math/cmplx"
	"slices"

	"pare/graph/value"
)

// sweepPair runs the coarse sweep and the refinement for one quantity.
func sweepPair(po, pr *probe, bands []value.Range, o CompareOptions, marks []float64) (pairResult, error) {
	points, tolDB, tolDeg := o.Points, o.TolDB, o.TolDeg
	sw := &pairSweep{po: po, pr: pr, ho: po.memo, hr: pr.memo, floor: math.NaN()}
	if o.AboveRounding {
		sw.ddMin, sw.dpMin = roundingDB, roundingDeg
	}
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
	sw.merge(freqs)
	// Refine around the peaks of each response and of the deviation.
	const rounds = 5
	for round := 0; round < rounds; round++ {
		add := sw.refinePoints()
		if len(add) == 0 {
			break
		}
		if origFailed, err := sw.eval(add); err != nil {
			return pairResult{origFailed: origFailed}, err
		}
		sw.merge(add)
	}
	return sw.worst(tolDB, tolDeg), nil
}

// sweepSame is sweepPair for two probes of the same system (equal
// digests: a block the step left alone). Both solve the same equations at
// the same points in the same order, so every response is the same to the
// bit and every deviation exactly zero: the worst pair is 0 dB and 0° at
// the first point, wherever the refinement would have gone. Only whether
// the system can be solved is left to find out, on the coarse grid (with
// a memo, the responses the block's earlier proofs left there).
func sweepSame(p *probe, bands []value.Range, points int, marks []float64) (pairResult, error) {
	freqs := coarseGrid(bands, points, marks)
	h := p.memo
	if h == nil {
		h = map[float64]complex128{}
	}
	need := missing(freqs, h, nil)
	got := make([]complex128, len(need))
	n, err := p.atMany(need, got)
	for i, f := range need[:n] {
		h[f] = got[i]
		p.wrote(f)
	}
	if err != nil {
		return pairResult{origFailed: true}, err
	}
	var res pairResult
	if len(freqs) > 0 {
		res.AtHz = freqs[0]
	}
	return res, nil
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
//
// The maps hold the solved responses (a memo's, shared with other sweeps
// of the same system, or the sweep's own); the slices hold the points the
// sweep has taken in ascending frequency, with each response, its
// magnitude and the deviations, so a refinement round reads them in order
// and works out only what its new points add. The deviations depend on
// the floor (floorDB below the peak of both responses); they are kept for
// the floor they were taken at and worked out again when it moves.
type pairSweep struct {
	po, pr *probe
	ho, hr map[float64]complex128
	// ddMin and dpMin: deviation peaks at or below these are not refined
	// (CompareOptions.AboveRounding); zero refines every peak.
	ddMin, dpMin float64

	freqs  []float64
	vo, vr []complex128
	mo, mr []float64
	dd, dp []float64
	peak   float64
	floor  float64   // the floor dd and dp were taken at (NaN: none yet)
	fresh  []bool    // points whose dd and dp are not yet taken
	spare  []float64 // the merge's scratch space

	// eval's scratch space: the points without repeats, those each side
	// solves and their responses.
	seen map[float64]bool
	uniq []float64
	need [2][]float64
	got  [2][]complex128
}

// eval solves both circuits at the frequencies not yet visited (a memo may
// already hold one side, or both when the two systems are the same); on an
// error it says whether the original (rather than the reduced) failed.
//
// The result is that of a loop over the points in the order given, the
// original's response then the reduced one's, stopping at the first
// failure: each probe solves its points in that order (a system's pivots
// are chosen at the first frequency it is factored at), a run at a time
// (atMany), and the maps keep what that loop would have put in them.
func (sw *pairSweep) eval(fs []float64) (bool, error) {
	fs = sw.firstOfEach(fs)
	needO := missing(fs, sw.ho, sw.need[0][:0])
	vo := fitC(&sw.got[0], len(needO))
	nO, errO := sw.po.atMany(needO, vo)
	for i, f := range needO[:nO] {
		sw.ho[f] = vo[i]
	}
	stop := len(fs) // the loop reached the reduced side of these points
	if errO != nil {
		stop = slices.Index(fs, needO[nO])
	}
	needR := missing(fs[:stop], sw.hr, sw.need[1][:0]) // none when both maps are one
	vr := fitC(&sw.got[1], len(needR))
	nR, errR := sw.pr.atMany(needR, vr)
	for i, f := range needR[:nR] {
		sw.hr[f] = vr[i]
	}
	if errR != nil {
		// The loop stopped at this point's reduced side: the original's
		// later points were never solved.
		kept := countWithin(needO[:nO], fs[:slices.Index(fs, needR[nR])+1])
		for _, f := range needO[kept:nO] {
			delete(sw.ho, f)
		}
		nO = kept
	}
	for _, f := range needO[:nO] {
		sw.po.wrote(f)
	}
	for _, f := range needR[:nR] {
		sw.pr.wrote(f)
	}
	sw.need = [2][]float64{needO, needR}
	switch {
	case errR != nil:
		return false, errR
	case errO != nil:
		return true, errO
	}
	return false, nil
}

// firstOfEach is fs without repeats, each frequency where it first appears.
func (sw *pairSweep) firstOfEach(fs []float64) []float64 {
	if sw.seen == nil {
		sw.seen = map[float64]bool{}
	}
	clear(sw.seen)
	out := sw.uniq[:0]
	for _, f := range fs {
		if !sw.seen[f] {
			sw.seen[f] = true
			out = append(out, f)
		}
	}
	sw.uniq = out
	return out
}

// missing appends to out the frequencies of fs that h does not hold.
func missing(fs []float64, h map[float64]complex128, out []float64) []float64 {
	for _, f := range fs {
		if _, done := h[f]; !done {
			out = append(out, f)
		}
	}
	return out
}

// countWithin counts the leading frequencies of sub (taken from fs in
// order) that lie in the prefix fs.
func countWithin(sub, fs []float64) int {
	j := 0
	for _, f := range fs {
		if j < len(sub) && sub[j] == f {
			j++
		}
	}
	return j
}

// fitC returns *s with length n, reusing its space.
func fitC(s *[]complex128, n int) []complex128 {
	if cap(*s) < n {
		*s = make([]complex128, n)
	}
	*s = (*s)[:n]
	return *s
}

// merge adds the points of add (solved by eval; in any order, repeats
// and points already taken allowed) to the sweep's ascending list, in
// place from the back.
func (sw *pairSweep) merge(add []float64) {
	add = sortUnique(append(sw.spare[:0], add...))
	sw.spare = add
	fresh, i := add[:0], 0
	for _, f := range add {
		for i < len(sw.freqs) && sw.freqs[i] < f {
			i++
		}
		if i == len(sw.freqs) || sw.freqs[i] != f {
			fresh = append(fresh, f)
		}
	}
	n, k := len(sw.freqs), len(fresh)
	if k == 0 {
		return
	}
	sw.freqs, sw.vo, sw.vr = grow(sw.freqs, k), grow(sw.vo, k), grow(sw.vr, k)
	sw.mo, sw.mr, sw.dd, sw.dp, sw.fresh = grow(sw.mo, k), grow(sw.mr, k), grow(sw.dd, k), grow(sw.dp, k), grow(sw.fresh, k)
	i = n - 1
	for w, j := n+k-1, k-1; j >= 0; w-- {
		if i >= 0 && sw.freqs[i] > fresh[j] {
			sw.freqs[w], sw.vo[w], sw.vr[w] = sw.freqs[i], sw.vo[i], sw.vr[i]
			sw.mo[w], sw.mr[w], sw.dd[w], sw.dp[w], sw.fresh[w] = sw.mo[i], sw.mr[i], sw.dd[i], sw.dp[i], sw.fresh[i]
			i--
			continue
		}
		f := fresh[j]
		a, b := sw.ho[f], sw.hr[f]
		ma, mb := cmplx.Abs(a), cmplx.Abs(b)
		sw.peak = math.Max(sw.peak, math.Max(ma, mb))
		sw.freqs[w], sw.vo[w], sw.vr[w] = f, a, b
		sw.mo[w], sw.mr[w], sw.dd[w], sw.dp[w], sw.fresh[w] = ma, mb, 0, 0, true
		j--
	}
}

// grow lengthens s by k elements, keeping its contents.
func grow[T any](s []T, k int) []T { return slices.Grow(s, k)[:len(s)+k] }

// deviations brings dd and dp up to date with the current floor and
// returns it.
func (sw *pairSweep) deviations() float64 {
	floor := sw.peak * math.Pow(10, -floorDB/20)
	if floor == 0 {
		floor = math.SmallestNonzeroFloat64
	}
	all := floor != sw.floor
	for i := range sw.freqs {
		if all || sw.fresh[i] {
			sw.dd[i], sw.dp[i] = deviationOf(sw.vo[i], sw.vr[i], sw.mo[i], sw.mr[i], floor)
			sw.fresh[i] = false
		}
	}
	sw.floor = floor
	return floor
}

// refinePoints lists new frequencies on both sides of the highest peaks of
// each response and of the dB and phase deviations.
func (sw *pairSweep) refinePoints() []float64 {
	const maxPeaks, per = 10, 4
	var add []float64
	sw.deviations()
	freqs := sw.freqs
	series := [...]struct {
		m     []float64
		above float64
	}{{sw.mo, 0}, {sw.mr, 0}, {sw.dd, sw.ddMin}, {sw.dp, sw.dpMin}}
	for _, se := range series {
		for _, i := range peaks(se.m, maxPeaks, se.above) {
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

// worst is the largest deviation in dB and in degrees over the points.
func (sw *pairSweep) worst(tolDB, tolDeg float64) pairResult {
	sw.deviations()
	var res pairResult
	best := -1.0
	for i, f := range sw.freqs {
		d, p := sw.dd[i], sw.dp[i]
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

// sweepKey names one sweep: the systems of both responses (their digests,
// memo.go), the bands and the comparison's plan (comparer.plan).
type sweepKey struct {
	o, r  [sha256.Size]byte
	bands string
	plan  string
}

// sweep is sweepPair for one quantity at one setting, done once for each
// pair of systems and bands. A sweep is a function of the equations of its
// two systems: each probe's system is assembled from exactly what its
// digest covers and solved at the frequencies the sweep picks from its own
// results, in the same order, from the same first point (so with the same
// pivots), or read from a memo that the first such sweep filled with the
// very values it used. A quantity whose blocks hold no gang section is
// therefore the same sweep at every setting, and so are two channels built
// alike: the result is taken, not solved again. Failures are not kept (a
// failed sweep ends its quantity, and with a memo its half-filled entries
// would be read by a sweep that starts elsewhere). With a Memo, the sweeps
// of the comparisons before are taken too (Memo.sweeps): a step proof
// sweeps again what an earlier step of another channel built alike swept.
func (cp *comparer) sweep(po, pr *probe, bands []value.Range) (pairResult, error) {
	o := cp.o
	if po.zero || pr.zero {
		return sweepPair(po, pr, bands, o, cp.marks)
	}
	k := sweepKey{po.key(), pr.key(), bandsKey(bands), cp.plan}
	if res, done := o.Memo.sweep(k); done {
		return res, nil
	}
	res, done, landed := cp.claim(k)
	if done {
		return res, nil
	}
	var err error
	if k.o == k.r {
		res, err = sweepSame(po, bands, o.Points, cp.marks)
	} else {
		res, err = sweepPair(po, pr, bands, o, cp.marks)
	}
	cp.mu.Lock()
	if err == nil {
		cp.swept[k] = res
	}
	delete(cp.flying, k)
	cp.mu.Unlock()
	close(landed)
	return res, err
}

// claim returns the result of sweep k if it is done; if not, it waits
// while another quantity running beside this one makes it (quantities of
// different channels built alike sweep the same pair of systems), and
// otherwise claims it: the caller sweeps and closes landed. Without a memo
// a sweep is a function of its key alone, so the result waited for is the
// one this quantity would have made; with one, quantities that share a
// system run in one group, one after the other, and never wait here. A
// sweep that failed is not kept: each waiter then sweeps for itself, as
// the one-by-one loop would, and meets the failure on its own.
func (cp *comparer) claim(k sweepKey) (pairResult, bool, chan struct{}) {
	for {
		cp.mu.Lock()
		if res, done := cp.swept[k]; done {
			cp.mu.Unlock()
			return res, true, nil
		}
		ch, busy := cp.flying[k]
		if !busy {
			ch = make(chan struct{})
			cp.flying[k] = ch
			cp.mu.Unlock()
			return pairResult{}, false, ch
		}
		cp.mu.Unlock()
		<-ch
	}
}

// bandsKey is the bands to the bit, as a map key.
func bandsKey(bands []value.Range) string {
	b := make([]byte, 0, 16*len(bands))
	for _, r := range bands {
		b = binary.LittleEndian.AppendUint64(b, math.Float64bits(r.Min))
		b = binary.LittleEndian.AppendUint64(b, math.Float64bits(r.Max))
	}
	return string(b)
}

// planKey is everything of a comparison that a sweep depends on besides its
// systems and bands, to the bit, as a map key: the points per band, the
// tolerances, whether rounding is refined, and the landmark frequencies.
func planKey(o CompareOptions, marks []float64) string {
	b := make([]byte, 0, 32+8*len(marks))
	b = binary.LittleEndian.AppendUint64(b, uint64(o.Points))
	b = binary.LittleEndian.AppendUint64(b, math.Float64bits(o.TolDB))
	b = binary.LittleEndian.AppendUint64(b, math.Float64bits(o.TolDeg))
	if o.AboveRounding {
		b = append(b, 1)
	}
	for _, f := range marks {
		b = binary.LittleEndian.AppendUint64(b, math.Float64bits(f))
	}
	return string(b)
}
