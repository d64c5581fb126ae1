package layout

import (
	"hash/maphash"
	"slices"
	"sync"
)

// Searches remembered across layouts.
//
// A search's result (the path found, or none, and the number of states it
// took off its queue) is a function of what it reads: its window's size,
// where the pin and the tree's box stand in it, whether crossings cost
// their wide price, whether in-line ends cost unline's strict price,
// whether crossings beside junctions and leads cost undot's shy price, and
// the grid within three steps of the window (the in-line test looks three
// steps on, the crowding, pin tip and junction tests one step aside), five
// for a strict search (its in-line test looks unlineReach steps on). Of
// a grid point it reads only whether each net there, and the net reserved
// there, is its own, another lead of a valve its net leads from (siblings.go),
// another or none, the arms, and the flags other than
// the faded ones (beside a pin tip is read from the tips themselves). The same search comes up again and again: a pair of
// crossing nets rerouted in round after round of uncross, every trial
// layout of the untangle search (one part turned, the rest of the sheet the
// same), and every row of a page laid out once more with a stretch more or
// less. So a search is keyed by a digest of exactly that, taken in the
// window's own coordinates, and a later search with the same digest is
// handed the same path and counts the same states as work (the budgets,
// counted in states, stop at the same place): the drawing cannot change.
//
// About a third of the main job's search work on a 1,010-part bank was
// such repeats (docs/performance.md, "Searches remembered").

// searchMemoMax bounds the searches kept; past it the memo starts empty
// again, which costs time, never a different drawing.
const searchMemoMax = 1 << 16

// memoMargin is how far beyond its window a search reads the grid; a
// strict search (unline.go) looks further, unlineReach.
const memoMargin = inLineReach

// margin is how far beyond its window the router's next search reads.
func (rt *router) margin() int {
	if rt.strict {
		return max(memoMargin, unlineReach)
	}
	return memoMargin
}

// memoKey is a search's digest.
type memoKey [2]uint64

type memoEntry struct {
	path []int32 // window-relative point numbers, pin first; nil: no path
	pops int
}

var searchMemo = struct {
	sync.Mutex
	m map[memoKey]memoEntry
}{m: map[memoKey]memoEntry{}}

// memoOff turns the memo off (the test that proves it changes nothing).
var memoOff bool

// searchKey is the digest of everything the search (k, from pin p) reads.
func (rt *router) searchKey(k *seek, p wirePin) memoKey {
	win := k.win
	b := rt.sc.key[:0]
	wide := byte(0)
	if rt.wide {
		wide = 1
	}
	if rt.strict {
		wide |= 2 // in-line ends priced as unline prices them
	}
	if rt.shy {
		wide |= 4 // crossings beside junctions and leads priced as undot prices them
	}
	if rt.along {
		wide |= 8 // runs beside the net's own parts priced as unalong prices them
	}
	px, py := p.cell%rt.w-win.x0, p.cell/rt.w-win.y0
	for _, v := range [...]int{px, py, int(p.pin.Dir), k.to.x0 - win.x0, k.to.y0 - win.y0,
		k.to.x1 - win.x0, k.to.y1 - win.y0, win.x1 - win.x0, win.y1 - win.y0} {
		b = append(b, byte(v), byte(v>>8), byte(v>>16), byte(v>>24))
	}
	b = append(b, wide)
	b = rt.gridKey(k, b)
	b = rt.alongKey(k, b)
	rt.sc.key = b
	return digest(b)
}

