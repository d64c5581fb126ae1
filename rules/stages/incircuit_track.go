package stages

import (
	"math"
	"sort"

	"pare/graph"
	"pare/graph/ac"
)

// In-circuit tracking. The oscillator and the signal tank a gang turns
// together are solved as each sits in the circuit, at settings across the
// whole travel: the signal tank's frequency is the peak of the impedance
// across its coil with the devices quiet; the oscillator's is where its
// device's loop phase is 0° (as the oscillator's own f is: the grid
// coupling and the reaction winding's phase move it off its tank's peak,
// 2 % on review20 a05, four times the set's real tracking error), or its
// tank's peak where no running device is found. So every stray and load
// the circuit puts across either tank counts. The tracking
// error fosc − (fsig + IF) then comes from the same circuit that gives the
// oscillator's and the signal tank's ranges; the parts' formula stays
// beside it as the cross-check.

// trackSettings is how many steps the solver's dial walk takes: a broadcast
// gang's error curve crosses zero at most three times, and 32 steps keep two
// crossings of a customary design (6 %, 49 %, 91.5 % of the range) at least
// four steps apart. trackRefine is the bisection steps on a crossing:
// 2⁻¹² of a step, far below a hertz on the dial.
const (
	trackSettings = 32
	trackRefine   = 12
)

// dialCurve gives, at a gang setting th (0 at least capacitance), the
// signal tank's frequency and the oscillator's; ok is false where either
// is not found.
type dialCurve func(th float64) (fs, fo float64, ok bool)

// trackWalk is a tracking curve as walked over the dial: the worst error
// and the signal frequency where it occurs, the signal frequencies where
// the error crosses zero (low to high), and the frequencies at the two
// ends of the travel (index 0 at least capacitance).
type trackWalk struct {
	worst, worstAt float64
	worstTh        float64 // the gang setting of the worst error
	fits           []float64
	fs, fo         [2]float64
	// bwAtWorst is the signal tank's loaded −3 dB bandwidth in circuit at
	// the worst setting (the solver's walk only; 0 when not found).
	bwAtWorst float64
	// oscDev is the device whose loop gave the oscillator's frequency
	// (the solver's walk only; "" when it was the tank's peak).
	oscDev string
}

// walkDial walks curve at n+1 settings from least to full capacitance: the
// worst error over them, and each sign change of the error narrowed by
// refine bisections. ok is false where the curve fails at any setting.
func walkDial(curve dialCurve, ifHz float64, n, refine int) (trackWalk, bool) {
	var w trackWalk
	errAt := func(th float64) (e, fs float64, ok bool) {
		fs, fo, ok := curve(th)
		return fo - (fs + ifHz), fs, ok
	}
	prevE := 0.0
	for i := 0; i <= n; i++ {
		th := float64(i) / float64(n)
		e, fs, ok := errAt(th)
		if !ok {
			return w, false
		}
		if i == 0 || i == n {
			k := i / n
			w.fs[k], w.fo[k] = fs, e+fs+ifHz
		}
		if i == 0 || math.Abs(e) > math.Abs(w.worst) {
			w.worst, w.worstAt, w.worstTh = e, fs, th
		}
		switch {
		case e == 0:
			w.fits = append(w.fits, fs)
		case i > 0 && prevE != 0 && math.Signbit(e) != math.Signbit(prevE):
			f, ok := narrowCrossing(errAt, float64(i-1)/float64(n), th, prevE, refine)
			if !ok {
				return w, false
			}
			w.fits = append(w.fits, f)
		}
		prevE = e
	}
	sort.Float64s(w.fits)
	return w, true
}

// narrowCrossing bisects lo..hi (the error elo at lo, of the other sign at
// hi) and returns the signal frequency at the middle of the last interval.
func narrowCrossing(errAt func(float64) (float64, float64, bool), lo, hi, elo float64, refine int) (float64, bool) {
	for range refine {
		mid := (lo + hi) / 2
		em, _, ok := errAt(mid)
		if !ok {
			return 0, false
		}
		if math.Signbit(em) == math.Signbit(elo) {
			lo, elo = mid, em
		} else {
			hi = mid
		}
	}
	_, fs, ok := errAt((lo + hi) / 2)
	return fs, ok
}

// tankNets are a tank's coil ends as the solver names them: hot off
// ground, other "" where that end is the ground.
type tankNets struct{ hot, other string }

// tankNetsOf names the folded nets a and b for the solver; ok is false when
// neither is off ground.
func (x *figCtx) tankNetsOf(a, b int) (tankNets, bool) {
	if a == groundNet {
		a, b = b, a
	}
	t := tankNets{hot: x.netName(a), other: x.netName(b)}
	return t, t.hot != ""
}

