package render

import (
	"pare/graph"
	"pare/render/layout"
)

// TankCap is a capacitor across a winding (see layout.TankCap).
type TankCap = layout.TankCap

// Tanks lists the capacitors across the windings of a circuit's coils and
// transformers (layout.Tanks): the sheet draws each beside its winding, so
// its frame must hold both.
func Tanks(c *graph.Circuit) []TankCap { return layout.Tanks(c) }
