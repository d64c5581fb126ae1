package align

import (
	"fmt"
	"math"
	"math/cmplx"

	"pare/graph"
	"pare/graph/ac"
)

// What the adjusters reach. A tuned circuit that falls short of a dial end
// as captured may still be brought to it by the parts alignment turns:
// its trimmer (the top of the dial) and its coil's core (both ends). Before
// saying alignment cannot reach an end, the circuit is solved with the
// trimmer at the least of its range: that sets the widest span of the dial
// the tank can cover, which the core cannot change (a core scales the
// coil's inductance, so it moves both ends by the same ratio); the core
// then slides that span, within what a core moves.

// coreSpan is how far an adjustable core moves a coil's inductance either
// way: about ±10 % for the dust-iron and ferrite slugs of broadcast coils
// (common practice, from memory).
const coreSpan = 0.10

// reachSweep is the points of each pass of the search for a tank's peak:
// the first over a factor reachWindow either side of a guess (a trimmer
// from its setting to its least moves the top of the dial by half as much
// again), each next over two steps of the last round its best.
const (
	reachSweep  = 401
	reachWindow = 2.0
	reachPasses = 3
)

// reachOf says whether the tank on gang section gang, which covers lo..hi
// as captured (the dial ends' figures), can cover wLo..wHi with its
// trimmer and core: the span with the trimmer at its least (solved in
// circuit, as ratios to the tank's own solve as captured, so whatever the
// ends' figures were read from carries over) and the core's inductance
// ratio k that places it. ok is false when the tank could not be solved.
type tankReach struct {
	lo, hi  float64 // the span with the trimmer at its least, core as captured
	k       float64 // the core's inductance ratio that places it (1 without a core)
	trimmer *graph.Part
	core    *graph.Part
	reaches bool
	// found is the trimmer setting and core ratio the search over both
	// found when the trimmer at its least was not enough (reachsearch.go),
	// with the span solved with both applied; nil when not searched or
	// not found. top is the largest trimmer setting that keeps the top
	// end, searched (top.ok false when the search could not solve it).
	found    *coreTrim
	top      spanAt
	searched bool
}

// coreTrim is a pair of settings, trimmer t and core ratio k, and the
// span solved with both applied.
type coreTrim struct {
	t, k, lo, hi float64
	onEnds       bool // both ends on the band's (the span just holds it)
}

func reachOf(c *graph.Circuit, gang *graph.Part, lo, hi, wLo, wHi float64) (tankReach, bool) {
	// The tank's parts as the switches leave them: a wavechange wafer
	// between the gang section's padder and the coil hides the coil (and
	// its core) from a search on the circuit as drawn.
	net := hotNet(c, gang)
	sc := switched(c)
	// The tank is solved quiet, every device's gain taken out and its
	// resistances kept, as a dip meter finds it with the set off: an
	// oscillator's own loop, closed, makes the impedance at its tank
	// regenerative and its peaks the loop's (review23 b02's oscillator tank
	// peaked at 1.26 and 2.52 MHz live where it resonates at 1.00 and
	// 2.01 MHz), and only the ratios of the tank's own peaks are used.
	c = quietened(c)
	if sg := sc.Part(gang.Ref); sg != nil {
		gang = sg // its nets as the switches join them
	}
	t := tankOn(sc, gang)
	r := tankReach{lo: lo, hi: hi, k: 1, trimmer: t.trimmer}
	if t.coil != nil && len(t.coil.Adjust) > 0 {
		r.core = t.coil
	}
	span := 0.0
	if r.core != nil {
		span = coreSpan
	}
	s := trimSearch{c: c, net: net, trimmer: t.trimmer, lo: lo, hi: hi, wLo: wLo, wHi: wHi, span: span}
	var least spanAt
	if t.trimmer != nil && t.trimmer.Value.IsSpan() {
		moved := c.Clone()
		moved.Part(t.trimmer.Ref).Set = t.trimmer.Value.Min
		s0, s1, ok1 := tankEndPeaks(c, net, lo, hi)
		m0, m1, ok2 := tankEndPeaks(moved, net, s0, s1)
		if !ok1 || !ok2 {
			return r, false
		}
		r.lo, r.hi = lo*m0/s0, hi*m1/s1
		s.s0, s.s1, least.m0, least.m1 = s0, s1, m0, m1
	}
	// the core scales L by k: both ends move by 1/√k
	least.t, least.lo, least.hi, least.ok = s.trimmerMin(), r.lo, r.hi, true
	r.k, r.reaches = s.coreFor(least)
	if r.reaches || t.trimmer == nil || !t.trimmer.Value.IsSpan() || s.margin(least) < 0 {
		return r, true
	}
	r.found, r.top = s.search(least, r.core)
	r.searched = true
	r.reaches = r.found != nil
	return r, true
}

// tankEndPeaks is the peak of |Z| at net with the gang at both ends,
// searched near the dial ends' figures lo (gang full) and hi (gang least).
func tankEndPeaks(c *graph.Circuit, net string, lo, hi float64) (fLo, fHi float64, ok bool) {
	fLo, ok1 := tankPeak(c, net, 1, lo)
	fHi, ok2 := tankPeak(c, net, 0, hi)
	return fLo, fHi, ok1 && ok2
}

