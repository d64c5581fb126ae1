package ac

import (
	"crypto/sha256"
	"math"
	"sync"
)

// Loop searches remembered across the process.
//
// One loop search solves a device's block some 1,600 times (200 points a
// decade over eight decades, then the bisections), and the main job asks
// for the same search many times over: the stage finder on the set, the DC
// chart's oscillator test on the same set at three of the same gang
// settings, the other band's run on a circuit whose IF and audio channels
// are those of this band, the loop-capacitor test on copies that differ in
// one capacitor that most devices' blocks never reach. Each search builds
// its system afresh (Loops.system), so its result is a function of the
// assembled system alone; the cache keys it by a digest of exactly that
// (loopKey) and hands a later search with the same digest the same result,
// whichever circuit, run or goroutine asked first. A search that fails is
// not remembered (its message names the circuit's nets), so it is solved
// again by whoever asks.

// loopCacheMax bounds the entries kept: a batch over many sets would
// otherwise keep every set's loops. Past it the cache starts empty again,
// which costs time, never a different result.
const loopCacheMax = 4096

type loopEntry struct {
	done chan struct{}
	ok   bool
	loop Loop       // Ref and Frac are the asker's, set by Find
	pole complex128 // for the pole entries
}

var loopCache = struct {
	sync.Mutex
	m map[[sha256.Size]byte]*loopEntry
}{m: map[[sha256.Size]byte]*loopEntry{}}

// cachedLoop returns the entry for key, computing it with solve when no
// one has (or is): concurrent askers of the same key wait for the first.
// solve reports whether its result may be kept.
func cachedLoop(key [sha256.Size]byte, solve func(e *loopEntry) bool) *loopEntry {
	loopCache.Lock()
	e, found := loopCache.m[key]
	if !found {
		if len(loopCache.m) >= loopCacheMax {
			loopCache.m = map[[sha256.Size]byte]*loopEntry{}
		}
		e = &loopEntry{done: make(chan struct{})}
		loopCache.m[key] = e
	}
	loopCache.Unlock()
	if found {
		<-e.done
		if e.ok {
			return e
		}
		// The first asker failed and withdrew the entry: solve here,
		// where the error carries this circuit's names.
		return solveUncached(solve)
	}
	e.ok = solve(e)
	if !e.ok {
		loopCache.Lock()
		if loopCache.m[key] == e {
			delete(loopCache.m, key)
		}
		loopCache.Unlock()
	}
	close(e.done)
	return e
}

func solveUncached(solve func(e *loopEntry) bool) *loopEntry {
	e := &loopEntry{done: make(chan struct{})}
	e.ok = solve(e)
	close(e.done)
	return e
}

// loopKey digests everything a loop search on ls computes from: the
// assembled system (its size, pattern, stamps and coefficients to the bit),
// where the sources inject and the control is read, the sign, the crystals
// of the whole netlist that searchGrid makes dense patches for, and the
// search's own options, with what (0 a search, 1 a pole) and any extra
// numbers (a pole's frequency and scale) after them.
func (ls *loopSystem) key(o LoopOptions, what uint64, extra ...float64) [sha256.Size]byte {
	s := ls.s
	var d digest
	put := d.put
	f := math.Float64bits
	unk := func(node int) uint64 { return uint64(int64(s.unk[node])) }
	inv := uint64(0)
	if o.Inverted {
		inv = 1
	}
	put(what, f(o.From), f(o.To), uint64(int64(o.PerDecade)), inv, f(ls.sign))
	for _, x := range extra {
		put(f(x))
	}
	if o.AtControl {
		put(2, uint64(int64(ls.d))) // read at the control electrode alone
	}
	if le := ls.lift; le != nil {
		put(3, unk(le.a), unk(le.m), f(le.g), f(le.cap)) // broken at a lifted part
	}
	put(uint64(s.n), uint64(len(s.a.p)), uint64(len(s.a.i)), uint64(len(s.stamps)), uint64(len(s.coefs)), uint64(len(ls.srcs)))
	for _, v := range s.a.p {
		put(uint64(int64(v)))
	}
	for _, v := range s.a.i {
		put(uint64(int64(v)))
	}
	for _, st := range s.stamps {
		neg := uint64(0)
		if st.neg {
			neg = 1
		}
		put(uint64(int64(st.slot)), uint64(int64(st.rhs)), uint64(int64(st.val)), neg)
	}
	for _, k := range s.coefs {
		put(uint64(k.kind), f(k.a), f(k.b), f(k.c))
	}
	for _, q := range ls.srcs {
		put(f(q.gm), unk(q.a), unk(q.b))
	}
	put(unk(ls.c), unk(ls.d))
	for _, p := range s.nl.prims {
		if p.kind == primRLC {
			put(f(p.l), f(p.C))
		}
	}
	return d.sum()
}

// ForgetLoops drops every remembered loop search: for a long-lived caller
// that is done with its circuits, and for tests that must see searches
// solved, not remembered.
func ForgetLoops() {
	loopCache.Lock()
	loopCache.m = map[[sha256.Size]byte]*loopEntry{}
	loopCache.Unlock()
}
