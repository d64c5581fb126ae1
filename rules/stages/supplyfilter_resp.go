package stages

import (
	"maps"
	"slices"

	"pare/graph"
	"pare/graph/ac"
)

// filterResponse is V(out)/V(in) of the circuit as it is, in driven by an
// ideal source: the AC ground of its two rails lifted (the section after a
// smoothing filter may itself be a declared rail), every other rail kept.
// What lies beyond the driven rail cannot change the response, so only the
// parts reached from out without passing in are solved: the transformer
// and rectifier behind a reservoir (a mains primary left floating in a
// drawing of the set) stay out of it. Nor can what lies beyond another
// rail or AC ground, which the solver takes as ground: the walk stops
// there too, so a decoupler of a set of many channels elaborates its own
// stage, not the rest of the set (85 sections of 850 parts each on the
// 1,010-part bank before). A diode among the parts it keeps takes its DC
// load from the DC paths of the circuit, which run through the rails: it
// takes the load the walk that passes the other rails keeps (and solved
// on, before) gives it.
func (x *figCtx) filterResponse(in, out int) (*ac.Response, error) {
	inName, outName := x.netName(in), x.netName(out)
	lines := x.agcLines()
	keep := x.w.reachPast([]int{out}, []int{in}, true, lines)
	ends := []string{inName, outName}
	freed := ends
	for id := range lines {
		freed = append(freed, x.netName(id))
	}
	slices.Sort(freed[2:])
	sub := x.cutFreed(keep, ends, freed)
	sub.Inputs = x.unfedInputs(sub.Inputs, in, out)
	if x.keepsDiode(keep) {
		// The walk that passes the other rails as well keeps the circuit
		// whose DC paths give the diodes their loads; the section's
		// response is solved on the piece closed at AC ground, the block
		// of the matrix its driven rail reaches in either, with those loads
		// (each elaboration of the wide one took a DC load for every
		// detector of the set, which grew with its square).
		if solveWide {
			wide := x.cutFreed(x.filterParts(in, out, false), ends, freed)
			wide.Inputs = sub.Inputs
			return ac.NewTransfer(wide, inName, outName, gangMid.options())
		}
		dc, ok := x.dcCut(keep, in, freed)
		if !ok {
			dc = x.cutFreed(x.filterParts(in, out, false), ends, freed)
		}
		sub.DetectorLoads = withLoads(x.w.c.DetectorLoads, ac.DetectorLoads(dc, sub.Parts))
	}
	return ac.NewTransfer(sub, inName, outName, gangMid.options())
}

// unfedInputs is inputs without those the section feeds: a declared input
// joined for DC to the section's output net out (not through in) is an
// output electrode's node, a collector or anode fed from the line through
// its load (a transformer's primary, a load resistor) by a device beyond
// the circuit's edge, and a collector or anode is a current source, a high
// impedance: undriven it is open (an input on a device's control
// electrode is that device's signal, and stays held), not the ideal 0 V source the solver
// holds a declared input at. Held at 0 V, review16 b03's IF rail
// decoupler (R10 into C13, C14) was loaded by the first IF can's primary
// from the rail to the mixer's collector at AC ground: f c 315.7 Hz where
// ngspice, the collector open, gives 7.237 Hz (the formula 7.231 Hz).
func (x *figCtx) unfedInputs(inputs []string, in, out int) []string {
	if len(inputs) == 0 {
		return inputs
	}
	fed := x.dcJoinedFrom(out, in)
	var kept []string
	for _, n := range inputs {
		if id, ok := x.w.netID[n]; ok && fed[id] && !x.onControl(id) {
			continue
		}
		kept = append(kept, n)
	}
	return kept
}

// onControl tells whether a control electrode (a grid, base or gate) of
// a device in the circuit is on net id: an input there is a signal fed to
// that device (a base biased from the line through its upper resistor),
// not a collector or anode beyond the circuit's edge.
func (x *figCtx) onControl(id int) bool {
	for _, ci := range x.w.conns[id] {
		for j, at := range x.w.pins[ci] {
			if at == id && x.w.parts[ci].IsActive() && x.w.roles[ci][j] == graph.RoleControl {
				return true
			}
		}
	}
	return false
}

// dcJoinedFrom is the nets joined for DC to net from (dcStep: resistors,
// pot tracks, coils, one winding's ends, closed switches), not through
// stop, ground or any other net the solver takes as ground, bounded by
// filterWalkDepth parts: a feed runs through a load, a winding and a
// stopper, no further.
func (x *figCtx) dcJoinedFrom(from, stop int) map[int]bool {
	seen := map[int]bool{from: true, stop: true}
	frontier := []int{from}
	for depth := 0; depth < filterWalkDepth && len(frontier) > 0; depth++ {
		var next []int
		for _, id := range frontier {
			for _, ci := range x.w.conns[id] {
				x.dcStep(ci, id, func(o int) {
					if seen[o] || o == groundNet || x.w.role[o].IsACGround() {
						return
					}
					seen[o] = true
					next = append(next, o)
				})
			}
		}
		frontier = next
	}
	delete(seen, stop)
	return seen
}

