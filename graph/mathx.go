package graph

import (
	"math"
	"sort"
)

func sqrt(x float64) float64 { return math.Sqrt(x) }

func sortStrings(s []string) { sort.Strings(s) }

func sortGroups(g [][]string) {
	sort.Slice(g, func(i, j int) bool { return g[i][0] < g[j][0] })
}
