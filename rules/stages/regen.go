package stages

import (
	"fmt"
	"math"
	"slices"

	"pare/graph"
	"pare/graph/ac"
	"pare/graph/figure"
)

// The regeneration figure of a detector with reaction: its device's loop
// gain at the tuned frequency (where the loop's magnitude peaks in the
// band), solved in circuit across the dial (the return ratio of loop.go).
// Below 0 dB the reaction narrows the tuned circuit: the loop multiplies
// its Q by 1/(1 − L) (positive feedback around a resonator, the classic
// regeneration result); at 0 dB and above the detector oscillates.
//
// Registered here rather than in the table of figures.go so the loop code
// stays in the loop files; figures.go's init, which makes the table, runs
// first (Go runs a package's init functions in file-name order as the go
// tool presents them).
func init() {
	calcs["regeneration"] = calc{args: []string{"device"}, required: []string{"device"}, fn: calcRegeneration}
}

func calcRegeneration(x *figCtx) {
	dev := x.part("device")
	if dev == nil {
		return
	}
	l, reversed, err := tunedLoop(x.w.c, dev.Ref)
	if err != nil {
		x.flag("regeneration of %s not computed: %v", dev.Ref, err)
		return
	}
	x.st.Loop = append(x.st.Loop, l)
	_, _, mMin, mMax, ok := l.Range()
	if !ok {
		return
	}
	origin := figure.BySolver("loop gain at the tuned frequency", "every gang setting")
	if mMax-mMin < 0.05 {
		x.set("regen_loop", figure.Decibel, mMax, origin)
	} else {
		x.span("regen_loop", figure.Decibel, mMin, mMax, origin)
	}
	switch {
	case reversed:
		x.flag("reaction winding works against the tuned circuit (loop phase 180° at the tuned frequency): connected the wrong way round?")
	case mMax >= 0:
		x.flag("reaction past the point of oscillation: loop gain %+.1f dB: the detector oscillates and whistles on every carrier", mMax)
	default:
		gain := math.Pow(10, mMax/20)
		x.set("q_mult", figure.Ratio, 1/(1-gain), figure.ByFormula("Q multiplied by 1/(1 − L)"))
	}
}

// tunedLoop is a detector's loop at its tuned frequency, at every gang
// setting: where, within the circuit's band, the loop phase is 0° (or
// 180°, the loop working against the tuned circuit) with the largest
// gain. reversed says the 180° one is the stronger at the setting of the
// largest gain.
func tunedLoop(c *graph.Circuit, ref string) (Loop, bool, error) {
	l := Loop{Device: ref}
	band := c.FullBand()
	if !(band.Min > 0) || !(band.Max > band.Min) {
		return l, false, fmt.Errorf("no band to look for the tuned frequency in")
	}
	best, reversed := math.Inf(-1), false
	for _, g := range gangSettings(c) {
		o := ac.LoopOptions{Options: ac.Options{VarFrac: g, VarSet: true}, From: band.Min, To: band.Max}
		fwd, err := ac.FindLoop(c, ref, o)
		if err != nil {
			return l, false, err
		}
		o.Inverted = true
		inv, err := ac.FindLoop(c, ref, o)
		if err != nil {
			return l, false, err
		}
		s, rev := LoopSetting{Gang: g, F: fwd.F, MarginDB: fwd.MarginDB}, false
		if inv.F > 0 && (fwd.F == 0 || inv.MarginDB > fwd.MarginDB) {
			s, rev = LoopSetting{Gang: g, F: inv.F, MarginDB: inv.MarginDB}, true
		}
		l.Settings = append(l.Settings, s)
		if s.F > 0 && s.MarginDB > best {
			best, reversed = s.MarginDB, rev
		}
	}
	return l, reversed, nil
}

// hasLoop tells whether a stage already carries the loop of device ref.
func hasLoop(st *Stage, ref string) bool {
	return slices.ContainsFunc(st.Loop, func(l Loop) bool { return l.Device == ref })
}
