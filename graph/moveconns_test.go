package graph

import (
	"fmt"
	"math/rand"
	"sort"
	"testing"
)

// moveConns merges a net's terminals into another's (by block moves, or
// at the end of a long list sorted when read); what Conns then gives must
// be the one sorted list a fresh index builds (connLess order), whatever
// the sizes and however the refs interleave.
func TestMoveConnsIsSortedMerge(t *testing.T) {
	rng := rand.New(rand.NewSource(1))
	for _, sizes := range [][2]int{{0, 3}, {5, 0}, {1, 1}, {40, 3}, {3, 40}, {200, 17}} {
		var parts []*Part
		ix := &Index{conns: map[string][]Conn{}, unsorted: map[string]bool{}}
		for i := 0; i < sizes[0]+sizes[1]; i++ {
			net := "a"
			if i >= sizes[0] {
				net = "b"
			}
			p := &Part{Ref: fmt.Sprintf("R%d", rng.Intn(60)), Pins: []Pin{{Name: fmt.Sprint(rng.Intn(3)), Net: net}}}
			parts = append(parts, p)
			ix.conns[net] = append(ix.conns[net], Conn{Part: p, Pin: p.Pins[0].Name})
		}
		for _, l := range ix.conns {
			sort.SliceStable(l, func(i, j int) bool { return connLess(l[i], l[j]) })
		}
		ix.moveConns("a", "b")
		got := ix.Conns("a")
		if len(got) != sizes[0]+sizes[1] || len(ix.conns["b"]) != 0 {
			t.Fatalf("%v: %d terminals on a, %d left on b", sizes, len(got), len(ix.conns["b"]))
		}
		if !sort.SliceIsSorted(got, func(i, j int) bool { return connLess(got[i], got[j]) }) {
			t.Fatalf("%v: merged list not sorted", sizes)
		}
		seen := map[*Part]int{}
		for _, cn := range got {
			seen[cn.Part]++
		}
		for _, p := range parts {
			if seen[p] != 1 {
				t.Fatalf("%v: %s.%s appears %d times", sizes, p.Ref, p.Pins[0].Name, seen[p])
			}
		}
	}
}
