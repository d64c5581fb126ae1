package ac

import (
	"crypto/sha256"
	"runtime"

	"pare/graph"
	"pare/internal/par"
)

// The quantities of one comparison, swept on every processor.
//
// Each quantity sweeps its own probes (its own systems and LU factors), so
// quantities are independent but for what they share: the circuits' models
// (elaborated once per setting, with scratch space the probe builder
// writes) and a Memo's remembered responses. The models and every probe
// are built first, in the order the sequential loop builds them; then the
// quantities run in groups, a group holding every quantity whose probes
// share a remembered system with another of it (they run in order, one
// after the other, as the loop would run them), the groups side by side.
// A probe's numbers depend on its system and the frequencies it solves in
// turn (the LU's pivot history), and both are what the sequential loop
// gives it, so the report is the same to the bit, however the groups are
// scheduled.
//
// The sequential loop stops at the first quantity that fails on the
// original circuit. Quantities after it that ran in another group are then
// undone in the memo (memoTxn): the memo holds exactly what the loop would
// have left, so later comparisons solve what they always did.

// quantityResult is one quantity's outcome.
type quantityResult struct {
	worst Pair
	out   outcome
	err   error
}

// builtProbe is a probe built ahead of the sweep, with its error.
type builtProbe struct {
	p   *probe
	err error
	key [sha256.Size]byte // digest, for probes a memo takes (memoTakes)
}

// memoTakes reports whether a Memo remembers this probe's responses.
func memoTakes(p *probe) bool { return !p.zero && !p.silent }

// runQuantities sweeps every quantity and returns their outcomes in order,
// up to and including the first that returned an error.
func (cp *comparer) runQuantities(qs []quantity) []quantityResult {
	workers := min(runtime.GOMAXPROCS(0), len(qs))
	res := make([]quantityResult, len(qs))
	if workers < 2 {
		for i, q := range qs {
			res[i].worst, res[i].out, res[i].err = cp.quantity(q, cp.probe)
			if res[i].err != nil {
				return res[:i+1]
			}
		}
		return res
	}
	built := cp.build(qs)
	groups := cp.groups(qs, built)
	txns := make([]*memoTxn, len(qs))
	// on the processors the process's jobs leave free (par: a batch's sets
	// each keep to one)
	par.Do(len(groups), func(g int) {
		for _, i := range groups[g] {
			txns[i] = &memoTxn{}
			get := func(ci, si int, _, _, _ string) (*probe, error) {
				b := built[i][si][ci]
				if b.err == nil && cp.o.Memo != nil && memoTakes(b.p) {
					cp.o.Memo.attachTxn(ci, b.p, b.key, txns[i])
				}
				return b.p, b.err
			}
			res[i].worst, res[i].out, res[i].err = cp.quantity(qs[i], get)
			if res[i].err != nil {
				break // the group's later quantities are undone below
			}
		}
	})
	last := len(qs) - 1
	for i := range res {
		if res[i].err != nil {
			last = i
			break
		}
	}
	if m := cp.o.Memo; m != nil {
		for i, t := range txns {
			if t != nil {
				m.finish(t, i <= last)
			}
		}
	}
	return res[:last+1]
}

// build makes the models and the probes of every quantity at every setting
// in both circuits, in the order the sequential loop asks for them.
func (cp *comparer) build(qs []quantity) [][][2]builtProbe {
	built := make([][][2]builtProbe, len(qs))
	for i, q := range qs {
		built[i] = make([][2]builtProbe, len(cp.settings))
		for si := range cp.settings {
			for ci, ft := range [2][2]string{{q.from, q.to}, {q.rFrom, q.rTo}} {
				b := &built[i][si][ci]
				b.p, b.err = cp.newProbe(ci, si, q.what, ft[0], ft[1])
				if b.err == nil && cp.o.Memo != nil && memoTakes(b.p) {
					b.key = b.p.key()
				}
			}
		}
	}
	return built
}

// groups puts quantities whose probes share a remembered system in one
// group, each group in quantity order, the groups in the order of their
// first quantity. Without a memo every quantity is a group of its own.
func (cp *comparer) groups(qs []quantity, built [][][2]builtProbe) [][]int {
	var sets graph.DisjointSets
	owner := map[[sha256.Size]byte]int{}
	for i := range qs {
		sets.Find(i)
		if cp.o.Memo == nil {
			continue
		}
		for _, per := range built[i] {
			for _, b := range per {
				if b.err != nil || !memoTakes(b.p) {
					continue
				}
				if j, ok := owner[b.key]; ok {
					sets.Union(j, i)
				} else {
					owner[b.key] = i
				}
			}
		}
	}
	index := map[int]int{}
	var out [][]int
	for i := range qs {
		root := sets.Find(i)
		g, ok := index[root]
		if !ok {
			g = len(out)
			index[root] = g
			out = append(out, nil)
		}
		out[g] = append(out[g], i)
	}
	return out
}
