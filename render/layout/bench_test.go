package layout

import (
	"syscall"
	"testing"
	"time"

	"pare/graph"
	"pare/render/symbol"
)

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

func BenchmarkAllSymbolsReduced(b *testing.B) {
	c := loadFixture(b, "../testdata/all-symbols.toml")
	for _, st := range []symbol.Style{symbol.IEC, symbol.IEEE} {
		o := reducedOptions(c, st)
		b.Run([]string{"iec", "ieee"}[st], func(b *testing.B) {
			c0 := cpuNow()
			for i := 0; i < b.N; i++ {
				if _, err := Layout(c, o); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(float64(cpuNow()-c0)/1e6/float64(b.N), "cpu-ms/op")
		})
	}
}

func cpuNow() time.Duration {
	var ru syscall.Rusage
	syscall.Getrusage(syscall.RUSAGE_SELF, &ru)
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano())
}
