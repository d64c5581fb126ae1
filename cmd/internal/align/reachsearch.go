package align

import (
	"math"
	"strings"

	"pare/graph"
)

// The trimmer and the core together. With the trimmer at its least the
// tank spans the widest ratio of the dial, but also sits highest: a low end
// that the core cannot pull down from there may be reached with more
// trimmer capacitance, which lowers both ends (the top more) while the span
// stays wide enough. The bench alignment does just that (core at the
// bottom, trimmer at the top, repeated), so before saying alignment cannot
// reach the band, the trimmer's range is searched for a setting that,
// with some core setting within its travel, covers both ends; the pair
// found is then solved with both applied, and only a solved cover is
// reported as reached.

// reachTol is where the search for the largest trimmer setting that keeps
// the top end and the span stops: a step of the trimmer below 0.1 % of its
// range changes the ends by less than the band's rounding (bandSlack).
const reachTol = 0.001

// reachPass is the most solves the search spends: the margins are near
// linear in the trimmer's capacitance, so false position closes in a few.
const reachPass = 12

// spanAt is the tank's span (ratios to the captured solve applied to the
// dial ends' figures lo, hi) with the trimmer at t; ok false when unsolved.
type spanAt struct {
	t, lo, hi float64
	m0, m1    float64 // the tank's own peaks solved there (the search's guesses)
	ok        bool
}

// trimSearch holds what one reach search needs: the circuit, the tank's
// net, the trimmer, the captured solve's peaks and the dial ends' figures.
type trimSearch struct {
	c              *graph.Circuit
	net            string
	trimmer        *graph.Part
	s0, s1         float64 // the captured solve's peaks (gang full, least)
	lo, hi         float64 // the dial ends' figures as captured
	wLo, wHi, span float64 // the band's ends and the core's travel
}

// at solves the tank with the trimmer at t, its peaks searched near
// g0, g1 (gang full, least).
func (s trimSearch) at(t, g0, g1 float64) spanAt {
	moved := s.c.Clone()
	moved.Part(s.trimmer.Ref).Set = t
	m0, m1, ok := tankEndPeaks(moved, s.net, g0, g1)
	if !ok {
		return spanAt{t: t}
	}
	return spanAt{t: t, lo: s.lo * m0 / s.s0, hi: s.hi * m1 / s.s1, m0: m0, m1: m1, ok: true}
}

// between solves the tank at t between two solved settings: each peak
// lies between theirs (more trimmer lowers it), so it is searched there
// alone, with a margin, in fewer points than a search about a guess.
func (s trimSearch) between(t float64, a, b spanAt) spanAt {
	moved := s.c.Clone()
	moved.Part(s.trimmer.Ref).Set = t
	m0, ok0 := tankPeakIn(moved, s.net, 1, min(a.m0, b.m0)/betweenMargin, max(a.m0, b.m0)*betweenMargin, betweenSweep)
	m1, ok1 := tankPeakIn(moved, s.net, 0, min(a.m1, b.m1)/betweenMargin, max(a.m1, b.m1)*betweenMargin, betweenSweep)
	if !ok0 || !ok1 {
		return spanAt{t: t}
	}
	return spanAt{t: t, lo: s.lo * m0 / s.s0, hi: s.hi * m1 / s.s1, m0: m0, m1: m1, ok: true}
}

// betweenMargin widens a bracketed peak's search by 2 % either way, and
// betweenSweep is its points a pass: three passes over a bracket of a few
// per cent place a peak within a part in 10⁵, far inside bandSlack.
const (
	betweenMargin = 1.02
	betweenSweep  = 61
)

// margin is how far a span is from losing the top end: the least of its
// ratio over the band's (the core cannot widen it) and its top over the
// band's top with the core at the least inductance (the core raises the
// top by at most 1/√(1−span)). Both fall as the trimmer grows.
func (s trimSearch) margin(a spanAt) float64 {
	return min((a.hi/a.lo)/(s.wHi/s.wLo), a.hi/(s.wHi*math.Sqrt(1-s.span))) - 1
}