// cutFreed is the world's circuit cut to the parts idx (ascending), with
// only the nets they touch and the ends, in the circuit's order, the nets
// freed made signal nets (the rails a response is taken between: the
// section after a smoothing filter may itself be a declared rail). The
// solver numbers nets by name, so the piece's nodes keep their order and
// its matrix its every number. It costs the piece, not the set: a whole
// set has a section per stage, and a cut that read every part and net of
// the set for each grew with its square.
func (x *figCtx) cutFreed(idx []int, ends, freed []string) *graph.Circuit {
	c, w := x.w.c, x.w
	sub := &graph.Circuit{File: c.File, Title: c.Title, Band: c.Band, Freqs: c.Freqs, Regions: c.Regions,
		Inputs: c.Inputs, Outputs: c.Outputs, DetectorLoads: c.DetectorLoads} // withPart's, without a copy of every part
	sub.UseRegionIndex(w.rx)
	sub.Parts = make([]*graph.Part, 0, len(idx))
	var at []int // the touched nets' places in c.Nets
	touched := map[string]bool{}
	touch := func(name string) {
		if !touched[name] {
			touched[name] = true
			if i, ok := w.netAt[name]; ok {
				at = append(at, i)
			}
		}
	}
	for _, n := range ends {
		touch(n)
	}
	for _, ci := range idx {
		p := w.parts[ci]
		sub.Parts = append(sub.Parts, p)
		for _, pin := range p.Pins {
			touch(pin.Net)
		}
	}
	slices.Sort(at)
	sub.Nets = make([]*graph.Net, 0, len(at))
	for _, i := range at {
		n := c.Nets[i]
		if slices.Contains(freed, n.Name) && n.Role != graph.Signal {
			m := *n
			m.Role = graph.Signal
			n = &m
		}
		sub.Nets = append(sub.Nets, n)
	}
	return sub
}

// solveWide has a supply filter section with a diode solved on the wide
// circuit and an AGC line's lag on the whole circuit, as before the pieces
// (the test that shows the pieces give the same figures).
var solveWide bool

// withLoads is the kept detector loads with more added, a new map.
func withLoads(kept, more map[string]float64) map[string]float64 {
	out := make(map[string]float64, len(kept)+len(more))
	maps.Copy(out, kept)
	maps.Copy(out, more)
	return out
}

// filterParts is the parts (ascending) reached from out without passing
// in, nor, with atGround, any other net the solver takes as ground (a
// rail, a heater line, chassis).
func (x *figCtx) filterParts(in, out int, atGround bool) []int {
	return x.w.reach([]int{out}, []int{in}, atGround)
}

// agcLines are the nets of the world that are AGC lines (a bias rail
// without volts: declared so, or marked so by the reduction,
// withAGCLines): the solver holds them at AC ground, which they are at the
// signal's frequencies, not at a decoupler's few hertz, where the line's
// own capacitor is kilohms. A supply filter's response is solved with
// them free: review16 b03's IF rail decoupler fed Q1's bias chain down to
// the AGC line, 7.637 Hz held, 8.121 Hz free (ngspice 8.119 Hz).
func (x *figCtx) agcLines() map[int]bool {
	out := map[int]bool{}
	for id, r := range x.w.role {
		if r != graph.Bias || id == groundNet {
			continue
		}
		if i, ok := x.w.netAt[x.netName(id)]; ok && x.w.c.Nets[i].Volts == 0 {
			out[id] = true
		}
	}
	return out
}

// reachPast is reach with the nets of past walked through even where the
// solver takes them as ground.
func (w *world) reachPast(from, stop []int, atGround bool, past map[int]bool) []int {
	return w.reachWith(from, stop, func(o int) bool { return !atGround || past[o] || !w.role[o].IsACGround() })
}

// reach is the parts (ascending) reached from the nets from without
// passing the nets stop or the folded ground, nor, with atGround, any
// other net the solver takes as ground.
func (w *world) reach(from, stop []int, atGround bool) []int {
	return w.reachWith(from, stop, func(o int) bool { return !atGround || !w.role[o].IsACGround() })
}

// reachWith is reach going on from the nets next says.
func (w *world) reachWith(from, stop []int, goOn func(int) bool) []int {
	seen := map[int]bool{groundNet: true}
	for _, id := range stop {
		seen[id] = true
	}
	for _, id := range from {
		seen[id] = true
	}
	in := map[int]bool{}
	var idx []int
	frontier := from
	for len(frontier) > 0 {
		var more []int
		for _, id := range frontier {
			for _, ci := range w.conns[id] {
				if in[ci] {
					continue
				}
				in[ci] = true
				idx = append(idx, ci)
				for _, o := range w.pins[ci] {
					if !seen[o] {
						seen[o] = true
						if goOn(o) {
							more = append(more, o)
						}
					}
				}
			}
		}
		frontier = more
	}
	slices.Sort(idx)
	return idx
}

// keepsDiode tells whether a diode, or a valve diode, is among the parts
// idx: the solver gives it its DC load from the circuit's DC paths.
func (x *figCtx) keepsDiode(idx []int) bool {
	for _, ci := range idx {
		if isDiode(x.w.parts[ci]) {
			return true
		}
	}
	return false
}
