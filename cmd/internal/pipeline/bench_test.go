package pipeline

import (
	"fmt"
	"testing"

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
