package layout

import (
	"fmt"
	"path/filepath"
	"regexp"
	"slices"
	"strings"
	"syscall"
	"testing"
	"time"

	"pare/graph"
	"pare/internal/synth"
	"pare/render/symbol"
)

// The layout's benchmarks (docs/performance.md): the sampler fixture's
// reduced sheet, the examples, and chains of triode stages.
//
//	go test -run XXX -bench . -benchtime 5x ./render/layout/
//
// Besides wall time each reports the process's CPU time per layout
// (cpu-ms/op, from getrusage), which a shared machine disturbs less. The
// search memo is emptied before each operation, which is timed as a fresh
// process would run it.

func loadFixture(tb testing.TB, path string) *graph.Circuit {
	tb.Helper()
	c, err := graph.LoadFile(path)
	if err != nil {
		tb.Fatalf("%s: %v", path, err)
	}
	return c
}

// reducedOptions are the options render gives a reduced sheet, with the
// render tests' stand-in frames: the parts in thirds, in ref order.
func reducedOptions(c *graph.Circuit, st symbol.Style) Options {
	o := Options{Style: st, Untangle: true, HideUnconnected: true}
	n := len(c.Parts)
	for i := 0; i < 3; i++ {
		f := Frame{Title: "S" + string(rune('1'+i)) + " test stage with a rather long title to wrap", Subtitle: "f 1 MHz"}
		for _, p := range c.Parts[i*n/3 : (i+1)*n/3] {
			f.Parts = append(f.Parts, p.Ref)
		}
		o.Frames = append(o.Frames, f)
	}
	return o
}

// benchLayout lays c out b.N times and reports the CPU time per layout.
func benchLayout(b *testing.B, c *graph.Circuit, o Options) {
	b.Helper()
	b.ResetTimer()
	c0 := cpuNow()
	for i := 0; i < b.N; i++ {
		resetMemo() // each layout as a fresh process makes it
		if _, err := Layout(c, o); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(cpuNow()-c0)/1e6/float64(b.N), "cpu-ms/op")
}

// BenchmarkAllSymbolsReduced: the sampler fixture's reduced sheet, 27 parts
// in three stand-in frames, the sheet render's tests draw most often.
func BenchmarkAllSymbolsReduced(b *testing.B) {
	c := loadFixture(b, "../testdata/all-symbols.toml")
	for _, st := range []symbol.Style{symbol.IEC, symbol.IEEE} {
		b.Run([]string{"iec", "ieee"}[st], func(b *testing.B) { benchLayout(b, c, reducedOptions(c, st)) })
	}
}

// BenchmarkExamples: each example circuit as drawn in a full view (gang
// links, no search) and with the untangle search of a reduced view (on the
// whole circuit: the reduction is cmd/pare's business).
func BenchmarkExamples(b *testing.B) {
	files, _ := filepath.Glob("../../examples/*.toml")
	if len(files) == 0 {
		b.Fatal("no examples")
	}
	for _, f := range files {
		c := loadFixture(b, f)
		name := strings.TrimSuffix(filepath.Base(f), ".toml")
		b.Run(name+"/full", func(b *testing.B) { benchLayout(b, c, Options{Links: true}) })
		b.Run(name+"/untangle", func(b *testing.B) { benchLayout(b, c, Options{Untangle: true, HideUnconnected: true}) })
	}
}

// BenchmarkChain: chains of RC-coupled triode stages, 60 parts with the
// untangle search of a reduced view, 2,000 parts in a full view (the search
// is for small sheets only).
func BenchmarkChain(b *testing.B) {
	b.Run("60/untangle", func(b *testing.B) { benchLayout(b, stageChain(60), Options{Untangle: true}) })
	b.Run("2000/full", func(b *testing.B) { benchLayout(b, stageChain(2000), Options{}) })
}

// BenchmarkSynth: sheets from internal/synth, drawn from the examples' own
// stages: one valve superhet channel (50 parts, every decoupling, heater
// bypass and trimmer) with the untangle search of a reduced view, the
// largest sheet of up to 60 parts pare draws; and receiver banks of about
// 200 and 2,000 parts in a full view. The 2,000-part bank takes minutes
// (docs/performance.md): run it on its own, -bench Synth/bank-2000.
func BenchmarkSynth(b *testing.B) {
	b.Run("superhet-50/untangle", func(b *testing.B) {
		one, err := synth.Load(synth.Superhet)
		if err != nil {
			b.Fatal(err)
		}
		benchLayout(b, one, Options{Untangle: true, HideUnconnected: true})
	})
	for _, n := range []int{200, 2000} {
		b.Run(fmt.Sprintf("bank-%d/full", n), func(b *testing.B) {
			bank, err := synth.BankCircuit(n, 1)
			if err != nil {
				b.Fatal(err)
			}
			benchLayout(b, bank, Options{Links: true})
		})
	}
}

