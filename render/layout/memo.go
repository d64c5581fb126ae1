package layout

import (
	"crypto/sha256"
	"sync"
)

// Searches remembered across layouts.
//
// A search's result (the path found, or none, and the number of states it
// took off its queue) is a function of what it reads: its window's size,
// where the pin and the tree's box stand in it, whether crossings cost
// their wide price, and the grid within three steps of the window (the
// in-line test looks three steps on, the crowding test one step aside). Of
// a grid point it reads only whether each net there, and the net reserved
// there, is its own, another or none, the arms, and the flags other than
// the faded ones. The same search comes up again and again: a pair of
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

// memoMargin is how far beyond its window a search reads the grid.
const memoMargin = inLineReach

type memoEntry struct {
	path []int32 // window-relative point numbers, pin first; nil: no path
	pops int
}

var searchMemo = struct {
	sync.Mutex
	m map[[sha256.Size]byte]memoEntry
}{m: map[[sha256.Size]byte]memoEntry{}}

// memoOff turns the memo off (the test that proves it changes nothing).
var memoOff bool

// memoKey is the digest of everything the search (net, p, k) reads.
func (rt *router) memoKey(k *seek, p wirePin) [sha256.Size]byte {
	win := k.win
	b := rt.sc.key[:0]
	wide := byte(0)
	if rt.wide {
		wide = 1
	}
	px, py := p.cell%rt.w-win.x0, p.cell/rt.w-win.y0
	for _, v := range [...]int{px, py, int(p.pin.Dir), k.to.x0 - win.x0, k.to.y0 - win.y0,
		k.to.x1 - win.x0, k.to.y1 - win.y0, win.x1 - win.x0, win.y1 - win.y0} {
		b = append(b, byte(v), byte(v>>8), byte(v>>16), byte(v>>24))
	}
	b = append(b, wide)
	net := k.net
	for y := win.y0 - memoMargin; y <= win.y1+memoMargin; y++ {
		for x := win.x0 - memoMargin; x <= win.x1+memoMargin; x++ {
			if x < 0 || y < 0 || x >= rt.w || y >= rt.h {
				b = append(b, 0xff, 0, 0, 0) // off the grid
				continue
			}
			g := &rt.g[y*rt.w+x]
			b = append(b, whose(g.own[0], net)|whose(g.own[1], net)<<2|whose(g.resv, net)<<4,
				g.arm[0], g.arm[1], g.flags&^(fFadedE|fFadedS))
		}
	}
	rt.sc.key = b
	return sha256.Sum256(b)
}

// whose classes a net number as the search sees it: none, its own, another.
func whose(v, net int32) byte {
	switch v {
	case 0:
		return 0
	case net:
		return 1
	}
	return 2
}

func memoGet(key [sha256.Size]byte) (memoEntry, bool) {
	if memoOff {
		return memoEntry{}, false
	}
	searchMemo.Lock()
	e, ok := searchMemo.m[key]
	searchMemo.Unlock()
	return e, ok
}

func memoPut(key [sha256.Size]byte, e memoEntry) {
	if memoOff {
		return
	}
	searchMemo.Lock()
	if len(searchMemo.m) >= searchMemoMax {
		searchMemo.m = map[[sha256.Size]byte]memoEntry{}
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
