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

// forwardOrder is signalOrder walked the way the signal flows: into an
// amplifying device at its control or common electrode and out at its
// output or common, never out of a control electrode's net into a passive
// part (a declared input's excepted: it is driven). What hangs on a base or
// grid besides its device (a feedback resistor, the capacitor that brings
// the output back to it, a DC feedback chain) carries the signal into the
// electrode, not out of it. Walked both ways, review16 b04's feedback
// capacitor C14 (loudspeaker to R14 to the driver's base) was reached from
// the base three parts before the loudspeaker, so its load was taken on the
// loudspeaker's side (48.5 kHz into 3.28 Ω) and the output coupling C9 was
// paired with the DC feedback resistor on its own driven side.
// walkStarts are the nets an order walks from: the circuit's inputs, else
// its regions' inputs, else the one graph.InferredInput gives.
func walkStarts(c *graph.Circuit) []string {
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
	return starts
}

func forwardOrder(c *graph.Circuit) order {
	starts := walkStarts(c)
	control := map[string]bool{}
	for _, p := range c.Parts {
		if p.IsActive() {
			for _, pin := range p.Pins {
				if graph.RoleOfPin(p.Kind, pin.Name) == graph.RoleControl {
					control[pin.Net] = true
				}
			}
		}
	}
	for _, n := range starts {
		delete(control, n)
	}
	w := graph.NewWalk(c.View())
	w.Follow = func(n string) bool { return !c.RoleOf(n).IsACGround() }
	w.Enter = func(p *graph.Part, pin string) bool {
		if p.IsActive() {
			r := graph.RoleOfPin(p.Kind, pin)
			return r == graph.RoleControl || r == graph.RoleCommon
		}
		return !control[p.NetOf(pin)]
	}
	w.Leave = func(p *graph.Part, pin string) bool {
		return !p.IsActive() || graph.RoleOfPin(p.Kind, pin) != graph.RoleControl
	}
	w.FromNets(starts, 0)
	dist := order{}
	for _, p := range w.Parts() {
		dist[p.Ref], _ = w.PartDist(p)
	}
	return dist
}

func walkOrder(c *graph.Circuit, skipBack bool) order {
	starts := walkStarts(c)
	v := c.View()
	w := graph.NewWalk(v)
	w.Follow = func(n string) bool { return !c.RoleOf(n).IsACGround() }
	var fb map[*graph.Part]string
	if skipBack {
		// a bypassed common lead carries no signal to what else returns
		// there: a double-diode-triode's detector diode on the triode's
		// cathode had named and drawn the triode before the volume control
		// and coupling capacitor that feed its grid
		held := heldCommons(c)
		follow := w.Follow
		w.Follow = func(n string) bool { return follow(n) && !held[n] }
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

// heldCommons are the nets of amplifying devices' common electrodes that a
// capacitor to AC ground holds for the signal, the output taken from the
// output electrode (not a follower): its reactance at the bottom
// of the device's band below the resistance of the lead's resistors to
// AC ground (a bypassed cathode or emitter resistor; common practice).
func heldCommons(c *graph.Circuit) map[string]bool {
	held := map[string]bool{}
	for _, p := range c.Parts {
		if !p.IsActive() {
			continue
		}
		net := p.NetOf(p.PinWithRole(graph.RoleCommon))
		out := p.NetOf(p.PinWithRole(graph.RoleOutput))
		if net == "" || c.RoleOf(net).IsACGround() || out == "" || c.RoleOf(out).IsACGround() {
			// a follower's common lead is its output: the capacitor
			// there (a Colpitts divider's lower arm) holds nothing
			continue
		}
		if f := c.BandOf(p).Min; f > 0 && bypassedAt(c, net, f) {
			held[net] = true
		}
	}
	return held
}

// bypassedAt tells whether net has a capacitor to AC ground whose
// reactance at f is below the parallel resistance of its resistors to AC
// ground.
func bypassedAt(c *graph.Circuit, net string, f float64) bool {
	cap, g := 0.0, 0.0
	for _, cn := range c.ConnsOf(net) {
		p := cn.Part
		if len(p.Pins) != 2 || p.Value.Max <= 0 {
			continue
		}
		other := p.Pins[0].Net
		if other == net {
			other = p.Pins[1].Net
		}
		if !c.RoleOf(other).IsACGround() {
			continue
		}
		switch p.Kind {
		case graph.Capacitor:
			cap += p.Value.Max
		case graph.Resistor:
			g += 1 / p.Value.Max
		}
	}
	return cap > 0 && g > 0 && 1/(2*math.Pi*f*cap) < 1/g
}