// tankPeak is the largest |Z| at net within a factor reachWindow of guess
// with the gang at frac; ok is false when it lies at the search's edge.
func tankPeak(c *graph.Circuit, net string, frac, guess float64) (float64, bool) {
	return tankPeakIn(c, net, frac, guess/reachWindow, guess*reachWindow, reachSweep)
}

// tankPeakIn is tankPeak over lo..hi with n points a pass.
func tankPeakIn(c *graph.Circuit, net string, frac, lo, hi float64, n int) (float64, bool) {
	best := 0.0
	for pass := range reachPasses {
		freqs := make([]float64, n)
		for i := range freqs {
			freqs[i] = lo * math.Pow(hi/lo, float64(i)/float64(n-1))
		}
		zs, err := ac.Impedance(c, net, freqs, ac.Options{VarFrac: frac, VarSet: true})
		if err != nil {
			return 0, false
		}
		at := 0
		for i, z := range zs {
			if cmplx.Abs(z) > cmplx.Abs(zs[at]) {
				at = i
			}
		}
		if at == 0 || at == len(zs)-1 {
			if pass == 0 {
				return 0, false
			}
			return freqs[at], true
		}
		best, lo, hi = freqs[at], freqs[at-1], freqs[at+1]
	}
	return best, true
}

// words says what the adjusters do about a tank's shortfall: the span
// with the trimmer at the least of its range, and the core that slides it
// onto the band.
func (r tankReach) words() string {
	if f := r.found; f != nil {
		w := fmt.Sprintf("with %s at %s", r.trimmer.Ref, pf(f.t))
		if r.core != nil && f.k != 1 {
			w += fmt.Sprintf(" and the core of %s at %+.1f %% of its inductance", r.core.Ref, 100*(f.k-1))
		}
		over := "over the band"
		if f.onEnds {
			w += ", where the alignment's repeated steps settle,"
			over = "the band's ends"
		}
		keeps := "the top end holds"
		if r.core != nil {
			keeps = "the core keeps the top end"
		}
		return w + fmt.Sprintf(" the tank tunes %s to %s in circuit (solved with both), %s: the trimmer at its least (%s) leaves the low end at %s with the core as captured, and more trimmer lowers it while %s",
			hz(f.lo), hz(f.hi), over, pf(r.trimmer.Value.Min), hz(r.lo), keeps)
	}
	span := fmt.Sprintf("the tank spans %s to %s in circuit", hz(r.lo), hz(r.hi))
	if r.trimmer != nil {
		span = fmt.Sprintf("with %s at the least of its range (%s) %s", r.trimmer.Ref, pf(r.trimmer.Value.Min), span)
	}
	if r.core != nil && r.k != 1 {
		span += fmt.Sprintf(", wider than the band, and the core of %s (±%.0f %% of its inductance, common practice) can slide such a span onto it",
			r.core.Ref, 100*coreSpan)
	}
	return span
}

// limitWords says how far the adjusters go when they fall short: the span
// with the trimmer at its least, and the core's limits on it. With a core
// the claim is whole (a core cannot widen the span); without one only the
// trimmer's end was solved, and a trimmer trades one end for the other.
func (r tankReach) limitWords() string {
	w := fmt.Sprintf("the tank spans %s to %s in circuit", hz(r.lo), hz(r.hi))
	if r.trimmer != nil {
		w = fmt.Sprintf("with %s at the least of its range (%s) %s", r.trimmer.Ref, pf(r.trimmer.Value.Min), w)
	}
	if r.searched {
		return w + r.searchedWords()
	}
	if r.core != nil {
		return w + fmt.Sprintf(", and no setting of the core of %s within ±%.0f %% of its inductance (common practice) slides that span over the band: alignment cannot reach that end of the dial", r.core.Ref, 100*coreSpan)
	}
	return w + ", with no adjustable core to slide that span: the trimmer trades one end for the other, so alignment may not reach both ends"
}

// searchedWords says why the search over the trimmer and the core found
// no cover: at the largest trimmer setting that keeps the top end (where
// the low end is lowest) the core's travel does not bring the low end
// down to the band's; or the search could not solve the tank.
func (r tankReach) searchedWords() string {
	if !r.top.ok {
		return fmt.Sprintf("; pare could not solve the tank with %s at %s (its peak left the search), so it cannot say whether more trimmer and the core reach the band: check the dial ends with a generator", r.trimmer.Ref, pf(r.top.t))
	}
	core, pair := "(no adjustable core is captured)", "no setting of %s (%s to %s) covers both ends"
	if r.core != nil {
		core = fmt.Sprintf("even with the core of %s at +%.0f %% of its inductance (common practice)", r.core.Ref, 100*coreSpan)
		pair = "no pair of settings of %s (%s to %s) and the core covers both ends"
	}
	pair = fmt.Sprintf(pair, r.trimmer.Ref, pf(r.trimmer.Value.Min), pf(r.trimmer.Value.Max))
	at := fmt.Sprintf("at %s, the most that keeps the top end", pf(r.top.t))
	if r.top.t >= r.trimmer.Value.Max {
		at = fmt.Sprintf("at the most of its range (%s)", pf(r.top.t))
	}
	return fmt.Sprintf("; with %s %s, the low end stays at %s %s: %s, so alignment cannot reach the dial's ends",
		r.trimmer.Ref, at, hz(r.top.lo/math.Sqrt(1+r.coreSpanOf())), core, pair)
}

func (r tankReach) coreSpanOf() float64 {
	if r.core != nil {
		return coreSpan
	}
	return 0
}
