package main

import (
	"testing"

	"pare/render"
)

// TestUnitsOnOnePage: cut onto A3 (--page auto), parts that work as one
// stand on one page: the two halves of a push-pull output (devices sharing
// a cathode or emitter net, or driven from the two ends of one winding,
// feeding the two ends of one output winding), and a network across a
// loudspeaker with the loudspeaker, and the loudspeaker with the output
// transformer it is on. The blind review found Q6 on the supply's page and
// Q5 on the page before (b05 with its AGC bias, faded), and the Zobel
// network R13, C6 on page 2 while the loudspeaker it is across stood on
// page 1 (b04, faded); the stage frames have changed since, so the rule
// that holds these together (render's units, tested on a placement that
// splits them in TestUnitsOneStretch) is held here on every review
// circuit with such a unit. Common practice:
// a push-pull pair is drawn mirrored about its output transformer, a
// Zobel across the speaker it loads.
func TestUnitsOnOnePage(t *testing.T) {
	cases := []struct {
		file string
		view render.View
		refs []string
		why  string
	}{
		{"b05-agc-bias", render.Faded, []string{"Q5", "Q6", "T7"}, "push-pull pair on one output winding, driven from T6's ends"},
		{"b05-agc-bias", render.Reduced, []string{"Q5", "Q6", "T7"}, "push-pull pair on one output winding, driven from T6's ends"},
		{"b05", render.Faded, []string{"Q5", "Q6", "T7"}, "push-pull pair on one output winding, driven from T6's ends"},
		{"b05", render.Reduced, []string{"Q5", "Q6", "T7"}, "push-pull pair on one output winding, driven from T6's ends"},
		{"a04", render.Faded, []string{"V2", "V3", "T1"}, "push-pull pentodes sharing a cathode net"},
		{"a04", render.Reduced, []string{"V2", "V3", "T1"}, "push-pull pentodes sharing a cathode net"},
		{"b04", render.Faded, []string{"LS1", "R13", "C6"}, "Zobel across the loudspeaker"},
		{"b04", render.Reduced, []string{"LS1", "R13", "C6"}, "Zobel across the loudspeaker"},
		{"b05-agc-bias", render.Faded, []string{"T7", "LS1"}, "loudspeaker on its output transformer's secondary"},
		{"b05", render.Faded, []string{"T7", "LS1"}, "loudspeaker on its output transformer's secondary"},
		{"a04", render.Faded, []string{"T1", "LS1"}, "loudspeaker on its output transformer's secondary"},
		{"c07", render.Faded, []string{"SP1", "R8", "C4"}, "Zobel across the loudspeaker"},
		{"c06", render.Faded, []string{"T1", "SP1"}, "loudspeaker on its output transformer's secondary"},
		{"c10", render.Faded, []string{"T5", "SP1"}, "loudspeaker on its output transformer's secondary"},
		{"c10", render.Reduced, []string{"T5", "SP1"}, "loudspeaker on its output transformer's secondary"},
	}
	for _, tc := range cases {
		onOnePage(t, tc.file, tc.view, tc.refs, tc.why)
	}
}
