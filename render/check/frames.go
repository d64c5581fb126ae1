package check

import (
	"fmt"

	"pare/render/geom"
)

// frameIntruders finds symbols whose body lies inside a frame (overlapping
// its interior) but that are not among the frame's parts: an intruder when
// another frame lists the part, a stray when none does. A frame with no
// parts listed (drawn by hand in a test) is not judged.
func (r *Report) frameIntruders(g *geom.Sheet) {
	staged := map[string]bool{}
	for _, f := range g.Frames {
		for _, p := range f.Parts {
			staged[p] = true
		}
	}
	for k, f := range g.Frames {
		if len(f.Parts) == 0 {
			continue
		}
		own := map[string]bool{}
		for _, p := range f.Parts {
			own[p] = true
		}
		name := fmt.Sprintf("frame %d %q", k+1, first(f.Title.Lines))
		for _, s := range g.Symbols {
			if own[s.Ref] || !s.Box.Overlaps(f.Box) {
				continue
			}
			if staged[s.Ref] {
				r.FrameIntruders = append(r.FrameIntruders, fmt.Sprintf("symbol %s of another stage lies inside %s", s.Ref, name))
			} else {
				r.FrameStrays = append(r.FrameStrays, fmt.Sprintf("symbol %s, in no stage, lies inside %s", s.Ref, name))
			}
		}
	}
}
