package ac

import (
	"fmt"
	"math"
	"os"
	"path/filepath"
	"runtime"
	"runtime/debug"
	"strconv"
	"syscall"
	"testing"
	"time"

	"pare/graph"
	"pare/graph/value"
	"pare/internal/synth"
)

// Benchmarks: an RC ladder and a chain of identical valve stages, at about
// 1k, 10k and 100k nodes, 100 log-spaced points each. Cost per point must
// grow about linearly with the number of nodes (docs/performance.md).

var benchSizes = []int{1000, 10000, 100000}

func two(ref string, kind graph.Kind, v float64, a, b string) *graph.Part {
	p := &graph.Part{Ref: ref, Kind: kind, Value: value.Range{Min: v, Max: v},
		Pins: []graph.Pin{{Name: "1", Net: a}, {Name: "2", Net: b}}}
	if kind == graph.Capacitor {
		p.Type = graph.CapFixed
	}
	return p
}

// finish builds the net list and sorts: AddPart one by one would be
// quadratic at 100k parts.
func finish(c *graph.Circuit, supplies ...string) *graph.Circuit {
	seen := map[string]bool{}
	for _, p := range c.Parts {
		for _, pin := range p.Pins {
			if !seen[pin.Net] {
				seen[pin.Net] = true
				c.Nets = append(c.Nets, &graph.Net{Name: pin.Net, Role: graph.DefaultRole(pin.Net)})
			}
		}
	}
	for _, n := range c.Nets {
		for _, s := range supplies {
			if n.Name == s {
				n.Role = graph.Supply
			}
		}
	}
	c.Sort()
	return c
}

// ladder is n sections of 1 kΩ in series and 10 nF to ground: n nodes.
func ladder(n int) *graph.Circuit {
	c := &graph.Circuit{Title: fmt.Sprintf("RC ladder, %d sections", n), Band: value.Range{Min: 10, Max: 1e6},
		Inputs: []string{"n0"}, Outputs: []string{"n" + strconv.Itoa(n)}}
	for i := 1; i <= n; i++ {
		prev, cur := "n"+strconv.Itoa(i-1), "n"+strconv.Itoa(i)
		c.Parts = append(c.Parts, two("R"+strconv.Itoa(i), graph.Resistor, 1e3, prev, cur), two("C"+strconv.Itoa(i), graph.Capacitor, 10e-9, cur, "gnd"))
	}
	return finish(c)
}

// stages is a chain of triode stages, two nodes each (grid and anode):
// µ 20, ra 10 kΩ, anode load 526 Ω for a gain near −1 so that the response
// neither overflows nor underflows over tens of thousands of stages; 1 µF
// coupling into a 1 MΩ grid leak and 10 pF of Miller capacitance grid to anode.
func stages(nodes int) *graph.Circuit {
	n := nodes / 2
	c := &graph.Circuit{Title: fmt.Sprintf("%d triode stages", n), Band: value.Range{Min: 10, Max: 1e6},
		Inputs: []string{"in"}, Outputs: []string{"a" + strconv.Itoa(n)}}
	in := "in"
	for i := 1; i <= n; i++ {
		s := strconv.Itoa(i)
		g, a := "g"+s, "a"+s
		c.Parts = append(c.Parts,
			two("C"+s, graph.Capacitor, 1e-6, in, g),
			two("R"+s, graph.Resistor, 1e6, g, "gnd"),
			two("RL"+s, graph.Resistor, 526, a, "ht"),
			two("CM"+s, graph.Capacitor, 10e-12, g, a),
			&graph.Part{Ref: "V" + s, Kind: graph.Valve, Type: "triode", Params: map[string]float64{"mu": 20, "ra": 10e3},
				Pins: []graph.Pin{{Name: "a", Net: a}, {Name: "g1", Net: g}, {Name: "k", Net: "gnd"}}})
		in = a
	}
	return finish(c, "ht")
}

func benchFreqs() []float64 { return logSweep(10, 1e6, 100) }

func BenchmarkLadder(b *testing.B) {
	for _, n := range benchSizes {
		c := ladder(n)
		b.Run(fmt.Sprintf("nodes=%d", n), func(b *testing.B) { benchTransfer(b, c) })
	}
}

func BenchmarkStages(b *testing.B) {
	for _, n := range benchSizes {
		c := stages(n)
		b.Run(fmt.Sprintf("nodes=%d", n), func(b *testing.B) { benchTransfer(b, c) })
	}
}

func benchTransfer(b *testing.B, c *graph.Circuit) {
	freqs := benchFreqs()
	cpu0 := cpuTime()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		h, err := Transfer(c, c.Inputs[0], c.Outputs[0], freqs, Options{})
		if err != nil {
			b.Fatal(err)
		}
		if cmplx := h[0]; math.IsNaN(real(cmplx)) {
			b.Fatal("NaN")
		}
	}
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/float64(len(freqs))/1e3, "µs/point")
	// CPU time as well as wall time: on a shared machine the wall clock
	// measures the neighbours too.
	b.ReportMetric((cpuTime()-cpu0).Seconds()*1e6/float64(b.N)/float64(len(freqs)), "cpu-µs/point")
}

