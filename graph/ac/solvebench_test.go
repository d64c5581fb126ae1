package ac

import (
	"testing"

	"pare/internal/synth"
)

// BenchmarkSolveBlock is the cost of one frequency point of the proof: one
// block of the 1,000-part bank (a channel's input impedance, about 30
// unknowns) assembled, factored and solved at 400 points across its band,
// as a pair sweep solves it: point by point (at, "one") and in runs of
// points (atMany, "runs", what the sweep does). Reported per point:
//
//	go test -run XXX -bench SolveBlock -cpu 1 ./graph/ac/
func BenchmarkSolveBlock(b *testing.B) {
	c, err := synth.BankCircuit(1000, 1)
	if err != nil {
		b.Fatal(err)
	}
	m, err := newModel(c, Options{VarSet: true, VarFrac: 0.5}, &dcShare{})
	if err != nil {
		b.Fatal(err)
	}
	freqs := logSweep(c.Band.Min, c.Band.Max, 400)
	for _, what := range []struct{ name, what, from, to string }{
		{"impedance", "impedance", c.Inputs[0], ""},
		{"transfer", "transfer", c.Inputs[0], c.Outputs[0]},
	} {
		for _, runs := range []bool{false, true} {
			name := what.name + "/one"
			if runs {
				name = what.name + "/runs"
			}
			b.Run(name, func(b *testing.B) { solveBlock(b, m, what.what, what.from, what.to, freqs, runs) })
		}
	}
}

func solveBlock(b *testing.B, m *model, what, from, to string, freqs []float64, runs bool) {
	out := make([]complex128, len(freqs))
	cpu0 := cpuTime()
	for i := 0; i < b.N; i++ {
		p, err := newProbe(m, what, from, to)
		if err != nil {
			b.Fatal(err)
		}
		if runs {
			if _, err := p.atMany(freqs, out); err != nil {
				b.Fatal(err)
			}
			continue
		}
		for _, f := range freqs {
			if _, err := p.at(f); err != nil {
				b.Fatal(err)
			}
		}
	}
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/float64(len(freqs)), "ns/point")
	// CPU time too: on a shared machine the wall clock measures the neighbours.
	b.ReportMetric(float64((cpuTime()-cpu0).Nanoseconds())/float64(b.N)/float64(len(freqs)), "cpu-ns/point")
}
