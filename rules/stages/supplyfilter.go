package stages

import (
	"fmt"
	"math"
	"slices"

	"pare/graph"
	"pare/graph/ac"
	"pare/graph/figure"
)

// A supply filter section is a series resistor or choke from a supply (the
// reservoir, a rail, the node of the section before) into a capacitor to
// chassis whose node feeds a stage's supply: an anode, screen, collector or
// drain through its load, or a screen directly. It is a smoothing filter
// where a rectifier sits on its input, else a decoupling filter. The
// capacitor may be of any kind and the section before may be there or not;
// what tells it from an RC low-pass in a signal path is where its two ends
// go, walked here through the circuit's DC paths.

// filterWalkDepth bounds the DC walks from a filter's ends: a load, a
// winding and a stopper deep, no further, so a walk does not wander through
// the whole set back to a rail by another path.
const filterWalkDepth = 3

// dcPath says whether a part carries DC between its ends: resistors,
// chokes, windings and pots (a capacitor does not), and a switch, whose
// contacts join in some position (a band switch between an anode and the
// coil it feeds on one band).
func dcPath(p *graph.Part) bool {
	switch p.Kind {
	case graph.Resistor, graph.Inductor, graph.Transformer, graph.Pot, graph.Switch:
		return true
	}
	return false
}

// reachesSource tells whether net is a supply or leads to one through DC
// paths (not through skip, the filter's own series part): a declared supply
// net (a battery's too), a bias rail that declares its volts (a grid-bias
// battery or supply), or a power rectifier. A port alone is not one: a
// pick-up socket is a port. An AGC line (a bias rail with no volts) and a
// signal detector's diode deliver no power, so a resistor and capacitor fed
// from them (an AGC filter, a coil's AGC feed and its cold-end bypass) are
// no supply filter.
//
// The walk never enters an anode's, collector's or drain's net: a supply
// reached only through a device's load is no supply line of the section's
// (an RC ladder off a collector, a phase-shift network, read as a chain of
// decouplers).
func (x *figCtx) reachesSource(net int, skip int) bool {
	return x.walkDC(net, skip, func(id int, ci int, pin int) bool {
		if ci < 0 {
			return x.isSourceNet(id)
		}
		return x.isPowerRectifier(ci)
	}, func(id int) bool { return !x.onOutputElectrode(id) })
}

// isSourceNet tells whether a net is itself a source of power: a declared
// supply, or a bias rail with declared volts.
func (x *figCtx) isSourceNet(id int) bool {
	switch x.w.role[id] {
	case graph.Supply:
		return true
	case graph.Bias:
		n := x.w.c.Net(x.w.names[id])
		return n != nil && n.Volts != 0
	}
	return false
}

// feedsStage is the device whose supply net feeds through DC paths (not
// through skip): an output electrode behind at least one part (its load), or
// a further grid (a screen) directly or behind one. nil when it feeds none,
// and when net is itself an output electrode: a capacitor there is a
// top-cut across a load, not a decoupler.
func (x *figCtx) feedsStage(net int, skip int) *graph.Part {
	for _, ci := range x.w.conns[net] {
		for j, id := range x.w.pins[ci] {
			if id == net && x.w.roles[ci][j] == graph.RoleOutput {
				return nil
			}
		}
	}
	var dev *graph.Part
	x.walkDC(net, skip, func(id int, ci int, pin int) bool {
		if ci < 0 || pin < 0 {
			return false
		}
		if p := x.w.parts[ci]; p.Kind == graph.Valve && isValveDiode(p) {
			return false // a detector's or rectifier's anode is fed no supply
		}
		role := x.w.roles[ci][pin]
		if role == graph.RoleGrid || role == graph.RoleOutput && id != net {
			dev = x.w.parts[ci]
			return true
		}
		return false
	}, x.notRail)
	return dev
}

// onAGCLine tells whether a net is an AGC line: a bias net with no volts
// of its own, or one a detector feeds through a resistor that biases a
// controlled stage (graph.Circuit.AGCFeed). A section into or out of it
// (a standing-bias resistor from a rail and the line's capacitor, the
// line's decoupling at a winding's cold end) carries a control voltage,
// no supply current.
func (x *figCtx) onAGCLine(id int) bool {
	name := x.w.names[id]
	if x.w.role[id] == graph.Bias {
		n := x.w.c.Net(name)
		return n == nil || n.Volts == 0
	}
	_, _, ok := x.w.c.AGCFeed(name)
	return ok
}

// notRail lets a walk into any net but a declared supply.
func (x *figCtx) notRail(id int) bool { return x.w.role[id] != graph.Supply }

