package stages

import (
	"slices"

	"pare/graph"
	"pare/graph/figure"
)

// An output capacitor into the loudspeaker works one way: an output
// device's emitter, cathode or source (or its collector, anode or drain)
// drives one side, directly or through the small emitter resistors of a
// pair's mid-point, and the loudspeaker is the load on the other. A
// capacitor of the same shape from the loudspeaker back towards an earlier
// stage (review16 b04's C14, into R14 and the driver's base) is a feedback
// path's DC block whose corner is on its own far side: the loudspeaker is
// its source there, not its load. So the pattern holds only when the solver
// side and the drive agree: the calc checks the drive, then takes the
// coupling corner.
func init() {
	calcs["speaker-coupling"] = calc{args: []string{"c", "speaker"}, required: []string{"c", "speaker"}, fn: calcSpeakerCoupling}
}

// drivenSeriesMax bounds a resistor between an output device's electrode
// and the capacitor against the loudspeaker's rating: emitter resistors of
// a complementary pair are a fraction of an ohm to an ohm or two, well
// under the 4–16 Ω the pair drives (common practice, from memory); a
// resistor as big as the speaker is no drive but a feed from elsewhere.
const drivenSeriesMax = 0.5

func calcSpeakerCoupling(x *figCtx) {
	c, spk := x.part("c"), x.part("speaker")
	ci, si := x.partIndex(c), x.partIndex(spk)
	if ci < 0 || si < 0 || len(x.w.pins[ci]) != 2 || spk.Value.Max <= 0 || c.Value.Max <= 0 {
		return
	}
	far, down := -1, -1
	for i, net := range x.w.pins[ci] {
		if slices.Contains(x.w.pins[si], net) {
			down = i
		} else {
			far = net
		}
	}
	if far < 0 || down < 0 || !outputDriven(x.w, far, ci, spk.Value.Max*drivenSeriesMax) {
		return // no figures: the guard drops the match
	}
	// the speaker side is the driven side whatever the distance walk says
	// (review20 b04: R6 from the loudspeaker back to the driver's emitter
	// makes that side look nearer the inputs than the pair's mid-point);
	// its load is the loudspeaker beside whatever else sits there
	net := x.w.pins[ci][down]
	r := parallelOf(resistanceToGround(x.w, net), speakerLoad(x.w, net))
	x.set("c", figure.Farad, c.Value.Max, byPartValue)
	x.couplingFigures(c, ci, down, r)
}

// outputDriven tells whether an amplifying device's output or common
// electrode sits on net, or behind one resistor no bigger than rMax from
// it (a pair's emitter resistor), skipping part skip (the capacitor).
func outputDriven(w *world, net, skip int, rMax float64) bool {
	if drivesNet(w, net) {
		return true
	}
	for _, ri := range w.conns[net] {
		p := w.parts[ri]
		if ri == skip || p.Kind != graph.Resistor || len(w.pins[ri]) != 2 || p.Value.Max <= 0 || p.Value.Max > rMax {
			continue
		}
		for _, other := range w.pins[ri] {
			if other != net && other != groundNet && drivesNet(w, other) {
				return true
			}
		}
	}
	return false
}

// drivesNet tells whether an amplifying device's output or common
// electrode is on net.
func drivesNet(w *world, net int) bool {
	for _, di := range w.conns[net] {
		p := w.parts[di]
		if !p.IsActive() {
			continue
		}
		for j, id := range w.pins[di] {
			if id != net || j >= len(p.Pins) {
				continue
			}
			if r := graph.RoleOfPin(p.Kind, p.Pins[j].Name); r == graph.RoleOutput || r == graph.RoleCommon {
				return true
			}
		}
	}
	return false
}
