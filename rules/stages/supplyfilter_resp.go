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
	keep := x.filterParts(in, out, true)
	ends := []string{inName, outName}
	sub := x.cutFreed(keep, ends, ends)
	if x.keepsDiode(keep) {
		// The walk that passes the other rails as well keeps the circuit
		// whose DC paths give the diodes their loads; the section's
		// response is solved on the piece closed at AC ground, the block
		// of the matrix its driven rail reaches in either, with those loads
		// (each elaboration of the wide one took a DC load for every
		// detector of the set, which grew with its square).
		if solveWide {
			wide := x.cutFreed(x.filterParts(in, out, false), ends, ends)
			return ac.NewTransfer(wide, inName, outName, gangMid.options())
		}
		dc, ok := x.dcCut(keep, in, ends)
		if !ok {
			dc = x.cutFreed(x.filterParts(in, out, false), ends, ends)
		}
		sub.DetectorLoads = withLoads(x.w.c.DetectorLoads, ac.DetectorLoads(dc, sub.Parts))
	}
	return ac.NewTransfer(sub, inName, outName, gangMid.options())
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

// reach is the parts (ascending) reached from the nets from without
// passing the nets stop or the folded ground, nor, with atGround, any
// other net the solver takes as ground.
func (w *world) reach(from, stop []int, atGround bool) []int {
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
		var next []int
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
						if !atGround || !w.role[o].IsACGround() {
							next = append(next, o)
						}
					}
				}
			}
		}
		frontier = next
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
