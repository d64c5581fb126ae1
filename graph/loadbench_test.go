package graph_test

import (
	"fmt"
	"syscall"
	"testing"
	"time"

	"pare/graph"
	"pare/internal/synth"
)

// BenchmarkLoad times graph.Parse (decoder, key positions, model, the
// coils' q referred to their band) on the synthetic sets of bench/: the RC
// ladder `pare sweep` is paired with ngspice on (docs/performance.md,
// "Whole sets"), and receiver banks of 1,000 and 10,000 parts, whose ratio
// is the load's growth (issue 13: exponent at most 1.2). allocs/op is
// reported: the load should allocate little beyond the model it returns;
// and cpu-ms/op, the process's user and system time per load (the key
// scan runs beside the decoder, so it is not in the wall time), which on
// a shared machine moves less than the wall time.
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
			cpu0 := cpuTime()
			for b.Loop() {
				if _, err := graph.Parse(s.name+".toml", s.data); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric((cpuTime()-cpu0).Seconds()*1e3/float64(b.N), "cpu-ms/op")
		})
	}
}

// cpuTime is the user+system CPU time of this process so far.
func cpuTime() time.Duration {
	var ru syscall.Rusage
	if err := syscall.Getrusage(syscall.RUSAGE_SELF, &ru); err != nil {
		return 0
	}
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano())
}
