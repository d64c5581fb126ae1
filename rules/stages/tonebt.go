package stages

import (
	"fmt"
	"math"

	"pare/graph/ac"
	"pare/graph/figure"
)

// A passive bass and treble network (the passive form of the feedback
// tone control: a bass pot with a capacitor across each half of its
// track, a treble pot between two capacitors, the two arms summed into
// one output). Its figures are the solver's, the network driven at its
// input from a stiff source and loaded as it sits: with the other control
// at mid travel, each control turned end to end, the level at the band's
// bottom (bass) or top (treble) against the mid-band level with both
// controls at mid travel; and that mid-band level itself, the loss the
// next stage makes up. Named only where each control moves its end of the
// band by at least toneMinSwing more than it moves mid-band (else the pots
// are something else: a balance, a level).
func init() {
	calcs["bass-treble"] = calc{args: []string{"bass", "treble", "in", "out"}, required: []string{"bass", "treble", "in", "out"},
		netArgs: []string{"in", "out"}, fn: calcBassTreble}
}

// toneMinSwing is the least change, end to end, a bass or treble control
// makes at its end of the band beyond its change at mid-band: 6 dB (common practice, no source: such
// networks give ±10 to ±20 dB).
const toneMinSwing = 6.0

func calcBassTreble(x *figCtx) {
	bass, treble := x.part("bass"), x.part("treble")
	in, out := x.st.nets[x.spec.Args["in"][0]], x.st.nets[x.spec.Args["out"][0]]
	if bass == nil || treble == nil || in == "" || out == "" || !x.solve {
		return
	}
	b := x.w.c.BandOf(bass)
	if b.Min <= 0 || b.Max <= b.Min {
		return
	}
	mid := math.Sqrt(b.Min * b.Max)
	level := func(bs, ts, f float64) float64 {
		qb, qt := bass.Clone(), treble.Clone()
		qb.Set, qt.Set = bs, ts
		r, err := ac.NewTransfer(withPart(withPart(x.solverCircuit(), qb), qt), in, out, gangMid.options())
		if err != nil {
			return math.NaN()
		}
		return magnitude(r, f)
	}
	ref := level(0.5, 0.5, mid)
	var bassDB, trebleDB, bassMid, trebleMid [2]float64
	for i, s := range []float64{0, 1} {
		bassDB[i] = db(level(s, 0.5, b.Min) / ref)
		trebleDB[i] = db(level(0.5, s, b.Max) / ref)
		bassMid[i] = db(level(s, 0.5, mid) / ref)
		trebleMid[i] = db(level(0.5, s, mid) / ref)
	}
	for _, v := range [][2]float64{bassDB, trebleDB, bassMid, trebleMid} {
		if math.IsNaN(v[0]+v[1]) || math.IsInf(v[0]+v[1], 0) {
			return
		}
	}
	// A control's swing at its end of the band beyond what it does at
	// mid-band: a plain divider (a level control) moves both alike.
	swing := func(end, at [2]float64) float64 { return math.Abs(end[1]-end[0]) - math.Abs(at[1]-at[0]) }
	if sb, st := swing(bassDB, bassMid), swing(trebleDB, trebleMid); sb < toneMinSwing || st < toneMinSwing {
		x.st.unconfirmed = fmt.Sprintf("in circuit %s moves the band's bottom %s dB and %s its top %s dB more than mid-band, end to end: no bass and treble control",
			bass.Ref, figure.Plain(sb), treble.Ref, figure.Plain(st))
		return
	}
	what := "|V(" + out + ")/V(" + in + ")| against the same at " + hz(mid) + " with both controls at mid travel"
	x.span("bass", figure.Decibel, min(bassDB[0], bassDB[1]), max(bassDB[0], bassDB[1]),
		figure.BySolver(what, hz(b.Min)+", "+bass.Ref+" end to end, "+treble.Ref+" at mid travel"))
	x.span("treble", figure.Decibel, min(trebleDB[0], trebleDB[1]), max(trebleDB[0], trebleDB[1]),
		figure.BySolver(what, hz(b.Max)+", "+treble.Ref+" end to end, "+bass.Ref+" at mid travel"))
	x.set("loss_mid", figure.Decibel, db(ref),
		figure.BySolver("|V("+out+")/V("+in+")|", hz(mid)+", both controls at mid travel"))
	x.st.Notes = append(x.st.Notes, fmt.Sprintf("solved with %s driven from a stiff source and %s loaded as it sits; the stage before adds its own output resistance",
		in, out))
}