// tankResponse is the impedance across a tank at gang setting g: from its
// hot end to ground, or across both ends where neither is ground. rs is
// the circuit the tank is solved in, elaborated once per gang setting for
// every tank and search that asks (a walk over the dial solves two tanks
// at each of its settings, and a design's bisection comes back to the
// walk's settings).
func tankResponse(rs *ac.Responses, t tankNets, g gang) (*ac.Response, error) {
	if t.other == "" {
		return rs.Transimpedance(t.hot, t.hot, g.options())
	}
	return rs.Across(t.hot, t.other, g.options())
}

// tankAt is a tank's resonance in circuit c at gang setting frac: the peak
// of its impedance nearest guess, searched within a factor trackNear of
// it, then 1.5, then tankSearch. The nearest first: the other tank's
// resonance shows through the coupling between them (strongest where a
// winding has no loss), and can stand higher than this one's own.
func tankAt(rs *ac.Responses, t tankNets, frac, guess float64) (float64, bool) {
	r, err := tankResponse(rs, t, gang{frac: frac})
	if err != nil || !(guess > 0) {
		return 0, false
	}
	for _, k := range []float64{trackNear, 1.5, tankSearch} {
		if f, _, ok := peakOf(r, guess/k, guess*k); ok {
			return f, true
		}
	}
	return 0, false
}

// trackNear is the first search window of tankAt: well inside the ratio of
// an oscillator to its signal tank (at least (1.6 + 0.455)/1.6 = 1.28 on a
// broadcast band), well outside the step of a guess carried from the last
// setting solved (a few parts in a thousand).
const trackNear = 1.1

// follow is a guess for a tank's frequency at setting th: the last solved
// frequency moved as the formula moves between the two settings, the
// formula's own before the first solve. It keeps the search on the same
// peak across the dial.
type follow struct {
	formula      func(th float64) float64
	lastTh, last float64
}

func (g *follow) at(th float64) float64 {
	if g.last == 0 {
		return g.formula(th)
	}
	return g.last * g.formula(th) / g.formula(g.lastTh)
}

func (g *follow) solved(th, f float64) { g.lastTh, g.last = th, f }

// solveTracking walks the dial in circuit: the oscillator tank osc and the
// signal tank the same gang turns, each found in the circuit the solver
// sees, with the formula models (sigF, oscF, in the original circuit) as
// the guesses where to look. ok is false when either tank is not found in
// the reduced circuit or a peak is missing.
func (x *figCtx) solveTracking(osc, sigF, oscF *tankModel, ifHz float64) (trackWalk, bool) {
	tp, ok := x.trackPair(osc)
	if !ok {
		return trackWalk{}, false
	}
	rs, sn, on := tp.rs, tp.sn, tp.on
	if dev := tp.dev; dev != "" {
		lp := ac.NewLoops(tp.live)
		gs, gosc := &follow{formula: sigF.f}, &follow{formula: oscF.f}
		curve := func(th float64) (float64, float64, bool) {
			// the pair's modes keep the signal tank on its own peak;
			// the tank's peak is the loop's guess
			fs, fp, ok1 := pairAt(rs, sn, on, th, gs.at(th), gosc.at(th))
			if !ok1 {
				return 0, 0, false
			}
			fo, ok2 := loopAt(lp, dev, th, fp)
			if ok2 {
				gs.solved(th, fs)
				gosc.solved(th, fp)
			}
			return fs, fo, ok2
		}
		if walk, ok := walkDial(curve, ifHz, trackSettings, trackRefine); ok {
			walk.bwAtWorst = tankBandwidth(rs, sn, walk.worstTh, walk.worstAt)
			walk.oscDev = dev
			return walk, true
		}
	}
	gs, gosc := &follow{formula: sigF.f}, &follow{formula: oscF.f}
	curve := func(th float64) (float64, float64, bool) {
		fs, fo, ok := pairAt(rs, sn, on, th, gs.at(th), gosc.at(th))
		if ok {
			gs.solved(th, fs)
			gosc.solved(th, fo)
		}
		return fs, fo, ok
	}
	walk, ok := walkDial(curve, ifHz, trackSettings, trackRefine)
	if ok {
		walk.bwAtWorst = tankBandwidth(rs, sn, walk.worstTh, walk.worstAt)
	}
	return walk, ok
}

// loopAt is where device dev's loop phase is 0° at gang setting th: the
// crossing nearest guess within a factor trackNear of it, where the loop
// gain is above 1 (the oscillator runs there). ok is false when there is
// none.
func loopAt(lp *ac.Loops, dev string, th, guess float64) (float64, bool) {
	if !(guess > 0) {
		return 0, false
	}
	r, err := lp.Find(dev, ac.LoopOptions{Options: ac.Options{VarFrac: th, VarSet: true},
		From: guess / trackNear, To: guess * trackNear})
	if err != nil {
		return 0, false
	}
	best := 0.0
	for _, c := range r.Crossings {
		if c.GainDB > 0 && (best == 0 || math.Abs(math.Log(c.F/guess)) < math.Abs(math.Log(best/guess))) {
			best = c.F
		}
	}
	return best, best > 0
}

