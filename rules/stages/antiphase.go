package stages

import (
	"math"

	"pare/graph"
)

// midbandDrive is what a device's in-circuit drive figures are solved on:
// the solver's circuit, the device's control and output nets and the
// geometric middle of its band; ok false where the band or an electrode
// is missing.
func (x *figCtx) midbandDrive(q *graph.Part) (c *graph.Circuit, ctl, out string, f float64, ok bool) {
	b := x.w.c.BandOf(q)
	ctl = q.NetOf(q.PinWithRole(graph.RoleControl))
	out = q.NetOf(q.PinWithRole(graph.RoleOutput))
	if b.Min <= 0 || b.Max <= b.Min || ctl == "" || out == "" {
		return nil, "", "", 0, false
	}
	return x.solverCircuit(), ctl, out, math.Sqrt(b.Min * b.Max), true
}

// antiphase tells whether two gains are of opposite sign and within
// balance of each other, as a ratio: a push-pull pair's drive or a
// splitter's two halves.
func antiphase(g1, g2, balance float64) bool {
	return g1*g2 < 0 && math.Abs(g1) <= balance*math.Abs(g2) && math.Abs(g2) <= balance*math.Abs(g1)
}
