package pipeline

import (
	"fmt"
	"syscall"
	"testing"
	"time"

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

// BenchmarkFinalProof times the main job's final comparison alone (verify:
// the whole original against the whole reduced circuit, every pair, every
// gang setting, no memo) on receiver banks of about 1,000 and 10,000 parts
// (internal/synth, seed 1), reduced as the main job reduces them. It
// reports the process CPU time per comparison too (the comparison shares
// its quantities between cores):
//
//	go test -run XXX -bench FinalProof -benchtime 3x ./cmd/internal/pipeline/
func BenchmarkFinalProof(b *testing.B) {
	for _, parts := range []int{1000, 10000} {
		src, err := synth.Bank(parts, 1)
		if err != nil {
			b.Fatal(err)
		}
		path := writeTemp(b, fmt.Sprintf("bank%d.toml", parts), string(src))
		r, err := Run(Options{Path: path, Until: PhaseReduce, Level: rules.LevelSignal})
		if err != nil {
			b.Fatal(err)
		}
		b.Run(fmt.Sprint(parts), func(b *testing.B) {
			cpu0 := cpuTime()
			for i := 0; i < b.N; i++ {
				if _, err := r.compare(r.acBase(), r.Reduced, nil); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric((cpuTime()-cpu0).Seconds()/float64(b.N), "cpu-s/op")
		})
	}
}

// cpuTime is the process's CPU time so far, user and system.
func cpuTime() time.Duration {
	var ru syscall.Rusage
	if err := syscall.Getrusage(syscall.RUSAGE_SELF, &ru); err != nil {
		return 0
	}
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano())
}
