package stages

import (
	"math"

	"pare/graph"
)

// order is each part's breadth-first distance from the inputs.
type order map[string]int

func (o order) of(refs []string) int {
	best := math.MaxInt
	for _, r := range refs {
		if d, ok := o[r]; ok && d < best {
			best = d
		}
	}
	return best
}

// signalOrder walks the part–net graph breadth first from the circuit's
// inputs (and region inputs), never through an AC-ground net: a common
// ground does not carry the signal from stage to stage (graph.Walk).
func signalOrder(c *graph.Circuit) order {
	// A region's input is a point inside the chain (the IF strip starts at
	// the mixer's anode); it only helps when the circuit names no inputs.
	starts := append([]string(nil), c.Inputs...)
	if len(starts) == 0 {
		for _, r := range c.Regions {
			if r.Input != "" {
				starts = append(starts, r.Input)
			}
		}
	}
	if len(starts) == 0 {
		// No input named anywhere: the oscillator or the first active
		// part's control (graph.InferredInput), never the order of the
		// file, which put an output coupling capacitor first.
		if n, _, why := graph.InferredInput(c); n != "" {
			if why != "oscillator" { // an oscillator makes the signal: nothing is upstream of it
				n = graph.UpstreamOf(c, n)
			}
			starts = []string{n}
		}
	}
	w := graph.NewWalk(c.View())
	w.Follow = func(n string) bool { return !c.RoleOf(n).IsACGround() }
	w.FromNets(starts, 0)
	dist := order{}
	for _, p := range c.Parts {
		if d, ok := w.PartDist(p); ok {
			dist[p.Ref] = d
		}
	}
	return dist
}
