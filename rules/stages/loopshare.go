package stages

import (
	"pare/graph"
	"pare/graph/ac"
)

// A loop the solver finds at a device may be another device's: one loop
// through two devices, or an oscillator's loop seen through a follower.

// sharedLoop reports whether another active part's loop runs at the
// frequency dev's does: one loop through two devices (a Wien bridge's
// second valve, an amplifier inside another's feedback path), where dev
// is an amplifier in the oscillator's loop, a stage of its own, and not a
// second oscillator. Each device's return ratio crosses 0° where the
// other's loading puts it, a little apart (1.2 % on testdata/osc/wien-bjt),
// so the frequencies need only agree within sharedLoopTol.
func sharedLoop(lp *ac.Loops, c *graph.Circuit, dev string, l Loop) bool {
	fMin, fMax, _, _, _ := l.Range()
	return otherLoopNear(lp, c, dev, fMin*(1-sharedLoopTol), fMax*(1+sharedLoopTol), func(string) bool { return true })
}

// otherLoopNear reports whether an active part other than dev has a loop
// whose 0° crossings reach into lo..hi and for which ok says yes.
func otherLoopNear(lp *ac.Loops, c *graph.Circuit, dev string, lo, hi float64, ok func(ref string) bool) bool {
	for _, q := range c.Parts {
		if q.Ref == dev || !q.IsActive() {
			continue
		}
		ql, err := loopOf(lp, q.Ref)
		if err != nil {
			continue
		}
		qMin, qMax, _, qBest, found := ql.Range()
		if found && qBest >= 0 && qMin <= hi && qMax >= lo && ok(q.Ref) {
			return true
		}
	}
	return false
}

// inheritedLoop reports whether dev's loop is another device's seen
// through it: dev closes no loop by its own gain (ac.OwnLoop, the others
// made passive) while another active part whose 0° point is within
// ac.InheritedSpan of dev's does, and that part's loop runs (margin 0 dB
// or more). An emitter follower fed from an RC oscillator's collector was
// flagged "oscillates … +26.4 dB … may squegg" for the oscillator's loop.
func inheritedLoop(lp *ac.Loops, c *graph.Circuit, dev string, l Loop) bool {
	fMin, fMax, _, _, _ := l.Range()
	// Its own loop, if it has one, sits near the crossing it shows (the
	// others' loading moves it a few per cent): searched an octave either
	// side, first, as a device with a loop of its own needs nothing more.
	opts := ac.LoopOptions{Options: ac.Options{VarFrac: 0.5, VarSet: true}, From: fMin / 2, To: fMax * 2}
	if own, _ := ac.OwnLoop(lp.Circuit(), dev, opts); own {
		return false
	}
	return otherLoopNear(lp, c, dev, fMin/ac.InheritedSpan, fMax*ac.InheritedSpan, func(ref string) bool {
		own, _ := ac.OwnLoop(lp.Circuit(), ref, opts)
		return own
	})
}

// sharedLoopTol: two devices' 0° points within 5 % are taken as one loop
// (common practice, no source: independent oscillators of one set, a local
// oscillator and a BFO, sit far further apart).
const sharedLoopTol = 0.05
