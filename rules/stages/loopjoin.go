package stages

import (
	"fmt"
	"math"
	"slices"

	"pare/graph"
	"pare/graph/ac"
	"pare/graph/figure"
)

// One loop through several devices. Two amplifying stages with an RC
// network from the second output back to the first control electrode (a
// Wien bridge, drawn as a pattern knows it or not) each show a loop at the
// same frequency: it is one loop, seen from each device, and one
// oscillator; the second device, even where a pattern names it an
// amplifier, is not an oscillator of its own. Its margin is not either
// device's gm margin: breaking a device's controlled source breaks every
// loop through it, the gain-setting negative feedback too, so the return
// ratio read there is the open amplifier's (+13.9 and +35.8 dB on
// review23 b01, where the loop broken at the Wien series arm, the negative
// feedback closed, has +0.8 dB). The loop is broken where a technician
// breaks it (wholeLoop).

// joinedLoop is the stage in out whose loop is dev's: an oscillator found
// by its loop whose device's 0° point is within joinLoopTol of dev's,
// where neither device closes a loop by its own gain (ac.OwnLoop): the
// loop needs both. Two oscillators that each run alone stay two.
func joinedLoop(lp *ac.Loops, out []*found, dev string, l Loop) *found {
	fMin, fMax, _, _, ok := l.Range()
	if !ok {
		return nil
	}
	lo, hi := fMin*(1-joinLoopTol), fMax*(1+joinLoopTol)
	for _, f := range out {
		if f.Topology != loopTopology || len(f.Loop) == 0 {
			continue
		}
		q := f.Loop[0]
		qMin, qMax, _, _, ok := q.Range()
		if !ok || qMin > hi || qMax < lo {
			continue
		}
		if ownLoop(lp, dev, l) || ownLoop(lp, q.Device, q) {
			continue
		}
		return f
	}
	return nil
}

// joinLoopTol is how far apart two devices' 0° points may lie and still
// be one loop seen from each: breaking one device's controlled source
// also opens the negative feedback the other's stage sets its gain by, and
// the two breaks load the Wien arms differently, so each reads the shared
// loop's frequency off by some per cent (a blind reviewer's 12 V Wien
// oscillator: 1.172 and 1.067 kHz from its two transistors, 1.053 kHz in
// ngspice). The guard that neither runs by its own gain (ownLoop) keeps two
// oscillators that each run alone apart however close they are.
const joinLoopTol = 0.15

// ownLoop says whether ref's loop runs by its own gain, searched an
// octave either side of where it shows (as inheritedLoop searches).
func ownLoop(lp *ac.Loops, ref string, l Loop) bool {
	fMin, fMax, _, _, _ := l.Range()
	opts := ac.LoopOptions{Options: ac.Options{VarFrac: 0.5, VarSet: true}, From: fMin / 2, To: fMax * 2}
	own, err := ac.OwnLoop(lp.Circuit(), ref, opts)
	return own || err != nil
}

// joinLoop adds device dev's parts (made into a stage of their own, add)
// to the oscillator j whose loop it shares, and gives j the one loop's
// frequency and margin (wholeLoop).
func joinLoop(w *world, lc *graph.Circuit, acg map[string]bool, j, add *found, l Loop) {
	j.Parts = slices.Compact(slices.Sorted(slices.Values(append(j.Parts, add.Parts...))))
	j.subs = append(j.subs, add.subs...)
	loops := append(slices.Clone(j.Loop), l)
	st := j.Stage
	arm, isWien := findWien(w.c, groundOf(w.c, acg), st.Parts)
	whole, ok := wholeLoop(lc, arm, isWien, loops)
	if !ok {
		j.Loop = loops
		return
	}
	j.Loop = []Loop{whole}
	st.Figures = figure.List{}
	st.figRanks = nil
	if isWien {
		wienFigures(st, arm)
		st.Title = expandTitle("Wien-bridge oscillator ({family})", st.Family)
	}
	loopFrequencyFigure(st, whole)
	st.Flags = loopFlags(lc, st, whole)
	slices.Sort(st.Flags)
}

// wienStageLoop gives an oscillator stage whose devices (two or more)
// close one loop through a Wien network that loop, broken at the series
// arm, with its frequency figure and flags; it reports whether it did.
func wienStageLoop(lc, reduced *graph.Circuit, acg map[string]bool, st *Stage) bool {
	n := 0
	for _, r := range st.Parts {
		if p := reduced.Part(r); p != nil && p.IsActive() {
			n++
		}
	}
	arm, ok := findWien(reduced, groundOf(reduced, acg), st.Parts)
	if n < 2 || !ok {
		return false
	}
	whole, ok := wholeLoop(lc, arm, true, nil)
	if !ok {
		return false
	}
	st.Loop = []Loop{whole}
	loopFrequencyFigure(st, whole)
	st.Flags = append(st.Flags, loopFlags(lc, st, whole)...)
	return true
}

