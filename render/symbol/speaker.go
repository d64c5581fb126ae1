package symbol

import (
	"pare/graph"
	"pare/render/geom"
)

// The loudspeaker: the drive unit's small rectangle between the two leads
// and the cone flaring from it (IEC 60617 and IEEE 315 draw it alike). It
// lives in its own file and joins the table at init, which runs after the
// table's own initialisation.
func init() { table[graph.Loudspeaker] = loudspeaker }

func loudspeaker(p *graph.Part, st Style, m Marks) Shape {
	s := Shape{Pins: twoPins(p), Box: geom.R(-2, -1.8, 2, 0.6), Turns: allTurns}
	s.Prims = append(leads(0.6),
		poly(false, pt(-0.6, -0.5), pt(0.6, -0.5), pt(0.6, 0.5), pt(-0.6, 0.5)),
		poly(false, pt(-0.6, -0.5), pt(-1.4, -1.6), pt(1.4, -1.6), pt(0.6, -0.5)))
	return s
}