// cpuTime is the user+system CPU time of this process so far.
func cpuTime() time.Duration {
	var ru syscall.Rusage
	if err := syscall.Getrusage(syscall.RUSAGE_SELF, &ru); err != nil {
		return 0
	}
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano())
}

// The benchmark circuits are solved correctly, not just fast: the ladder's
// low-frequency response is 1 and a single stage's gain is −µ(RL∥Rg)/(ra+RL∥Rg)
// at mid band (docs/references.md §5 formula, derived).
func TestBenchCircuits(t *testing.T) {
	h, err := Transfer(ladder(1000), "n0", "n1000", []float64{1e-3}, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(real(h[0])-1) > 1e-3 {
		t.Errorf("ladder at 1 mHz: %v, want about 1", h[0])
	}
	c := stages(2)
	h, err = Transfer(c, "in", "a1", []float64{1e3}, Options{})
	if err != nil {
		t.Fatal(err)
	}
	rl := 526.0
	want := -20 * rl / (10e3 + rl)
	if math.Abs(real(h[0])-want) > 1e-3*math.Abs(want) {
		t.Errorf("one stage at 1 kHz: %v, want about %.4f", h[0], want)
	}
}

// TestWriteBenchDecks writes the benchmark circuits as SPICE decks into
// $PARE_BENCH_DECKS, for timing ngspice on the same circuits
// (docs/performance.md).
func TestWriteBenchDecks(t *testing.T) {
	dir := os.Getenv("PARE_BENCH_DECKS")
	if dir == "" {
		t.Skip("set PARE_BENCH_DECKS to a folder to write the benchmark decks")
	}
	for _, n := range benchSizes {
		for name, c := range map[string]*graph.Circuit{"ladder": ladder(n), "stages": stages(n)} {
			f, err := os.Create(filepath.Join(dir, fmt.Sprintf("%s-%d.cir", name, n)))
			if err != nil {
				t.Fatal(err)
			}
			// 20 points per decade over 10 Hz–1 MHz: 101 points, the benchmark's 100.
			err = WriteSpice(f, c, SpiceOptions{PointsPerDecade: 20, DataFile: fmt.Sprintf("%s-%d.dat", name, n)})
			f.Close()
			if err != nil {
				t.Fatal(err)
			}
		}
	}
}

// BenchmarkCompareExample is the cost of one equivalence check of an example
// against a copy of itself: what the rules engine pays per checked step.
func BenchmarkCompareExample(b *testing.B) {
	files, _ := filepath.Glob("../../examples/*.toml")
	for _, f := range files {
		c, err := graph.LoadFile(f)
		if err != nil {
			b.Fatal(err)
		}
		d := c.Clone()
		b.Run(filepath.Base(f), func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				if _, err := Compare(c, d, CompareOptions{}); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// BenchmarkCompareBank is verify's comparison on a receiver bank of about
// 100, 1,000 and 10,000 parts (internal/synth, seed 1) against a copy of
// itself: every input to every output, each region, each port impedance, at
// three gang settings. It reports the process CPU time per operation too:
//
//	go test -run XXX -bench CompareBank -benchtime 1x -cpu 1 ./graph/ac/
func BenchmarkCompareBank(b *testing.B) {
	for _, parts := range []int{100, 1000, 10000} {
		c, err := synth.BankCircuit(parts, 1)
		if err != nil {
			b.Fatal(err)
		}
		d := c.Clone()
		b.Run(fmt.Sprint(parts), func(b *testing.B) {
			cpu0 := cpuTime()
			for i := 0; i < b.N; i++ {
				if _, err := Compare(c, d, CompareOptions{}); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric((cpuTime()-cpu0).Seconds()/float64(b.N), "cpu-s/op")
		})
	}
}

// BenchmarkCompareBankHeap is BenchmarkCompareBank's comparison at 1,000
// and 10,000 parts with the collector run at every 10 % of growth, so the
// live heap is seen often enough to give its peak within a tenth
// (peak-live-MB: what one comparison keeps at once, which set the main
// job's peak resident memory on a whole set; docs/performance.md). Its
// time is not the comparison's: the collector runs far more than pare
// runs it.
//
//	go test -run XXX -bench CompareBankHeap -benchtime 1x ./graph/ac/
func BenchmarkCompareBankHeap(b *testing.B) {
	for _, parts := range []int{1000, 10000} {
		c, err := synth.BankCircuit(parts, 1)
		if err != nil {
			b.Fatal(err)
		}
		d := c.Clone()
		b.Run(fmt.Sprint(parts), func(b *testing.B) {
			defer debug.SetGCPercent(debug.SetGCPercent(10))
			runtime.GC()
			w := watchLive()
			for i := 0; i < b.N; i++ {
				if _, err := Compare(c, d, CompareOptions{}); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(w.stop(), "peak-live-MB")
		})
	}
}
