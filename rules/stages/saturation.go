package stages

import (
	"pare/graph/dc"
)

// saturationFlags flags each stage holding a transistor that the operating
// point of the original circuit (op) shows at or near saturation
// (dc.Point.Saturated): its small-signal figures, a loop's margin above
// all, are a linear model's at that point, where a real transistor has
// little gain left, so they are only as good as the point (a blind
// reviewer's phase-shift oscillator rested at Vce 0.45 V and its loop
// still read +11 dB without a word).
func saturationFlags(top []*found, op *dc.Point) {
	if op == nil || op.Circuit == nil {
		return
	}
	var walk func(fs []*found)
	walk = func(fs []*found) {
		for _, f := range fs {
			for _, ref := range f.Parts {
				s, ok := op.Saturated(ref)
				if !ok {
					continue
				}
				what := "its figures here are a small-signal model's taken at that point"
				for _, l := range f.Loop {
					if l.Device == ref {
						what = "the loop margin rests on that point (a small-signal model taken there, where a real transistor has less gain)"
					}
				}
				f.Flags = append(f.Flags, s.String()+" at the DC operating point as captured: "+what+"; check its bias with pare dc")
			}
			walk(f.subs)
		}
	}
	walk(top)
}