// walkDC walks breadth first from net through DC paths, never through
// skip, ground or a net enter refuses (nil: none), and asks hit of each
// net reached (ci −1) and each terminal on it (ci, pin). It stops at the
// first hit.
func (x *figCtx) walkDC(net, skip int, hit func(id, ci, pin int) bool, enter func(id int) bool) bool {
	seen := map[int]bool{net: true}
	frontier := []int{net}
	for d := 0; d <= filterWalkDepth && len(frontier) > 0; d++ {
		var next []int
		for _, id := range frontier {
			if hit(id, -1, -1) {
				return true
			}
			for _, ci := range x.w.conns[id] {
				for j, pid := range x.w.pins[ci] {
					if pid == id && hit(id, ci, j) {
						return true
					}
				}
				if ci == skip || !dcPath(x.w.parts[ci]) {
					continue
				}
				for _, o := range dcNeighbours(x.w.parts[ci], x.w.pins[ci], id) {
					if o == groundNet || seen[o] || enter != nil && !enter(o) {
						continue
					}
					seen[o] = true
					next = append(next, o)
				}
			}
		}
		frontier = next
	}
	return false
}

// dcNeighbours are the nets a part joins to net by DC: every other
// terminal of a two-terminal part or a pot, only the same winding's other
// ends for a transformer (its windings are apart for DC).
func dcNeighbours(p *graph.Part, ids []int, net int) []int {
	if p.Kind != graph.Transformer {
		return ids
	}
	pinOf := map[string]int{}
	for j, pin := range p.Pins {
		pinOf[pin.Name] = ids[j]
	}
	var out []int
	for _, wd := range p.Windings {
		a, okA := pinOf[wd.From]
		b, okB := pinOf[wd.To]
		if okA && okB && (a == net || b == net) {
			out = append(out, a, b)
		}
	}
	return out
}

// feeds scores how surely a net is the supply input of a filter section:
// a rectifier on it counts most, then a port (a battery, the supply's
// connection), then a declared supply role; the declared voltage breaks
// ties, since each section drops some. Higher is nearer the source.
func (x *figCtx) feeds(id int) float64 {
	score := 0.0
	for _, ci := range x.w.conns[id] {
		switch p := x.w.parts[ci]; {
		case p.Kind == graph.Diode && p.Type == "zener":
			// a zener across a line holds it (a shunt stabiliser,
			// stabfeed.go); it feeds nothing
		case p.Kind == graph.Diode, p.Kind == graph.Valve && isValveDiode(p):
			score = max(score, 4)
		case p.Kind == graph.Port:
			score = max(score, 2)
		}
	}
	if n := x.w.c.Net(x.w.names[id]); n != nil {
		if n.Role == graph.Supply {
			score = max(score, 1)
		}
		// volts add less than a step: a tie-break between like nets
		score += math.Atan(math.Abs(n.Volts)) / math.Pi
	}
	return score
}

// supplyFilterNets are a match's input and output nets and the device its
// output feeds, and whether the match is bound the other way round (the
// pattern's two capacitors look alike, so the matcher keeps one binding of
// them); ok false where it is not a supply filter section either way.
func (x *figCtx) supplyFilterNets(s *graph.Part) (in, out int, dev *graph.Part, swapped, ok bool) {
	si := x.partIndex(s)
	in, okIn := x.w.netID[x.st.nets["in"]]
	out, okOut := x.w.netID[x.st.nets["out"]]
	if si < 0 || !okIn || !okOut || in == groundNet || out == groundNet {
		return 0, 0, nil, false, false
	}
	if x.feeds(out) > x.feeds(in) {
		in, out, swapped = out, in, true
	}
	if x.onAGCLine(in) || x.onAGCLine(out) || x.isSurgeSection(si, in, out) {
		return 0, 0, nil, false, false
	}
	if !x.reachesSource(in, si) && x.supplyOutlet(in, si) != nil && x.reachesSource(out, si) {
		// the port scored as the source is where the line leaves the
		// set: the supply reaches the section from the other end
		in, out, swapped = out, in, !swapped
	}
	if !x.reachesSource(in, si) || x.feedsBackward(in, out) {
		return 0, 0, nil, false, false
	}
	if dev = x.feedsStage(out, si); dev == nil && (x.supplyOutlet(out, si) == nil || x.onOutputElectrode(in)) {
		return 0, 0, nil, false, false
	}
	return in, out, dev, swapped, true
}

// feedsBackward tells whether the DC operating point has the series part's
// current running from out back into in: the section's "supply" end sits
// nearer chassis than the line it would feed, so it feeds nothing from
// there (a base bias resistor from a decoupled collector line to a bias
// node held by its own capacitor: review22 b02's R2 and C3 named a
// "supply decoupling filter" at 153.9 Hz, where the line's feed was R4).
// Unknown volts decide nothing; a margin of a hundredth of the input's
// volts (at least 10 mV) keeps an unloaded section's equal ends a feed.
func (x *figCtx) feedsBackward(in, out int) bool {
	op := x.dcPoint()
	if op == nil {
		return false
	}
	vi, ok1 := op.Volts(x.netName(in))
	vo, ok2 := op.Volts(x.netName(out))
	if !ok1 || !ok2 || vi == 0 {
		return false
	}
	margin := max(0.01*math.Abs(vi), 0.01)
	if vi > 0 {
		return vo > vi+margin
	}
	return vo < vi-margin
}

