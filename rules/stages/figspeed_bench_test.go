package stages

import (
	"path/filepath"
	"testing"

	"pare/graph"
	"pare/graph/ac"
	"pare/graph/dc"
	"pare/internal/synth"
	"pare/rules"
)

// BenchmarkStageFigures recognises the stages of whole sets and solves
// their figures, as the main job does after its reduction: the flagship
// example (123 parts) and synthetic receiver banks of 1,010 parts (22
// channels, internal/synth, seed 1), of a tenth and of ten times that,
// whose ratios are the phase's growth with the set (run one with
// -bench 'StageFigures/bank10000$'). The loop searches ac remembers across
// the process are forgotten before each run, so every run solves them.
func BenchmarkStageFigures(b *testing.B) {
	lib, err := Builtin()
	if err != nil {
		b.Fatal(err)
	}
	bank, err := synth.Bank(1000, 1)
	if err != nil {
		b.Fatal(err)
	}
	small, err := synth.Bank(100, 1)
	if err != nil {
		b.Fatal(err)
	}
	big, err := synth.Bank(10000, 1)
	if err != nil {
		b.Fatal(err)
	}
	for _, set := range []struct {
		name string
		load func() (*graph.Circuit, error)
	}{
		{"flagship", func() (*graph.Circuit, error) {
			return graph.LoadFile(filepath.Join("..", "..", "examples", "club-receiver.toml"))
		}},
		{"bank100", func() (*graph.Circuit, error) { return graph.Parse("bank100.toml", small) }},
		{"bank1000", func() (*graph.Circuit, error) { return graph.Parse("bank1000.toml", bank) }},
		{"bank10000", func() (*graph.Circuit, error) { return graph.Parse("bank10000.toml", big) }},
	} {
		full, err := set.load()
		if err != nil {
			b.Fatal(err)
		}
		reduced, log, err := rules.Reduce(full, rules.Options{Level: rules.LevelSignal})
		if err != nil {
			b.Fatal(err)
		}
		op, err := dc.Solve(full)
		if err != nil {
			b.Fatal(err)
		}
		o := Options{Library: lib, Full: full, ACGround: log.ACGround, DC: op}
		b.Run(set.name, func(b *testing.B) {
			start := cpuTime()
			for i := 0; i < b.N; i++ {
				ac.ForgetLoops()
				if _, err := Find(reduced, o); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(float64(cpuTime()-start)/float64(b.N)/1e6, "cpu-ms/op")
		})
	}
}
