package dc

import (
	"strconv"
	"testing"

	"pare/graph"
	"pare/graph/ac"
	"pare/internal/synth"
)

// BenchmarkOscillators finds the oscillators on the bench (Point.Oscillators,
// every active part's loop at three gang settings) on synthetic receiver
// banks of 1,010 and 3,008 parts (internal/synth, seed 1): the ratio of the
// two is the search's growth with the set, linear when the set is
// elaborated once per gang setting rather than once per device. The loop
// searches ac remembers are forgotten, and the point's list of
// oscillators made afresh, before each run.
func BenchmarkOscillators(b *testing.B) {
	for _, parts := range []int{1000, 3000} {
		c, err := synth.BankCircuit(parts, 1)
		if err != nil {
			b.Fatal(err)
		}
		pt, err := Solve(c)
		if err != nil {
			b.Fatal(err)
		}
		b.Run(benchName(c), func(b *testing.B) {
			b.ReportMetric(float64(len(c.Parts)), "parts")
			cpu0 := cpuTime()
			n := 0
			for b.Loop() {
				ac.ForgetLoops()
				pt.osc = nil
				if len(pt.Oscillators()) == 0 {
					b.Fatal("no oscillator found on a bank of superhets")
				}
				n++
			}
			b.ReportMetric((cpuTime()-cpu0).Seconds()*1e3/float64(n), "cpu-ms/op")
		})
	}
}

// benchName is a bank's sub-benchmark name: its part count.
func benchName(c *graph.Circuit) string { return "bank" + strconv.Itoa(len(c.Parts)) }
