package pipeline

import (
	"pare/graph"
	"pare/rules"
)

// quietNets are the nets of the original circuit that the reduction found
// at AC ground while they are not rails there (rules.Log.ACGround): a
// supply line behind its decoupling capacitor, an AGC line behind its
// filter. The full and faded sheets wire them, but no signal passes
// through them, and the layout's rank along the signal flow must not pass
// either (render.Sheet.Quiet): through an IF can's cold end on the
// decoupled line it reached the next can before the transistor feeding
// it, and drew the can left of its collector (review16 b03, b05).
func quietNets(orig *graph.Circuit, log *rules.Log) map[string]bool {
	if log == nil {
		return nil
	}
	out := map[string]bool{}
	for _, n := range log.ACGround {
		if !orig.RoleOf(n).IsACGround() {
			out[n] = true
		}
	}
	return out
}
