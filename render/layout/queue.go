package layout

// stateQueue is the search's open list, ordered by estimated total cost,
// then by state number: the second key makes the order of equal estimates,
// and so the wire found among equally cheap ones, depend on nothing but
// the grid. Costs are whole grid steps and the estimate never drops by
// more than a step costs, so states are kept in one bucket per total cost
// and taken from the lowest bucket; a bucket is a small binary heap of
// state numbers.
type stateQueue struct {
	b        [][]int32
	cur, top int // lowest bucket that may hold states; highest used
	n        int
}

func (q *stateQueue) len() int { return q.n }

func (q *stateQueue) reset() {
	for k := q.cur; k <= q.top && k < len(q.b); k++ {
		q.b[k] = q.b[k][:0]
	}
	q.cur, q.top, q.n = 0, 0, 0
}

func (q *stateQueue) push(f, s int32) {
	k := int(f)
	for k >= len(q.b) {
		q.b = append(q.b, nil)
	}
	if q.n == 0 || k < q.cur {
		q.cur = k
	}
	q.top = max(q.top, k)
	q.n++
	h := append(q.b[k], s)
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
	q.b[k] = h
}

func (q *stateQueue) pop() (f, s int32) {
	for len(q.b[q.cur]) == 0 {
		q.cur++
	}
	h := q.b[q.cur]
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
	q.b[q.cur] = h
	q.n--
	return int32(q.cur), top
}
