package stages

import (
	"testing"

	"math"
	"pare/graph"

	"pare/graph/ac"
)

// peakOfDense is the peak search peakOf replaced: a log grid of 21 points
// over the span, then three finer grids of 21 points over the two cells
// either side of the last best point, then a parabola through the best
// three (in log f and dB). Kept as the reference the faster search is
// held to.
func peakOfDense(r *ac.Response, lo, hi float64) (f, mag float64, ok bool) {
	const passes = 4
	a, b := math.Log(lo), math.Log(hi)
	for pass := 0; pass < passes; pass++ {
		step := (b - a) / (peakPoints - 1)
		best, bestMag := -1, -1.0
		mags := make([]float64, peakPoints)
		for i := range mags {
			mags[i] = magnitude(r, math.Exp(a+float64(i)*step))
			if math.IsNaN(mags[i]) {
				return 0, 0, false
			}
			if mags[i] > bestMag {
				best, bestMag = i, mags[i]
			}
		}
		if pass == 0 && (best == 0 || best == peakPoints-1) {
			return 0, 0, false
		}
		if pass < passes-1 {
			lo := max(best-1, 0)
			hi := min(best+1, peakPoints-1)
			a, b = a+float64(lo)*step, a+float64(hi)*step
			continue
		}
		x := a + float64(best)*step
		if best > 0 && best < peakPoints-1 {
			y0, y1, y2 := db(mags[best-1]), db(mags[best]), db(mags[best+1])
			if den := y0 - 2*y1 + y2; den < 0 {
				x += 0.5 * step * (y0 - y2) / den
			}
		}
		return math.Exp(x), magnitude(r, math.Exp(x)), true
	}
	return 0, 0, false
}

// The peak search that climbs its finer grids ends where the dense search
// (every point of every pass) ends, to the last bits, on the impedance of
// every net in the examples and in circuits with coupled and
// double-tuned tanks, over windows of a factor of nine from 1 kHz to
// 90 MHz (most hold no peak; those that do hold one or several) and a
// factor of 1.21 around each peak found (tankAt's first window).
func TestPeakOfIsTheDenseSearch(t *testing.T) {
	files := []string{
		"../../examples/club-receiver.toml", "../../examples/frequency-changer.toml",
		"../../examples/if-detector-audio.toml", "../../examples/transistor-front-end.toml",
		"testdata/incircuit-pair.toml", "testdata/converter-link.toml", "testdata/band-switch.toml",
	}
	peaks := 0
	for _, file := range files {
		c, err := graph.LoadFile(file)
		if err != nil {
			t.Fatal(err)
		}
		rs := ac.NewResponses(quiet(c))
		for _, n := range c.Nets {
			r, err := rs.Transimpedance(n.Name, n.Name, gangMid.options())
			if err != nil {
				continue
			}
			for lo := 1e3; lo < 1e8; lo *= 3 {
				f, ok := samePeak(t, file+" "+n.Name, r, lo, 9*lo)
				if ok {
					peaks++
					samePeak(t, file+" "+n.Name+" near", r, f/1.1, f*1.1)
				}
			}
		}
	}
	if peaks < 50 {
		t.Errorf("%d peaks found in the windows, want at least 50: the test compares too few", peaks)
	}
}

// samePeak runs both searches over lo..hi and fails unless they agree.
func samePeak(t *testing.T, what string, r *ac.Response, lo, hi float64) (float64, bool) {
	t.Helper()
	f, m, ok := peakOf(r, lo, hi)
	fd, md, okd := peakOfDense(r, lo, hi)
	if ok != okd || math.Abs(f-fd) > 1e-12*fd || math.Abs(m-md) > 1e-12*md {
		t.Errorf("%s %g..%g Hz: climbed %v %.15g Hz |Z| %.15g, dense %v %.15g Hz |Z| %.15g", what, lo, hi, ok, f, m, okd, fd, md)
	}
	return f, ok
}

// BenchmarkPeakOf is the peak search on the flagship's tanks as the
// tracking walk asks for them: the aerial (ST2's) and oscillator coils'
// impedance, devices quiet, in a window of ±10 % around the peak (tankAt's
// first), at 33 gang settings; "dense" is the search it replaced.
func BenchmarkPeakOf(b *testing.B) {
	c, err := graph.LoadFile("../../examples/club-receiver.toml")
	if err != nil {
		b.Fatal(err)
	}
	rs := ac.NewResponses(quiet(c))
	type job struct {
		r  *ac.Response
		f0 float64
	}
	var jobs []job
	for _, n := range c.Nets {
		for i := 0; i <= 32; i++ {
			r, err := rs.Transimpedance(n.Name, n.Name, gang{frac: float64(i) / 32}.options())
			if err != nil {
				continue
			}
			if f, _, ok := peakOfDense(r, 4e5, 3.6e6); ok {
				jobs = append(jobs, job{r, f})
			}
		}
	}
	if len(jobs) == 0 {
		b.Fatal("no tank peaks in the flagship")
	}
	for _, s := range []struct {
		name string
		find func(*ac.Response, float64, float64) (float64, float64, bool)
	}{{"climbed", peakOf}, {"dense", peakOfDense}} {
		b.Run(s.name, func(b *testing.B) {
			for range b.N {
				for _, j := range jobs {
					s.find(j.r, j.f0/1.1, j.f0*1.1)
				}
			}
			b.ReportMetric(float64(len(jobs)), "peaks/op")
		})
	}
}
