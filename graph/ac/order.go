package ac

import (
	"cmp"
	"slices"
)

// rcm returns a reverse Cuthill–McKee ordering of the unknowns of a matrix
// whose symmetric pattern is given as adjacency lists (no self loops needed).
// Each connected part starts from a pseudo-peripheral node found by repeated
// breadth-first search (George and Liu), neighbours are visited in order of
// increasing degree with the index breaking ties, so the order depends only
// on the pattern, never on map order.
func rcm(adj [][]int) []int {
	n := len(adj)
	deg := make([]int, n)
	for i, a := range adj {
		deg[i] = len(a)
	}
	for _, a := range adj {
		slices.SortFunc(a, func(x, y int) int {
			if deg[x] != deg[y] {
				return cmp.Compare(deg[x], deg[y])
			}
			return cmp.Compare(x, y)
		})
	}
	visited := make([]bool, n)
	order := make([]int, 0, n)
	level := make([]int, n)
	for i := range level {
		level[i] = -1
	}
	for s := 0; s < n; s++ {
		if visited[s] {
			continue
		}
		start := peripheral(adj, s, level)
		// Cuthill–McKee breadth-first search from start.
		head := len(order)
		order = append(order, start)
		visited[start] = true
		for head < len(order) {
			v := order[head]
			head++
			for _, w := range adj[v] {
				if !visited[w] {
					visited[w] = true
					order = append(order, w)
				}
			}
		}
	}
	for i, j := 0, n-1; i < j; i, j = i+1, j-1 {
		order[i], order[j] = order[j], order[i]
	}
	return order
}

// peripheral finds a node of large eccentricity in s's connected part: BFS,
// jump to a node of least degree in the last level, repeat while the depth
// grows. level is scratch, all -1 on entry and on return.
func peripheral(adj [][]int, s int, level []int) int {
	cur, depth := s, -1
	var seen []int
	for iter := 0; iter < 8; iter++ {
		seen = seen[:0]
		level[cur] = 0
		seen = append(seen, cur)
		for h := 0; h < len(seen); h++ {
			v := seen[h]
			for _, w := range adj[v] {
				if level[w] < 0 {
					level[w] = level[v] + 1
					seen = append(seen, w)
				}
			}
		}
		last := level[seen[len(seen)-1]]
		next := -1
		for _, v := range seen {
			if level[v] == last && (next < 0 || len(adj[v]) < len(adj[next]) || (len(adj[v]) == len(adj[next]) && v < next)) {
				next = v
			}
		}
		for _, v := range seen {
			level[v] = -1
		}
		if last <= depth {
			break
		}
		depth = last
		cur = next
	}
	return cur
}
