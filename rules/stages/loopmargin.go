package stages

import (
	"math"
	"math/cmplx"
)

// A feedback loop's stability margins, read off its return ratio T swept
// over frequency (Bode's margins, from memory; docs/references.md §49):
// where |T| falls to 1 the phase margin is how far T's phase is from
// 180°, and where the phase reaches 180° the gain margin is how far |T|
// is below 1. An audio amplifier's loop has both ends to watch: below the
// band its coupling capacitors and transformer inductances turn the
// phase one way, above it the leakage inductances and capacitors the
// other. The sweep starts at the frequency the feedback is quoted at,
// where the phase of a negative-feedback loop is near 0°, and walks out
// each way, the phase unwrapped point by point, so a loop whose phase has
// turned past 180° is not read as one that has turned back.

// The sweep's reach past the band's ends (three decades each way) and its
// step: 24 points a decade, halved where the phase moves more than
// maxPhaseStep between two points, down to a 64th of a step (a transformer's
// resonance turns the phase fast). Common practice for a Bode plot, no
// source.
const (
	marginReach    = 1e3
	marginPerDec   = 24
	maxPhaseStep   = 30.0
	marginMaxSplit = 6
)

// loopPoint is T at one frequency, its phase in degrees unwrapped from the
// quoted point.
type loopPoint struct {
	f     float64
	t     complex128
	phase float64
}

func (p loopPoint) mag() float64 { return cmplx.Abs(p.t) }

// marginSide is what the sweep found on one side of the quoted point:
// the first frequency where |T| crosses 1 and the phase margin there, the
// first where the phase crosses 180° and the gain margin there, and the
// sweep's last point, for saying what the loop does where nothing was
// found.
type marginSide struct {
	pm, pmAt float64
	pmFound  bool
	gm, gmAt float64
	gmFound  bool
	peak     float64 // the largest |T| on the side
	// over180At is where the phase first reached 180° with |T| still
	// above 1 (a conditionally stable loop's, where the phase turns back
	// before |T| falls to 1, an oscillating one's otherwise); 0 where it
	// did not
	over180At float64
	end       loopPoint
}

// point solves T at f, its phase unwrapped against prev.
func (l loopReturn) point(f float64, prev loopPoint) (loopPoint, bool) {
	t, ok := l.at(f)
	if !ok || t == 0 {
		return loopPoint{}, false
	}
	d := cmplx.Phase(t)*180/math.Pi - prev.phase
	d -= 360 * math.Round(d/360)
	return loopPoint{f: f, t: t, phase: prev.phase + d}, true
}

// side walks from p0 to fEnd (above or below p0.f), each step split where
// the phase moves too far to unwrap safely, and reads the margins.
func (l loopReturn) side(p0 loopPoint, fEnd float64) (marginSide, bool) {
	n := int(math.Ceil(math.Abs(math.Log10(fEnd/p0.f)) * marginPerDec))
	ratio := math.Pow(fEnd/p0.f, 1/float64(n))
	s := marginSide{peak: p0.mag(), end: p0}
	prev := p0
	for k := 1; k <= n && !(s.pmFound && s.gmFound); k++ {
		pts, ok := l.step(prev, prev.f*ratio, marginMaxSplit)
		if !ok {
			return s, false
		}
		for _, next := range pts {
			s.read(l, prev, next)
			prev = next
		}
	}
	s.end = prev
	return s, true
}

// step solves the points from prev to f: f itself, after midpoints where
// the phase moves more than maxPhaseStep, each unwrapped against the one
// before it.
func (l loopReturn) step(prev loopPoint, f float64, depth int) ([]loopPoint, bool) {
	next, ok := l.point(f, prev)
	if !ok {
		return nil, false
	}
	if depth == 0 || math.Abs(next.phase-prev.phase) <= maxPhaseStep {
		return []loopPoint{next}, true
	}
	first, ok := l.step(prev, math.Sqrt(prev.f*f), depth-1)
	if !ok {
		return nil, false
	}
	rest, ok := l.step(first[len(first)-1], f, depth-1)
	return append(first, rest...), ok
}

// read takes the margins a step from a to b crosses: the first |T| = 1,
// and the first 180° with |T| below 1. A 180° with |T| above 1 before
// that is a conditionally stable loop's, or an oscillating one's (its
// phase margin says which): noted, not a margin.
func (s *marginSide) read(l loopReturn, a, b loopPoint) {
	s.peak = math.Max(s.peak, b.mag())
	if !s.pmFound && (a.mag()-1)*(b.mag()-1) <= 0 && a.mag() != b.mag() {
		p := l.bisect(a, b, func(p loopPoint) float64 { return p.mag() - 1 })
		s.pm, s.pmAt, s.pmFound = 180-math.Abs(p.phase), p.f, true
	}
	if s.gmFound || (math.Abs(a.phase)-180)*(math.Abs(b.phase)-180) > 0 || a.phase == b.phase {
		return
	}
	p := l.bisect(a, b, func(p loopPoint) float64 { return math.Abs(p.phase) - 180 })
	if p.mag() >= 1 {
		if s.over180At == 0 {
			s.over180At = p.f
		}
		return
	}
	s.gm, s.gmAt, s.gmFound = -20*math.Log10(p.mag()), p.f, true
}

// bisect finds where g changes sign between a and b, halving the step in
// log frequency 24 times (a factor of 10^(1/24) split to parts in 10^8).
func (l loopReturn) bisect(a, b loopPoint, g func(loopPoint) float64) loopPoint {
	for range 24 {
		m, ok := l.point(math.Sqrt(a.f*b.f), a)
		if !ok {
			break
		}
		if g(a)*g(m) <= 0 {
			b = m
		} else {
			a = m
		}
	}
	if math.Abs(g(a)) < math.Abs(g(b)) {
		return a
	}
	return b
}

// loopMargins is the sweep both ways from f over band's reach.
func (l loopReturn) margins(f, lo, hi float64) (below, above marginSide, ok bool) {
	t0, ok := l.at(f)
	if !ok || t0 == 0 {
		return below, above, false
	}
	p0 := loopPoint{f: f, t: t0, phase: cmplx.Phase(t0) * 180 / math.Pi}
	below, ok1 := l.side(p0, lo/marginReach)
	above, ok2 := l.side(p0, hi*marginReach)
	return below, above, ok1 && ok2
}
