// Responses remembered from one comparison to the next, keyed by the exact
// system that produced them.

package ac

import (
	"crypto/sha256"
	"math"
	"sync"
)

// Memo keeps the responses a comparison solved so that the next comparison
// need not solve them again. A reduction proves each step against the
// circuit before it, and that circuit is the one the previous step was
// proven with as "after": the same responses, solved twice. A step that
// does not change the small-signal model at all (a heater pin dropped) gives
// the same systems before and after, and its responses are solved once.
//
// A response is remembered under a digest of everything its solution
// depends on: the size and pattern of the block's matrix, every stamp and
// coefficient to the bit, and where the response is read. Two probes with
// the same digest solve the same equations, so a remembered value is the
// value the probe would compute (to the rounding of the LU's pivot
// history, which depends on the first frequency a system is factored at:
// a relative 10⁻¹² or so, far below any tolerance).
//
// Settle says, after each comparison, which circuit lives on; the responses
// of the other are dropped, so the memo holds about one set of responses
// per group of parts and never grows with the number of steps.
type Memo struct {
	mu     sync.Mutex // series, when quantities run side by side
	series map[[sha256.Size]byte]map[float64]complex128
	// used lists the digests each circuit's probes used in the comparison
	// since the last Settle.
	used [2][][sha256.Size]byte
	// sweeps are the results of the sweeps of the comparisons so far, by
	// their two systems, bands and plan (comparer.sweep): a sweep is a
	// function of those. Settle leaves them: they are few (one per pair
	// of systems a step made), and the channels of a set built alike
	// sweep the same pairs step after step.
	sweeps map[sweepKey]pairResult
}

// NewMemo returns an empty memo for a run of comparisons.
func NewMemo() *Memo {
	return &Memo{series: map[[sha256.Size]byte]map[float64]complex128{}, sweeps: map[sweepKey]pairResult{}}
}

// sweep is the result of a sweep an earlier comparison made; false
// without a memo. The comparisons run one after the other, so sweeps does
// not change while one reads it.
func (m *Memo) sweep(k sweepKey) (pairResult, bool) {
	if m == nil {
		return pairResult{}, false
	}
	res, ok := m.sweeps[k]
	return res, ok
}

// keepSweeps keeps the sweeps of a comparison that ran every quantity (one
// that stopped at a failure keeps none: which of its quantities ran beside
// the failing one depends on the schedule, and the memo must hold only what
// the sequential loop would have made).
func (m *Memo) keepSweeps(swept map[sweepKey]pairResult) {
	if m == nil {
		return
	}
	for k, res := range swept {
		m.sweeps[k] = res
	}
}

// Settle ends one comparison: the responses of the original (keepOrig) and
// of the reduced circuit (keepReduced) are kept for the comparisons to
// come, the others dropped unless a kept circuit shares them. A step that
// was applied keeps the reduced circuit (the next step's "before"); one that
// was refused keeps the original; a run against a fixed original keeps the
// original every time.
func (m *Memo) Settle(keepOrig, keepReduced bool) {
	keep := map[[sha256.Size]byte]bool{}
	for ci, kept := range []bool{keepOrig, keepReduced} {
		if kept {
			for _, k := range m.used[ci] {
				keep[k] = true
			}
		}
	}
	for ci := range m.used {
		for _, k := range m.used[ci] {
			if !keep[k] {
				delete(m.series, k)
			}
		}
		m.used[ci] = m.used[ci][:0]
	}
}

// attach gives probe p of circuit ci the remembered responses of its
// system, creating an empty set the sweep fills.
func (m *Memo) attach(ci int, p *probe) {
	if p.zero || p.silent {
		return
	}
	k := p.key()
	h := m.series[k]
	if h == nil {
		h = map[float64]complex128{}
		m.series[k] = h
	}
	m.used[ci] = append(m.used[ci], k)
	p.memo = h
}

// memoTxn is what one quantity did to the memo while quantities ran side
// by side (comparepar.go): the systems it attached (and whether it made
// their entry) and the responses it added, so that finish can keep or undo
// them.
type memoTxn struct {
	attached []memoAttach
	writes   []memoWrite
}

type memoAttach struct {
	ci      int
	key     [sha256.Size]byte
	created bool
}

type memoWrite struct {
	h map[float64]complex128
	f float64
}

// attachTxn is attach for a quantity running beside others: the digest is
// the probe's, worked out ahead; the use is logged in t, not yet in used.
func (m *Memo) attachTxn(ci int, p *probe, key [sha256.Size]byte, t *memoTxn) {
	m.mu.Lock()
	h := m.series[key]
	created := h == nil
	if created {
		h = map[float64]complex128{}
		m.series[key] = h
	}
	m.mu.Unlock()
	t.attached = append(t.attached, memoAttach{ci, key, created})
	p.memo, p.txn = h, t
}

// finish keeps what t did (the uses go into used, as attach would have put
// them) or undoes it: its responses are taken out and the entries it made
// dropped. Only quantities the sequential loop would not have run are
// undone, and every later user of an entry one of them made is undone too
// (they run in one group, in order), so nothing kept depends on them.
func (m *Memo) finish(t *memoTxn, keep bool) {
	if keep {
		for _, a := range t.attached {
			m.used[a.ci] = append(m.used[a.ci], a.key)
		}
		return
	}
	for _, w := range t.writes {
		delete(w.h, w.f)
	}
	for _, a := range t.attached {
		if a.created {
			delete(m.series, a.key)
		}
	}
}

// digest hashes everything the probe's response depends on: the block's
// primitives and winding groups in their order, on its unknowns numbered
// as assemble numbers them (held nodes and ground alike, the driven node
// apart), and where the response is read. assemble is a function of exactly
// these, so equal digests mean equal systems, without assembling either.
func (p *probe) digest() [sha256.Size]byte {
	nl, sub := p.nl, p.sub
	unk := make(map[int]int64, len(sub.nodes))
	for _, i := range sub.nodes {
		if i > 0 && i != p.driven && !p.isHeld[i] {
			unk[i] = int64(len(unk))
		}
	}
	local := func(i int) uint64 {
		switch u, ok := unk[i]; {
		case ok:
			return uint64(u)
		case i == p.driven && i > 0:
			return math.MaxUint64 - 1
		}
		return math.MaxUint64 // ground or held
	}
	var d digest
	put := d.put
	f := math.Float64bits
	imp := uint64(0)
	if p.impedance {
		imp = 1
	}
	put(uint64(len(unk)), local(p.node), imp, uint64(len(sub.prims)), uint64(len(sub.groups)))
	for _, i := range sub.prims {
		q := &nl.prims[i]
		put(uint64(q.kind), local(q.a), local(q.b), f(q.v), f(q.r), f(q.l), f(q.C))
		if q.kind == primVCCS {
			put(local(q.c), local(q.d))
		}
	}
	for _, i := range sub.groups {
		g := &nl.groups[i]
		put(uint64(len(g.winds)), uint64(len(g.muts)))
		for _, w := range g.winds {
			put(local(w.a), local(w.b), f(w.r), f(w.l))
		}
		for _, m := range g.muts {
			put(uint64(m.i), uint64(m.j), f(m.k), f(m.m))
		}
	}
	return d.sum()
}
