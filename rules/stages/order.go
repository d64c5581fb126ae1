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
func signalOrder(c *graph.Circuit) order { return walkOrder(c, false) }

// namingOrder is signalOrder with the parts from a device's control or
// common electrode to a net the signal reaches after the device
// (graph.FeedbackParts) walked only towards that electrode, and a feedback
// part, reached later than it, at the electrode's distance: the order
// stages are named and drawn in. Through an overall
// feedback resistor the output stage, its coupling capacitor and
// loudspeaker were one step from the first device and named before the
// driver or phase splitter that feeds them.
func namingOrder(c *graph.Circuit) order { return walkOrder(c, true) }

func walkOrder(c *graph.Circuit, skipBack bool) order {
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
	v := c.View()
	w := graph.NewWalk(v)
	w.Follow = func(n string) bool { return !c.RoleOf(n).IsACGround() }
	var fb map[*graph.Part]string
	if skipBack {
		fb = graph.FeedbackParts(c.Parts, v, w.Follow)
		w.Enter = func(p *graph.Part, pin string) bool { into, ok := fb[p]; return !ok || p.NetOf(pin) != into }
	}
	w.FromNets(starts, 0)
	dist := order{}
	for _, p := range c.Parts {
		if d, ok := w.PartDist(p); ok {
			dist[p.Ref] = d
		}
	}
	for p, into := range fb {
		cur, seen := dist[p.Ref]
		if d, ok := w.NetDist(into); ok && (!seen || d < cur) {
			dist[p.Ref] = d
		}
	}
	return dist
}
