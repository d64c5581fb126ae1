package pipeline

import (
	"sort"

	"pare/graph"
	"pare/render"
)

// tankFrames puts each capacitor across a winding in the frame that holds
// the winding (a coil no frame holds joins its capacitor's frame): the
// sheet stands a tank as one unit, and a stage finder that gave the
// oscillator's gang section to one stage and its coil to another drew the
// two some ninety grid steps apart, in two frames. A frame left with no
// part is dropped. c is the circuit drawn.
func tankFrames(frames []render.Frame, c *graph.Circuit) []render.Frame {
	frameOf := func(ref string) int {
		for i, f := range frames {
			for _, p := range f.Parts {
				if p == ref {
					return i
				}
			}
		}
		return -1
	}
	move := func(ref string, to int) {
		for i := range frames {
			frames[i].Parts = without(frames[i].Parts, ref)
		}
		frames[to].Parts = append(frames[to].Parts, ref)
		sort.Strings(frames[to].Parts)
	}
	for _, t := range render.Tanks(c) {
		fc, fk := frameOf(t.Coil), frameOf(t.Cap)
		switch {
		case fc >= 0 && fc != fk:
			move(t.Cap, fc)
		case fc < 0 && fk >= 0:
			move(t.Coil, fk)
		}
	}
	out := frames[:0]
	for _, f := range frames {
		if len(f.Parts) > 0 {
			out = append(out, f)
		}
	}
	return out
}

// without is refs less ref, in a new slice.
func without(refs []string, ref string) []string {
	var out []string
	for _, r := range refs {
		if r != ref {
			out = append(out, r)
		}
	}
	return out
}