// onOutputElectrode tells whether an anode, collector or drain sits on id:
// a section from there is a signal filter off the device's load (its load
// reaches the supply), never a supply line's.
func (x *figCtx) onOutputElectrode(id int) bool {
	for _, ci := range x.w.conns[id] {
		for j, pid := range x.w.pins[ci] {
			if pid == id && x.w.roles[ci][j] == graph.RoleOutput {
				return true
			}
		}
	}
	return false
}

// supplyOutlet is the port by which a filtered supply line leaves the
// circuit as captured (an HT feed to a stage on another board): out holds
// a port that is no declared signal input or output, and nothing else but
// the section's series part (skip) and capacitors to chassis, so nothing
// but the port draws on it. nil when out is anything else. The section's
// input must reach a source without the section (supplyFilterNets), so a
// signal filter into an output socket never reads as one.
func (x *figCtx) supplyOutlet(out, skip int) *graph.Part {
	name := x.w.names[out]
	if slices.Contains(x.w.c.Inputs, name) || slices.Contains(x.w.c.Outputs, name) {
		return nil
	}
	var port *graph.Part
	for _, ci := range x.w.conns[out] {
		p := x.w.parts[ci]
		switch {
		case ci == skip:
		case p.Kind == graph.Port && port == nil:
			port = p
		case p.Kind == graph.Capacitor && slices.Contains(x.w.pins[ci], groundNet):
		default:
			return nil
		}
	}
	return port
}

// filterCorner is where |V(out)/V(in)| falls 3 dB below its level at DC
// (read at guess/100), searched from the highest point between guess/100
// and 10·guess (a choke section peaks at its resonance) up to
// guess·cornerSpan.
func filterCorner(r *ac.Response, guess float64) (float64, bool) {
	level := magnitude(r, guess/100)
	if !(level > 0) {
		return 0, false
	}
	top, best := guess/100, level
	for i := 0; i <= 60; i++ {
		f := guess / 100 * math.Pow(1000, float64(i)/60)
		if m := magnitude(r, f); m > best {
			top, best = f, m
		}
	}
	return crossing(r, level/math.Sqrt2, top, guess*cornerSpan)
}

// attenuation is how far |V(out)/V(in)| lies below 1 at f, in decibels
// (positive: the filter attenuates).
func attenuation(r *ac.Response, f float64) (float64, bool) {
	m := magnitude(r, f)
	if !(m > 0) {
		return 0, false
	}
	return -20 * math.Log10(m), true
}

// seriesAtten is the textbook attenuation of an RC section at f,
// √(R² + X_C²)/X_C (handbook, from memory), in decibels; false for any
// other series part (a choke's is its section's model, chokesection.go).
func seriesAtten(s *graph.Part, c, f float64) (float64, bool) {
	if s.Kind != graph.Resistor {
		return 0, false
	}
	xc := 1 / (2 * math.Pi * f * c)
	return 20 * math.Log10(math.Hypot(s.Value.Max, xc)/xc), true
}

// rippleSource is the ripple frequency of the set's supply and the words
// that say where it comes from: the mains frequency a transformer or a
// mains inlet declares (hz), else 50 Hz assumed; twice it where the rectifier is full-wave (a
// centre-tapped pair or a bridge), once for half-wave (rectWave reads
// which from the wiring). ok is false for a set with no rectifier (a
// battery set has no ripple).
func (x *figCtx) rippleSource() (float64, string, bool) {
	mains, said := 50.0, "50 Hz mains assumed (the set declares none)"
	for _, p := range x.w.c.Parts {
		// a mains transformer, or the inlet of a set without one
		mainsPart := p.Kind == graph.Transformer || p.Kind == graph.Port || p.Kind == graph.Generic
		if mainsPart && p.Params["hz"] > 0 {
			mains, said = p.Params["hz"], fmt.Sprintf("%s Hz mains from %s", figure.Plain(p.Params["hz"]), p.Ref)
			break
		}
	}
	wave, refs := x.rectWave()
	rect := refList(refs)
	switch wave {
	case noRectifier:
		return 0, "", false
	case halfWave:
		return mains, fmt.Sprintf("half-wave rectifier %s (one anode path, one pulse per mains cycle), %s", rect, said), true
	case bridgeWave:
		return 2 * mains, fmt.Sprintf("bridge rectifier %s, %s", rect, said), true
	}
	// Two anodes in one envelope (a double-diode valve) or two diodes: the
	// words follow the parts, so a reader counts what is on the chassis.
	how := "two anodes on the winding's ends"
	if len(refs) > 1 {
		how = "two diodes on the winding's ends"
	}
	return 2 * mains, fmt.Sprintf("full-wave rectifier %s (%s), %s", rect, how, said), true
}
