package pipeline

import (
	"fmt"
	"testing"

	"pare/graph"
	"pare/internal/synth"
	"pare/rules"
)

// BenchmarkStepProof times the main job's reduction with every step proven
// against the circuit before it (the local proof), on receiver banks of
// about 100, 300 and 1,000 parts (internal/synth, seed 1):
//
//	go test -run XXX -bench StepProof -benchtime 1x -cpu 1 ./cmd/internal/pipeline/
func BenchmarkStepProof(b *testing.B) {
	for _, parts := range []int{100, 300, 1000} {
		src, err := synth.Bank(parts, 1)
		if err != nil {
			b.Fatal(err)
		}
		path := writeTemp(b, fmt.Sprintf("bank%d.toml", parts), string(src))
		b.Run(fmt.Sprint(parts), func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				o := Options{Path: path, Until: PhaseReduce, Level: rules.LevelSignal, StepCheck: AgainstPrevious}
				if _, err := Run(o); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// BenchmarkStepCut times the proven reduction's bookkeeping without the AC
// solve: every step journaled and cut to the groups it touched
// (localJournal), on banks of about 1,000, 5,000 and 10,000 parts. The cut
// costs the groups, not the set, so this should grow about linearly:
//
//	go test -run XXX -bench StepCut -benchtime 1x ./cmd/internal/pipeline/
func BenchmarkStepCut(b *testing.B) {
	for _, parts := range []int{1000, 5000, 10000} {
		c, err := synth.BankCircuit(parts, 1)
		if err != nil {
			b.Fatal(err)
		}
		check := func(j *graph.Journal, _ *rules.Step) error {
			localJournal(j)
			return nil
		}
		b.Run(fmt.Sprint(parts), func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				if _, _, err := rules.Reduce(c, rules.Options{Level: rules.LevelSignal, CheckStep: check}); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