// wholeLoop is the loop through several devices, broken where it is the
// oscillation's loop alone, at every gang setting. A Wien network is
// broken where a technician breaks it, at the series arm's end on the
// amplifier's output, the net loaded as before (ac.Lift): the negative
// feedback that sets the gain stays closed, and the margin is the one the
// gain preset trims. Without one, the loop is broken at each device's
// control electrode alone (ac.LoopOptions.AtControl) and the smallest
// return ratio read: a break that also cuts a negative-feedback loop
// reads the open amplifier's gain, the one that leaves it closed reads
// less. loops are the devices' own return ratios, for their names.
func wholeLoop(lc *graph.Circuit, arm wien, isWien bool, loops []Loop) (Loop, bool) {
	if isWien && liftable(lc, arm.lift) {
		lift := arm.lift
		l := Loop{Device: arm.device, Lift: &lift,
			BrokenAt: fmt.Sprintf("%s's end at %s (the Wien series arm)", lift.Part, lift.Net)}
		if err := solveSettings(lc, &l); err == nil {
			return l, true
		}
	}
	var best Loop
	found := false
	for _, dl := range loops {
		cl := Loop{Device: dl.Device, BrokenAt: dl.Device + "'s " + biasWord(lc, dl.Device)}
		if solveSettings(lc, &cl) != nil {
			continue
		}
		_, _, _, m, ok := cl.Range()
		if _, _, _, bm, _ := best.Range(); ok && (!found || m < bm) {
			best, found = cl, true
		}
	}
	return best, found
}

// liftable says whether the original circuit lc has lift's part with a
// pin on lift's net (the reduction keeps both, as a rule).
func liftable(lc *graph.Circuit, lift ac.Lift) bool {
	p := lc.Part(lift.Part)
	return p != nil && len(p.Pins) == 2 && slices.ContainsFunc(p.Pins, func(q graph.Pin) bool { return q.Net == lift.Net })
}

// solveSettings fills l's settings: its loop, broken where l says
// (Loop.Break), at every gang setting of lc.
func solveSettings(lc *graph.Circuit, l *Loop) error {
	lp := ac.NewLoops(lc)
	l.Settings = nil
	for _, g := range gangSettings(lc) {
		r, err := lp.Find(l.Device, l.Break(ac.LoopOptions{Options: ac.Options{VarFrac: g, VarSet: true}}))
		if err != nil {
			return err
		}
		l.Settings = append(l.Settings, LoopSetting{Gang: g, F: r.F, MarginDB: r.MarginDB})
	}
	return nil
}

// pendingAmp is an amplifier stage whose device shares another's loop.
type pendingAmp struct {
	dev  *graph.Part
	amp  *found
	loop Loop
}

// joinAmplifiers makes each amplifier in another device's loop part of
// that oscillator, where the loop needs both (joinedLoop): one loop, one
// oscillator, and no "amplifier that oscillates". One whose loop no
// oscillator shares keeps its stage, flagged (flagClaimed).
func joinAmplifiers(w *world, lp *ac.Loops, acg map[string]bool, inLoop []pendingAmp, out []*found, claimed map[string]*found, gone map[*found]bool) {
	for _, q := range inLoop {
		j := joinedLoop(lp, out, q.dev.Ref, q.loop)
		if j == nil {
			flagClaimed(lp.Circuit(), q.amp, q.loop)
			continue
		}
		gone[q.amp] = true
		add := &found{Stage: &Stage{Parts: loopParts(w, acg, q.dev, "", claimed, gone)}, subs: q.amp.subs}
		joinLoop(w, lp.Circuit(), acg, j, add, q.loop)
		for _, r := range j.Parts {
			j.set[r] = true
			claimed[r] = j
		}
	}
}

// flagClaimed gives the stage f that holds a device with a loop the flags
// of that loop, and the loop itself where it runs.
func flagClaimed(lc *graph.Circuit, f *found, l Loop) {
	f.Flags = append(f.Flags, claimedLoopFlags(lc, l)...)
	if _, _, _, mMax, _ := l.Range(); mMax >= 0 {
		// Below 0 dB it is not an oscillator: the stage keeps its own
		// name and the alignment its signal path.
		f.Loop = append(f.Loop, l)
	}
	slices.Sort(f.Flags)
}

// marginWords says what a loop's margin is: the device's gm's (gmMargin)
// or, for a loop broken elsewhere (BrokenAt), the whole loop's gain's.
func marginWords(l Loop, db float64) string {
	if l.BrokenAt == "" {
		return gmMargin(l.Device, db)
	}
	x := math.Pow(10, math.Abs(db)/20)
	if db >= 0 {
		return fmt.Sprintf("the loop's gain could fall %.1f dB (%.3g×) before it stops", db, x)
	}
	return fmt.Sprintf("the loop's gain would have to rise %.1f dB (%.3g×) to start", -db, x)
}

// Break is o with the loop broken where l was (BrokenAt), to solve l's
// loop again on another circuit (another setting of a preset).
func (l Loop) Break(o ac.LoopOptions) ac.LoopOptions {
	o.Lift, o.AtControl = l.Lift, l.BrokenAt != "" && l.Lift == nil
	return o
}
