package dc

import (
	"fmt"
	"strings"
	"syscall"
	"testing"
	"time"

	"pare/graph"
)

// stageChain writes a set of n resistance-coupled triode stages on a 250 V
// rail, each with its own decoupling: valve, anode load, cathode resistor
// and bypass, grid leak, coupling capacitor, decoupling resistor and
// capacitor (8 parts a stage). Invented values; it is the shape of an audio
// chain or an IF strip.
func stageChain(n int) *graph.Circuit {
	var b strings.Builder
	b.WriteString("title = \"bench chain\"\nband = \"20..20k\"\n[nets]\nht = { role = \"supply\", volts = 250 }\n[parts]\n")
	for i := 0; i < n; i++ {
		fmt.Fprintf(&b, "V%d = { valve = \"triode\", pins = { a = \"a%d\", g1 = \"g%d\", k = \"k%d\" }, gm = \"1.6mA/V\", mu = 100, ia = \"1.2mA\" }\n", i, i, i, i)
		fmt.Fprintf(&b, "R%d = { r = \"100k\", pins = [\"d%d\", \"a%d\"] }\n", 4*i, i, i)
		fmt.Fprintf(&b, "R%d = { r = \"1k5\", pins = [\"k%d\", \"gnd\"] }\n", 4*i+1, i)
		fmt.Fprintf(&b, "R%d = { r = \"1M\", pins = [\"g%d\", \"gnd\"] }\n", 4*i+2, i)
		fmt.Fprintf(&b, "R%d = { r = \"10k\", pins = [\"ht\", \"d%d\"] }\n", 4*i+3, i)
		fmt.Fprintf(&b, "C%d = { c = \"25u\", pins = [\"k%d\", \"gnd\"] }\n", 3*i, i)
		fmt.Fprintf(&b, "C%d = { c = \"8u\", pins = [\"d%d\", \"gnd\"] }\n", 3*i+1, i)
		if i > 0 {
			fmt.Fprintf(&b, "C%d = { c = \"22n\", pins = [\"a%d\", \"g%d\"] }\n", 3*i+2, i-1, i)
		}
	}
	c, err := graph.Parse("chain.toml", []byte(b.String()))
	if err != nil {
		panic(err) // the generator is fixed: a programming error
	}
	return c
}

// BenchmarkOperatingPoint1000 solves a 1,000-part set (125 stages).
func BenchmarkOperatingPoint1000(b *testing.B) {
	c := stageChain(125)
	b.ReportMetric(float64(len(c.Parts)), "parts")
	cpu0 := cpuTime()
	n := 0
	for b.Loop() {
		if _, err := Solve(c); err != nil {
			b.Fatal(err)
		}
		n++
	}
	b.ReportMetric((cpuTime()-cpu0).Seconds()*1e3/float64(n), "cpu-ms/op")
}

// BenchmarkRank200 ranks every single fault of a 200-part set (25 stages)
// against readings at each stage's anode and cathode.
func BenchmarkRank200(b *testing.B) {
	c := stageChain(25)
	pt, err := Solve(c)
	if err != nil {
		b.Fatal(err)
	}
	rd := &Readings{Tolerance: defaultTolerance}
	for i := 0; i < 25; i += 5 {
		for _, n := range []string{fmt.Sprintf("a%d", i), fmt.Sprintf("k%d", i)} {
			v, _ := pt.Volts(n)
			rd.List = append(rd.List, Reading{Key: n, Net: n, Volts: v * 1.2, Meter: Meter{OhmsPerVolt: 20e3}})
		}
	}
	b.ReportMetric(float64(len(c.Parts)), "parts")
	b.ReportMetric(float64(len(pt.Faults())), "faults")
	cpu0 := cpuTime()
	n := 0
	for b.Loop() {
		if _, err := pt.Rank(rd); err != nil {
			b.Fatal(err)
		}
		n++
	}
	b.ReportMetric((cpuTime()-cpu0).Seconds()*1e3/float64(n), "cpu-ms/op")
}

// cpuTime is the user+system CPU time of this process so far: on a shared
// machine wall time includes waiting for a core.
func cpuTime() time.Duration {
	var ru syscall.Rusage
	if err := syscall.Getrusage(syscall.RUSAGE_SELF, &ru); err != nil {
		return 0
	}
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano())
}