// BenchmarkBankChannels: a receiver bank of about 2,000 parts routed as
// the pages of a whole set are, each channel a sheet of its own (full view,
// gang links): the total for the bank, which should grow with the number
// of channels and stay under a second of CPU at 2,000 parts.
func BenchmarkBankChannels(b *testing.B) {
	bank, err := synth.BankCircuit(2000, 1)
	if err != nil {
		b.Fatal(err)
	}
	sheets := channelSheets(bank)
	b.ResetTimer()
	c0 := cpuNow()
	for i := 0; i < b.N; i++ {
		resetMemo() // each run as a fresh process makes it
		for _, c := range sheets {
			if _, err := Layout(c, Options{Links: true}); err != nil {
				b.Fatal(err)
			}
		}
	}
	b.ReportMetric(float64(cpuNow()-c0)/1e6/float64(b.N), "cpu-ms/op")
	b.ReportMetric(float64(len(sheets)), "sheets")
}

// channelSheets cuts a synthetic bank into its channels: a part's channel
// is its number's hundreds (synth numbers R4 of channel 3 as R304).
func channelSheets(bank *graph.Circuit) []*graph.Circuit {
	num := regexp.MustCompile(`^[A-Za-z]+(\d+)`)
	chanOf := func(ref string) string {
		m := num.FindStringSubmatch(ref)
		if m == nil || len(m[1]) < 3 {
			return ""
		}
		return m[1][:len(m[1])-2]
	}
	var keys []string
	for _, p := range bank.Parts {
		if k := chanOf(p.Ref); !slices.Contains(keys, k) {
			keys = append(keys, k)
		}
	}
	var out []*graph.Circuit
	for _, k := range keys {
		c := bank.Clone()
		for _, p := range bank.Parts {
			if chanOf(p.Ref) != k {
				c.RemovePart(p.Ref)
			}
		}
		out = append(out, c)
	}
	return out
}

// stageChain builds a chain of RC-coupled common-cathode triode stages
// (coupling C, grid leak, valve, cathode R and bypass C, anode load to HT):
// six parts a stage, as a long audio or IF strip would be.
func stageChain(parts int) *graph.Circuit {
	var src strings.Builder
	fmt.Fprintf(&src, "title = \"chain of %d parts\"\nband = \"20..20k\"\ninputs = [\"in\"]\n", parts)
	prev := "in"
	var body strings.Builder
	for i := 1; 6*i <= parts; i++ {
		g, k, a := fmt.Sprintf("g%d", i), fmt.Sprintf("k%d", i), fmt.Sprintf("a%d", i)
		fmt.Fprintf(&body, "C%da = { c = \"10n\", pins = [%q, %q] }\n", i, prev, g)
		fmt.Fprintf(&body, "R%dg = { r = \"1M\", pins = [%q, \"gnd\"] }\n", i, g)
		fmt.Fprintf(&body, "V%d = { valve = \"triode\", pins = { a = %q, g1 = %q, k = %q } }\n", i, a, g, k)
		fmt.Fprintf(&body, "R%dk = { r = \"1k5\", pins = [%q, \"gnd\"] }\n", i, k)
		fmt.Fprintf(&body, "C%dk = { c = \"25u\", pins = [%q, \"gnd\"] }\n", i, k)
		fmt.Fprintf(&body, "R%da = { r = \"100k\", pins = [\"ht\", %q] }\n", i, a)
		prev = a
	}
	fmt.Fprintf(&src, "outputs = [%q]\n[nets]\nht = { role = \"supply\", volts = 250, label = \"HT +250 V\" }\n[parts]\n%s", prev, body.String())
	c, err := graph.Parse("chain.toml", []byte(src.String()))
	if err != nil {
		panic(err)
	}
	return c
}

func cpuNow() time.Duration {
	var ru syscall.Rusage
	syscall.Getrusage(syscall.RUSAGE_SELF, &ru)
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano())
}

// BenchmarkExtentsBank: the placement without routing that a paged view
// makes of the whole set to cut it into rows (ExtentsPlaced), on receiver
// banks of about 1,000 and 10,000 parts in a full view: it should grow with
// the set (issue 13's growth exponent of at most 1.2 per decade).
func BenchmarkExtentsBank(b *testing.B) {
	for _, n := range []int{1000, 10000} {
		b.Run(fmt.Sprintf("bank-%d/full", n), func(b *testing.B) {
			bank, err := synth.BankCircuit(n, 1)
			if err != nil {
				b.Fatal(err)
			}
			b.ResetTimer()
			c0 := cpuNow()
			for i := 0; i < b.N; i++ {
				resetMemo()
				ExtentsPlaced(bank, Options{Links: true})
			}
			b.ReportMetric(float64(cpuNow()-c0)/1e6/float64(b.N), "cpu-ms/op")
		})
	}
}

// BenchmarkNudgeSpots: the free places round every part label of the
// club receiver laid out whole (full view, gang links), as apartLabels
// looks for them round a label running into its neighbour's: the pass's
// cost grows with the labels tried and, per place, with what of the
// sheet lies near it (labelnudge.go, nearArea).
func BenchmarkNudgeSpots(b *testing.B) {
	r, err := Layout(loadFixture(b, "../../examples/club-receiver.toml"), Options{Links: true})
	if err != nil {
		b.Fatal(err)
	}
	g := &r.Geom
	syms := map[string]int{}
	for i, s := range g.Symbols {
		syms[s.Ref] = i
	}
	b0 := bounds(g)
	b.ResetTimer()
	c0 := cpuNow()
	for i := 0; i < b.N; i++ {
		for k := range g.Labels {
			nudgeSpots(g, syms, b0, k)
		}
	}
	b.ReportMetric(float64(cpuNow()-c0)/1e6/float64(b.N), "cpu-ms/op")
}
