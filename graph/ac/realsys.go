package ac

import (
	"errors"
	"fmt"
	"slices"
)

// Sparse is a square real system with a fixed pattern, solved by the same
// ordering (reverse Cuthill–McKee) and sparse LU the AC analysis uses. Where
// SolveReal solves one system once, Sparse keeps its pattern, ordering and
// pivot order, which Newton–Raphson needs: the DC operating point
// (graph/dc) reuses the one solver through it: the caller declares the pattern once, gets a slot per entry, and
// then refills values and solves as often as Newton–Raphson needs. After the
// first factorisation the pivot order is reused (a numeric refactorisation),
// which is what makes a warm-started fault simulation cheap.
type Sparse struct {
	n    int
	perm []int // unknown → ordered position
	a    csc
	f    *lu
	b, y []complex128
}

// NewSparse declares an n×n pattern. entries lists (row, col) positions, in
// any order and with repeats; the result gives, for each entry, the slot that
// Add writes to (repeats share a slot). Diagonal entries are always present.
func NewSparse(n int, entries [][2]int) (*Sparse, []int, error) {
	for _, e := range entries {
		if e[0] < 0 || e[0] >= n || e[1] < 0 || e[1] >= n {
			return nil, nil, fmt.Errorf("ac: sparse entry (%d,%d) outside %d×%d", e[0], e[1], n, n)
		}
	}
	ents := make([]Entry, len(entries))
	for i, e := range entries {
		ents[i] = Entry{Row: e[0], Col: e[1]}
	}
	// The same ordering as SolveReal and the AC matrix.
	s := &Sparse{n: n, perm: realOrder(n, ents)}
	// Pattern in ordered coordinates, diagonal included, sorted by column then row.
	type rc struct{ r, c int }
	pat := make([]rc, 0, len(entries)+n)
	for i := 0; i < n; i++ {
		pat = append(pat, rc{i, i})
	}
	for _, e := range entries {
		pat = append(pat, rc{s.perm[e[0]], s.perm[e[1]]})
	}
	slices.SortFunc(pat, func(x, y rc) int {
		if x.c != y.c {
			return x.c - y.c
		}
		return x.r - y.r
	})
	pat = slices.Compact(pat)
	s.a = csc{n: n, p: make([]int, n+1), i: make([]int, len(pat)), x: make([]complex128, len(pat))}
	for k, e := range pat {
		s.a.i[k] = e.r
		s.a.p[e.c+1]++
	}
	for j := 0; j < n; j++ {
		s.a.p[j+1] += s.a.p[j]
	}
	slots := make([]int, len(entries))
	for k, e := range entries {
		slots[k] = s.slot(s.perm[e[0]], s.perm[e[1]])
	}
	identity := make([]int, n)
	for i := range identity {
		identity[i] = i
	}
	s.f = newLU(n, identity)
	s.b = make([]complex128, n)
	s.y = make([]complex128, n)
	return s, slots, nil
}

// slot finds the storage index of ordered position (r, c), which exists.
func (s *Sparse) slot(r, c int) int {
	lo, hi := s.a.p[c], s.a.p[c+1]
	k, _ := slices.BinarySearch(s.a.i[lo:hi], r)
	return lo + k
}

// Slot is the slot of entry (i, j) when the pattern has it.
func (s *Sparse) Slot(i, j int) (int, bool) {
	if i < 0 || j < 0 || i >= s.n || j >= s.n {
		return 0, false
	}
	r, c := s.perm[i], s.perm[j]
	k := s.slot(r, c)
	if k < s.a.p[c+1] && s.a.i[k] == r {
		return k, true
	}
	return 0, false
}

// DiagSlot is the slot of diagonal entry (i, i).
func (s *Sparse) DiagSlot(i int) int { return s.slot(s.perm[i], s.perm[i]) }

// Zero clears every value, keeping the pattern.
func (s *Sparse) Zero() {
	for k := range s.a.x {
		s.a.x[k] = 0
	}
}

// Add adds v to the entry in slot k.
func (s *Sparse) Add(k int, v float64) { s.a.x[k] += complex(v, 0) }

// Solve factors the current values (reusing the last pivot order when it
// still serves) and writes the solution of A·x = rhs into x.
func (s *Sparse) Solve(rhs, x []float64) error {
	if s.n == 0 {
		return nil
	}
	if err := s.f.decompose(&s.a); err != nil {
		var sg *errSingular
		if errors.As(err, &sg) {
			return ErrSingular
		}
		return err
	}
	for i, v := range rhs {
		s.b[s.perm[i]] = complex(v, 0)
	}
	s.f.solve(s.b, s.y)
	for i := range x {
		x[i] = real(s.b[s.perm[i]])
	}
	return nil
}
