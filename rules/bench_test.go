package rules

import (
	"fmt"
	"strings"
	"testing"

	"pare/graph"
	"pare/internal/synth"
)

// chainOfStages writes a netlist of n resistance-coupled pentode stages with
// screen and cathode decoupling, anode decoupling, parallel grid leaks, a
// heater on each valve and a series pair in each anode load: 12 parts per
// stage, so that every rule of the signal level has work to do.
func chainOfStages(n int) string {
	var b strings.Builder
	b.WriteString("band = \"20..20k\"\ninputs = [\"g0\"]\n")
	fmt.Fprintf(&b, "outputs = [\"g%d\"]\n", n)
	b.WriteString("[nets]\nht = { role = \"supply\", volts = 250 }\nhx = { role = \"heater\" }\n[parts]\n")
	for i := 0; i < n; i++ {
		fmt.Fprintf(&b, "V%d = { valve = \"pentode\", pins = { a = \"a%d\", g1 = \"g%d\", g2 = \"s%d\", g3 = \"k%d\", k = \"k%d\", h1 = \"hx\", h2 = \"gnd\" }, gm = \"2mA/V\" }\n", i+1, i, i, i, i, i)
		fmt.Fprintf(&b, "R%d = { r = \"1M\", pins = [\"g%d\", \"gnd\"], tol = \"10%%\" }\n", 12*i+1, i)
		fmt.Fprintf(&b, "R%d = { r = \"1M\", pins = [\"g%d\", \"gnd\"], tol = \"10%%\" }\n", 12*i+2, i)
		fmt.Fprintf(&b, "R%d = { r = \"1k\", pins = [\"k%d\", \"gnd\"] }\n", 12*i+3, i)
		fmt.Fprintf(&b, "C%d = { c = \"1000u\", pins = [\"k%d\", \"gnd\"] }\n", 12*i+4, i)
		fmt.Fprintf(&b, "R%d = { r = \"100k\", pins = [\"s%d\", \"ht\"] }\n", 12*i+5, i)
		fmt.Fprintf(&b, "C%d = { c = \"100u\", pins = [\"gnd\", \"s%d\"] }\n", 12*i+6, i)
		fmt.Fprintf(&b, "R%d = { r = \"47k\", pins = [\"a%d\", \"m%d\"], tol = \"5%%\" }\n", 12*i+7, i, i)
		fmt.Fprintf(&b, "R%d = { r = \"47k\", pins = [\"m%d\", \"d%d\"], tol = \"5%%\" }\n", 12*i+8, i, i)
		fmt.Fprintf(&b, "R%d = { r = \"10k\", pins = [\"d%d\", \"ht\"] }\n", 12*i+9, i)
		fmt.Fprintf(&b, "C%d = { c = \"50u\", pins = [\"d%d\", \"gnd\"] }\n", 12*i+10, i)
		fmt.Fprintf(&b, "C%d = { c = \"100n\", pins = [\"a%d\", \"g%d\"] }\n", 12*i+11, i, i+1)
	}
	fmt.Fprintf(&b, "R%d = { r = \"1M\", pins = [\"g%d\", \"gnd\"] }\n", 12*n+1, n)
	return b.String()
}

func benchCircuit(b *testing.B, parts int) *graph.Circuit {
	c, err := graph.Parse("chain.toml", []byte(chainOfStages(parts/12)))
	if err != nil {
		b.Fatal(err)
	}
	return c
}

// BenchmarkReduce5000 reduces a chain of stages of about 5,000 parts at the
// signal level (the performance target is met here, not in a timed test).
func BenchmarkReduce5000(b *testing.B) {
	c := benchCircuit(b, 5000)
	b.ReportMetric(float64(len(c.Parts)), "parts")
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if _, _, err := Reduce(c, Options{Level: LevelSignal}); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkReduce5000Ideal(b *testing.B) {
	c := benchCircuit(b, 5000)
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if _, _, err := Reduce(c, Options{Level: LevelIdeal}); err != nil {
			b.Fatal(err)
		}
	}
}

// The generated chain itself reduces as a technician expects: per stage the
// valve on a, g1, k, one merged grid leak, the merged anode load and the
// coupling capacitor remain.
func TestChainReduces(t *testing.T) {
	c, err := graph.Parse("chain.toml", []byte(chainOfStages(3)))
	if err != nil {
		t.Fatal(err)
	}
	r, log := reduceChecked(t, c, Options{Level: LevelSignal})
	// per stage: V, merged grid leak, merged anode load, coupling C = 4; plus the last grid leak
	if len(r.Parts) != 3*4+1 {
		t.Fatalf("want 13 parts, got %d:\n%s\n%s", len(r.Parts), written(t, r), logText(log))
	}
}

// BenchmarkReduceBank reduces synthetic receiver banks (internal/synth,
// seed 1) of about 1,000, 5,000 and 10,000 parts at the signal level, with
// no step proven and with every step journaled for a proof that accepts it
// (the engine's share of the main job's proven reduction: the journal, the
// undo bookkeeping, no AC solve). Both should grow about linearly:
//
//	go test -run XXX -bench ReduceBank -benchtime 1x ./rules/
func BenchmarkReduceBank(b *testing.B) {
	for _, parts := range []int{1000, 5000, 10000} {
		c, err := synth.BankCircuit(parts, 1)
		if err != nil {
			b.Fatal(err)
		}
		for _, journaled := range []bool{false, true} {
			o := Options{Level: LevelSignal}
			name := fmt.Sprintf("%d", parts)
			if journaled {
				name += "/journaled"
				o.CheckStep = func(j *graph.Journal, _ *Step) error { _ = j.Parts(); return nil }
			}
			b.Run(name, func(b *testing.B) {
				for i := 0; i < b.N; i++ {
					if _, _, err := Reduce(c, o); err != nil {
						b.Fatal(err)
					}
				}
			})
		}
	}
}
