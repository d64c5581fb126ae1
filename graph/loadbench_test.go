package graph_test

import (
	"fmt"
	"testing"

	"pare/graph"
	"pare/internal/synth"
)

// BenchmarkLoad times graph.Parse (decoder, key positions, model, the
// coils' q referred to their band) on the synthetic sets of bench/: the RC
// ladder `pare sweep` is paired with ngspice on (docs/performance.md,
// "Whole sets"), and receiver banks of 1,000 and 10,000 parts, whose ratio
// is the load's growth (issue 13: exponent at most 1.2). allocs/op is
// reported: the load should allocate little beyond the model it returns.
func BenchmarkLoad(b *testing.B) {
	ladder, err := synth.Ladder(10000)
	if err != nil {
		b.Fatal(err)
	}
	sets := []struct {
		name string
		data []byte
	}{{"ladder10000", ladder}}
	for _, n := range []int{1000, 10000} {
		bank, err := synth.Bank(n, 1)
		if err != nil {
			b.Fatal(err)
		}
		sets = append(sets, struct {
			name string
			data []byte
		}{fmt.Sprintf("bank%d", n), bank})
	}
	for _, s := range sets {
		b.Run(s.name, func(b *testing.B) {
			b.SetBytes(int64(len(s.data)))
			b.ReportAllocs()
			for b.Loop() {
				if _, err := graph.Parse(s.name+".toml", s.data); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
