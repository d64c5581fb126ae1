package fuzzgen

import (
	"math/rand"
	"testing"

	"pare/graph"
)

// Most generated netlists load: otherwise a fuzz target built on Netlist
// would spend its time in the loader's refusals.
func TestNetlistMostlyLoads(t *testing.T) {
	rng := rand.New(rand.NewSource(1))
	loaded := 0
	const n = 300
	for i := 0; i < n; i++ {
		data := make([]byte, rng.Intn(80))
		rng.Read(data)
		if _, err := graph.Parse("gen.toml", []byte(Netlist(data))); err == nil {
			loaded++
		}
	}
	if loaded < n/2 {
		t.Errorf("only %d of %d generated netlists load", loaded, n)
	}
	t.Logf("%d of %d load", loaded, n)
}
