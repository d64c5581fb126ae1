package stages

import (
	"slices"

	"pare/graph"
)

// withAcross is caps and every other capacitor straight across the coil
// c's two ends: an oscillator tank whose pattern names the gang, padder
// and trimmer may carry a fixed capacitor or a trimmer of its own across
// the coil (a long-wave oscillator section's, switched in with its coil),
// and the formula counts what the coil resonates with. The stage does
// not claim it; only the cross-check's capacitance counts it.
func (x *figCtx) withAcross(c coilEnds, caps []*graph.Part) []*graph.Part {
	if c.a == c.b {
		return caps
	}
	out := caps
	for ci, p := range x.w.parts {
		if p.Kind != graph.Capacitor || len(x.w.pins[ci]) != 2 || slices.Contains(caps, p) {
			continue
		}
		n0, n1 := x.w.pins[ci][0], x.w.pins[ci][1]
		if n0 == c.a && n1 == c.b || n0 == c.b && n1 == c.a {
			out = append(slices.Clip(out), p)
		}
	}
	return out
}