// runningOscillator is the device whose loop runs near the oscillator
// tank's peak at least capacitance (guess the formula's frequency there):
// the stage's own oscillator when a loop found it, else among the solver
// circuit's devices the one whose running crossing lies nearest the peak.
// "" when none runs within trackNear of it: the walk then takes the
// tank's peak.
func (x *figCtx) runningOscillator(tp trackPairs, guess float64) string {
	peak, ok := tankAt(tp.rs, tp.on, 0, guess)
	if !ok {
		return ""
	}
	lp := ac.NewLoops(tp.live)
	best, bestD := "", math.Inf(1)
	for _, p := range tp.live.Parts {
		if !p.IsActive() || (x.oscDev != "" && p.Ref != x.oscDev) {
			continue
		}
		if f, ok := loopAt(lp, p.Ref, 0, peak); ok && math.Abs(math.Log(f/peak)) < bestD {
			best, bestD = p.Ref, math.Abs(math.Log(f/peak))
		}
	}
	return best
}

// trackPairs is the circuit the tracking walk solves (the solver's,
// devices quiet), its responses and its two tanks' nets.
type trackPairs struct {
	c      *graph.Circuit
	rs     *ac.Responses
	sn, on tankNets
	// live is the same circuit with its devices running, dev the device
	// whose loop runs the oscillator there ("" when none is found: the
	// oscillator's frequency is then its tank's peak).
	live *graph.Circuit
	dev  string
}

// trackPair finds the signal tank ganged to the oscillator tank osc in the
// reduced circuit and names both for the solver; ok is false when the
// solver is off or either is missing. The walk and the design ask for the
// same pair and share its circuit's responses.
func (x *figCtx) trackPair(osc *tankModel) (trackPairs, bool) {
	if x.pair == nil || x.pair.osc != osc {
		tp, ok := x.findTrackPair(osc)
		x.pair = &trackPairMemo{osc: osc, tp: tp, ok: ok}
	}
	return x.pair.tp, x.pair.ok
}

// trackPairMemo is the pair trackPair found for an oscillator tank.
type trackPairMemo struct {
	osc *tankModel
	tp  trackPairs
	ok  bool
}

// findTrackPair is trackPair, found afresh.
func (x *figCtx) findTrackPair(osc *tankModel) (trackPairs, bool) {
	gangCap := gangSection(osc.caps)
	if !x.solve || gangCap == nil {
		return trackPairs{}, false
	}
	sig := findGangTank(x.w, gangCap, osc.caps)
	if sig == nil {
		return trackPairs{}, false
	}
	on, ok1 := x.tankNetsOf(osc.a, osc.b)
	sn, ok2 := x.tankNetsOf(sig.a, sig.b)
	if !ok1 || !ok2 {
		return trackPairs{}, false
	}
	c := quiet(x.solverCircuit())
	tp := trackPairs{c: c, rs: ac.NewResponses(c), sn: sn, on: on, live: x.solverCircuit()}
	tp.dev = x.runningOscillator(tp, osc.f(0))
	if tp.dev == "" && x.oscDev != "" && x.w.orig != nil {
		// The reduction can take away part of a loop the stage's own
		// figures solve on the original: a pentagrid's oscillator anode
		// (g2), dropped as a static electrode at AC ground, no longer
		// sends its current through a Hartley's cathode tap (review23
		// a05: +15.8 dB on the original, −1.9 dB reduced). The walk then
		// finds the oscillator where the stage's loop was solved, on the
		// original circuit, so its ends are the stage's osc f.
		whole := tp
		whole.live = x.w.orig.c
		if whole.dev = x.runningOscillator(whole, osc.f(0)); whole.dev != "" {
			tp = whole
		}
	}
	return tp, true
}

// tankBandwidth is a tank's loaded −3 dB bandwidth in circuit c at gang
// setting th, from the peak of its impedance near f: the band a signal
// must fall in to be passed at no more than 3 dB down. 0 when a −3 dB
// point is missing.
func tankBandwidth(rs *ac.Responses, t tankNets, th, f float64) float64 {
	r, err := tankResponse(rs, t, gang{frac: th})
	if err != nil {
		return 0
	}
	f0, mag, ok := peakOf(r, f/trackNear, f*trackNear)
	if !ok {
		return 0
	}
	q := qOfPeak(r, f0, mag, f0/tankSearch, f0*tankSearch)
	if math.IsNaN(q) || q <= 0 {
		return 0
	}
	return f0 / q
}

// gangSection is the first ganged variable capacitor among caps, nil when
// there is none.
func gangSection(caps []*graph.Part) *graph.Part {
	for _, p := range caps {
		if p.Gang != "" && p.Type == graph.CapVariable {
			return p
		}
	}
	return nil
}
