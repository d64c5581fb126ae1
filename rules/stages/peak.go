package stages

import (
	"math"

	"pare/graph/ac"
)

// peakPoints is the number of points of each pass of a peak search, and
// peakPasses the passes: each narrows the span to two cells of the last,
// a tenth, so four passes over a span of a factor of nine leave cells of
// 10⁻⁴ in log f, and the parabola through the best three a good deal
// less (enough to meet ngspice to 2·10⁻⁶).
const (
	peakPoints = 21
	peakPasses = 4
)

// peakOf finds the frequency in lo..hi where |r| is largest: a log grid over
// the span, then finer grids over the cells either side of the best
// point, then a parabola through the best three (in log f and dB). ok is
// false when the largest value sits on an end of lo..hi (no peak inside)
// or the solver fails.
//
// Every grid but the last is solved at every point: they decide which
// peak of the span is found (a double-humped IF transformer's two humps,
// 1.2 % apart, stand together in the third grid's span of two cells of
// the second, and only its every point tells the higher; the climb below
// found the lower, TestPeakOfIsTheDenseSearch). The last grid spans two
// cells of the third, 2·10⁻³ of a window of a factor of nine: one peak
// there, so its highest point is the one a climb stops on, started from
// the point nearest the vertex of the parabola through the third grid's
// best three and solving only the points it visits (three or four of 21).
// The search ends on the grid point and parabola the dense passes gave,
// with some 68 solves where they took 85.
func peakOf(r *ac.Response, lo, hi float64) (f, mag float64, ok bool) {
	p := &peakGrid{r: r}
	p.span(math.Log(lo), math.Log(hi))
	best, ok := p.every()
	if !ok || best == 0 || best == peakPoints-1 {
		return 0, 0, false
	}
	for pass := 1; pass < peakPasses; pass++ {
		guess := p.vertex(best)
		p.span(p.at(max(best-1, 0)), p.at(min(best+1, peakPoints-1)))
		if pass < peakPasses-1 {
			best, ok = p.every()
		} else {
			best, ok = p.climb(guess)
		}
		if !ok {
			return 0, 0, false
		}
	}
	x := p.vertex(best)
	return math.Exp(x), magnitude(r, math.Exp(x)), true
}

// peakGrid is one pass of a peak search: peakPoints points from a in log f,
// step apart, and |r| at those solved so far.
type peakGrid struct {
	r       *ac.Response
	a, step float64
	mags    [peakPoints]float64
	solved  [peakPoints]bool
}

// span makes the grid from a to b, nothing solved.
func (p *peakGrid) span(a, b float64) {
	p.a, p.step = a, (b-a)/(peakPoints-1)
	p.solved = [peakPoints]bool{}
}

func (p *peakGrid) at(i int) float64 { return p.a + float64(i)*p.step }

// mag is |r| at point i, solved once; ok is false where the solver fails.
func (p *peakGrid) mag(i int) (float64, bool) {
	if !p.solved[i] {
		p.mags[i], p.solved[i] = magnitude(p.r, math.Exp(p.at(i))), true
	}
	return p.mags[i], !math.IsNaN(p.mags[i])
}

// every solves every point and returns the first highest.
func (p *peakGrid) every() (int, bool) {
	best, bestMag := -1, -1.0
	for i := range peakPoints {
		m, ok := p.mag(i)
		if !ok {
			return 0, false
		}
		if m > bestMag {
			best, bestMag = i, m
		}
	}
	return best, true
}

// climb starts at the point nearest guess (log f) and steps to a higher
// neighbour until neither is higher: the first highest point where the
// grid holds one peak (an equal point before wins, as in every).
func (p *peakGrid) climb(guess float64) (int, bool) {
	i := min(max(int(math.Round((guess-p.a)/p.step)), 0), peakPoints-1)
	for {
		m, ok := p.mag(i)
		if !ok {
			return 0, false
		}
		if i > 0 {
			l, ok := p.mag(i - 1)
			if !ok {
				return 0, false
			}
			if l >= m {
				i--
				continue
			}
		}
		if i < peakPoints-1 {
			h, ok := p.mag(i + 1)
			if !ok {
				return 0, false
			}
			if h > m {
				i++
				continue
			}
		}
		return i, true
	}
}

// vertex is the top of the parabola through point best and its two
// neighbours (in log f and dB), best itself where it sits on an end or the
// three do not bow up; the neighbours are solved already.
func (p *peakGrid) vertex(best int) float64 {
	x := p.at(best)
	if best > 0 && best < peakPoints-1 {
		y0, y1, y2 := db(p.mags[best-1]), db(p.mags[best]), db(p.mags[best+1])
		if den := y0 - 2*y1 + y2; den < 0 {
			x += 0.5 * p.step * (y0 - y2) / den
		}
	}
	return x
}
