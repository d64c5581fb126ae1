package layout

import (
	"math/bits"
	"slices"
)

// stateQueue is the search's open list, ordered by estimated total cost,
// then by state number: the second key makes the order of equal estimates,
// and so the wire found among equally cheap ones, depend on nothing but
// the grid. Costs are whole grid steps, so states are kept in one bucket per
// total cost and taken from the lowest bucket. A bucket is filled unsorted,
// sorted once when it is first taken from, and what arrives after that
// (the search going straight on towards its end keeps the same total) waits
// in a small heap beside the sorted run.
type stateQueue struct {
	b        []bucket
	cur, top int // lowest bucket that may hold states; highest used
	n        int
	marks    []uint64 // sortStates' bitmap, kept between sorts
}

type bucket struct {
	run    []int32 // run[head:] are waiting; sorted once taken from
	head   int
	sorted bool
	late   []int32 // a binary heap of what arrived after sorting
}

func (q *stateQueue) len() int { return q.n }

func (q *stateQueue) reset() {
	for k := 0; k <= q.top && k < len(q.b); k++ {
		b := &q.b[k]
		b.run, b.head, b.sorted, b.late = b.run[:0], 0, false, b.late[:0]
	}
	q.cur, q.top, q.n = 0, 0, 0
}

func (q *stateQueue) push(f, s int32) {
	k := int(f)
	for k >= len(q.b) {
		q.b = append(q.b, bucket{})
	}
	if q.n == 0 || k < q.cur {
		q.cur = k
	}
	q.top = max(q.top, k)
	q.n++
	b := &q.b[k]
	if !b.sorted {
		b.run = append(b.run, s)
		return
	}
	h := append(b.late, s)
	i := len(h) - 1
	for i > 0 {
		p := (i - 1) / 2
		if h[p] <= s {
			break
		}
		h[i] = h[p]
		i = p
	}
	h[i] = s
	b.late = h
}

func (q *stateQueue) pop() (f, s int32) {
	b := &q.b[q.cur]
	for b.head == len(b.run) && len(b.late) == 0 {
		q.cur++
		b = &q.b[q.cur]
	}
	q.n--
	if !b.sorted {
		q.sortStates(b.run[b.head:])
		b.sorted = true
	}
	if len(b.late) == 0 || (b.head < len(b.run) && b.run[b.head] < b.late[0]) {
		s = b.run[b.head]
		b.head++
		return int32(q.cur), s
	}
	return int32(q.cur), b.popLate()
}

// popLate takes the least state off the bucket's heap.
func (b *bucket) popLate() int32 {
	h := b.late
	top, last := h[0], h[len(h)-1]
	h = h[:len(h)-1]
	n, i := len(h), 0
	for {
		l := 2*i + 1
		if l >= n {
			break
		}
		m := l
		if r := l + 1; r < n && h[r] < h[l] {
			m = r
		}
		if last <= h[m] {
			break
		}
		h[i] = h[m]
		i = m
	}
	if n > 0 {
		h[i] = last
	}
	b.late = h
	return top
}

// sortStates sorts a bucket's states. Within one search they are distinct
// (a state is pushed again only at a lower cost, so into a lower bucket),
// and a bucket's states lie close together, as the search's front of equal
// estimates does: a bitmap over their range, read back in order, sorts
// them in time linear in their number and range. Few states are sorted by
// insertion, and states spread too thinly for a bitmap, or ones that
// repeat (never from the search), by comparison.
func (q *stateQueue) sortStates(r []int32) {
	if len(r) <= 16 {
		for i := 1; i < len(r); i++ {
			v, j := r[i], i
			for ; j > 0 && r[j-1] > v; j-- {
				r[j] = r[j-1]
			}
			r[j] = v
		}
		return
	}
	lo, hi := r[0], r[0]
	for _, v := range r {
		lo, hi = min(lo, v), max(hi, v)
	}
	words := int(hi-lo)/64 + 1
	if words > 8*len(r) {
		slices.Sort(r)
		return
	}
	if cap(q.marks) < words {
		q.marks = make([]uint64, words)
	}
	m := q.marks[:words]
	clear(m)
	for _, v := range r {
		d := uint32(v - lo)
		bit := uint64(1) << (d & 63)
		if m[d>>6]&bit != 0 {
			slices.Sort(r) // a repeat, which a bitmap would drop
			return
		}
		m[d>>6] |= bit
	}
	k := 0
	for i, w := range m {
		for ; w != 0; w &= w - 1 {
			r[k] = lo + int32(i*64+bits.TrailingZeros64(w))
			k++
		}
	}
}