// largest is the largest trimmer setting in from..to (from's margin is
// not negative) whose margin is not negative, by false position (the
// Illinois variant, so one end does not stick); the bracket's low end
// always holds, so what it returns keeps the top end.
func (s trimSearch) largest(from, to spanAt) spanAt {
	if s.margin(to) >= 0 {
		return to
	}
	a, b := from, to
	ma, mb := s.margin(a), s.margin(b)
	for range reachPass {
		if b.t-a.t <= reachTol*(s.trimmer.Value.Max-s.trimmer.Value.Min) || s.margin(a) <= bandSlack {
			break // the held end is within the band's rounding of its edge
		}
		t := b.t - mb*(b.t-a.t)/(mb-ma)
		t = min(max(t, a.t+0.05*(b.t-a.t)), b.t-0.05*(b.t-a.t)) // keep off the ends
		x := s.between(t, a, b)
		if !x.ok {
			return x // unsolved: the search says so rather than guess
		}
		mx := s.margin(x)
		if mx >= 0 {
			a, ma = x, mx
			mb /= 2
		} else {
			b, mb = x, mx
			ma /= 2
		}
	}
	return a
}

// coreFor is the core's inductance ratio for span a that covers the band
// with the least turn from as captured, and whether one within the core's
// travel does: the core moves both ends by 1/√k.
func (s trimSearch) coreFor(a spanAt) (k float64, ok bool) {
	kMin, kMax := math.Pow(a.lo/s.wLo, 2), math.Pow(a.hi/s.wHi, 2)
	kMin, kMax = math.Max(kMin, 1-s.span), math.Min(kMax, 1+s.span)
	if kMin > kMax*(1+bandSlack) {
		return 1, false
	}
	return math.Max(kMin, math.Min(1, kMax)), true
}

// withCore is c with the core of p turned to scale its inductance by k:
// the windings the core tunes (every one for a whole core, else the
// windings adjust names, a centre-tapped winding's halves by its name).
func withCore(c *graph.Circuit, p *graph.Part, k float64) *graph.Circuit {
	m := c.Clone()
	q := m.Part(p.Ref)
	if len(q.Windings) == 0 {
		q.Value.Min, q.Value.Max = q.Value.Min*k, q.Value.Max*k
		return m
	}
	for i, w := range q.Windings {
		if coreTurns(q, w.Name) {
			q.Windings[i].L *= k
		}
	}
	return m
}

func coreTurns(p *graph.Part, winding string) bool {
	for _, a := range p.Adjust {
		if a == graph.CoreWhole || a == winding {
			return true
		}
		if len(winding) == len(a)+1 && strings.HasPrefix(winding, a) && strings.ContainsAny(winding[len(a):], "ab") {
			return true
		}
	}
	return false
}

func (s trimSearch) trimmerMin() float64 {
	if s.trimmer == nil {
		return 0
	}
	return s.trimmer.Value.Min
}

// search looks over the trimmer's range above least (whose margin holds)
// for the largest setting that keeps the top end, where the low end is
// lowest, and the core ratio that covers the band there; the pair is then
// solved with both applied, and returned only when that solve covers the
// band. top is the setting searched (ok false when unsolved).
func (s trimSearch) search(least spanAt, core *graph.Part) (*coreTrim, spanAt) {
	most := s.at(s.trimmer.Value.Max, s.s0, s.s1)
	if !most.ok {
		return nil, most
	}
	top := s.largest(least, most)
	if !top.ok {
		return nil, top
	}
	k, ok := s.coreFor(top)
	if !ok {
		return nil, top
	}
	m := s.c
	if core != nil && k != 1 {
		m = withCore(s.c, core, k)
	}
	got := trimSearch{c: m, net: s.net, trimmer: s.trimmer, s0: s.s0, s1: s.s1, lo: s.lo, hi: s.hi}.at(top.t, top.m0, top.m1)
	if !got.ok || got.lo > s.wLo*(1+bandSlack) || got.hi < s.wHi*(1-bandSlack) {
		return nil, top
	}
	on := math.Abs(got.lo/s.wLo-1) <= 2*bandSlack && math.Abs(got.hi/s.wHi-1) <= 2*bandSlack
	return &coreTrim{t: top.t, k: k, lo: got.lo, hi: got.hi, onEnds: on}, top
}