// gridKey appends to b the code of every grid point the search k reads
// (its window and rt.margin() round it), row by row. It is most of a
// layout's routing time on a whole set, so the buffer is grown once and
// each row's points off the grid are written apart from those on it,
// leaving the loop over a row's grid points without a bounds test.
func (rt *router) gridKey(k *seek, b []byte) []byte {
	m := rt.margin()
	xs, xe := k.win.x0-m, k.win.x1+m
	cols := xe - xs + 1
	n := len(b)
	b = slices.Grow(b, 3*cols*(k.win.y1-k.win.y0+1+2*m))
	b = b[:cap(b)]
	off := func(from, to int) { // points from..to off the grid
		for x := from; x <= to; x++ {
			b[n] = offGrid
			n++
		}
	}
	lo, hi := max(xs, 0), min(xe, rt.w-1)
	for y := k.win.y0 - m; y <= k.win.y1+m; y++ {
		if y < 0 || y >= rt.h || lo > hi {
			off(xs, xe)
			continue
		}
		off(xs, min(xe, -1))
		row := rt.g[y*rt.w+lo : y*rt.w+hi+1]
		for i := range row {
			g := &row[i]
			fl := byte(g.flags&0x3f) | byte(g.flags&fStub>>2) // the faded flags left out
			foreign := k.foreign(g)
			if foreign {
				fl |= 0x80 // only in the long form, whose third byte it is
			}
			if g.own[0]|g.own[1]|g.resv == 0 && g.arm[0]|g.arm[1] == 0 && !foreign {
				b[n] = fl // no wire, nothing reserved: most of the grid
				n++
				continue
			}
			b[n] = withNets | k.whose(g.own[0]) | k.whose(g.own[1])<<2 | k.whose(g.resv)<<4
			b[n+1], b[n+2] = g.arm[0]|g.arm[1]<<4, fl
			n += 3
		}
		off(max(xs, rt.w), xe)
	}
	return b[:n]
}

// The key's point codes: a point without wire or reservation is its flags
// alone (below 0x80: the faded flags are left out, a stub's is 0x40); one with them is
// withNets and whose nets are there, then its arms and its flags; a point
// off the grid is offGrid.
const (
	withNets = 0x80
	offGrid  = 0xc0
)

// memoSeeds seed the key's two 64-bit hashes (a digest of 128 bits: two
// different searches meeting on one key is as likely as guessing it). The
// seeds are the process's own, as the memo is.
var memoSeeds = [2]maphash.Seed{maphash.MakeSeed(), maphash.MakeSeed()}

func digest(b []byte) memoKey {
	return memoKey{maphash.Bytes(memoSeeds[0], b), maphash.Bytes(memoSeeds[1], b)}
}

// whose classes a net number as the search sees it: none, its own,
// another, or another lead of a valve its net leads from (a crossing
// priced higher, siblings.go).
func (k *seek) whose(v int32) byte {
	switch {
	case v == 0:
		return 0
	case v == k.net:
		return 1
	case k.sib != nil && k.sib[v]:
		return 3
	}
	return 2
}

// resetMemo empties the memo (benchmarks time a layout as a fresh process
// makes it).
func resetMemo() {
	searchMemo.Lock()
	searchMemo.m = map[memoKey]memoEntry{}
	searchMemo.Unlock()
}

func memoGet(key memoKey) (memoEntry, bool) {
	if memoOff {
		return memoEntry{}, false
	}
	searchMemo.Lock()
	e, ok := searchMemo.m[key]
	searchMemo.Unlock()
	return e, ok
}

func memoPut(key memoKey, e memoEntry) {
	if memoOff {
		return
	}
	searchMemo.Lock()
	if len(searchMemo.m) >= searchMemoMax {
		searchMemo.m = map[memoKey]memoEntry{}
	}
	searchMemo.m[key] = e
	searchMemo.Unlock()
}

// toWindow and fromWindow convert a path between grid cells and the
// window's point numbers.
func (rt *router) toWindow(path []int, win window) []int32 {
	if path == nil {
		return nil
	}
	ww := win.x1 - win.x0 + 1
	out := make([]int32, len(path))
	for i, c := range path {
		out[i] = int32((c/rt.w-win.y0)*ww + c%rt.w - win.x0)
	}
	return out
}

func (rt *router) fromWindow(path []int32, win window) []int {
	if path == nil {
		return nil
	}
	ww := win.x1 - win.x0 + 1
	out := make([]int, len(path))
	for i, lc := range path {
		ly := int(lc) / ww
		out[i] = (ly+win.y0)*rt.w + int(lc) - ly*ww + win.x0
	}
	return out
}
