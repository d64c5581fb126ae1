package stages

import (
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
// load from the DC paths of the circuit it is solved in, which run
// through the rails; then the walk passes the other rails as before.
func (x *figCtx) filterResponse(in, out int) (*ac.Response, error) {
	c := x.w.c
	inName, outName := x.netName(in), x.netName(out)
	keep := x.filterParts(in, out, true)
	if x.keepsDiode(keep) {
		keep = x.filterParts(in, out, false)
	}
	sub := withPart(c, &graph.Part{})
	sub.Parts = nil
	touched := map[string]bool{inName: true, outName: true}
	for ci, p := range x.w.parts {
		if keep[ci] {
			sub.Parts = append(sub.Parts, p)
			for _, pin := range p.Pins {
				touched[pin.Net] = true
			}
		}
	}
	// Only the nets the kept parts touch, in the circuit's order: the
	// solver numbers nets by name, so the section's nodes keep their
	// order and its matrix its every number, and the elaboration no
	// longer walks every net of the set for each section (which grew with
	// the square of the set).
	sub.Nets = nil
	for _, n := range c.Nets {
		if !touched[n.Name] {
			continue
		}
		if (n.Name == inName || n.Name == outName) && n.Role != graph.Signal {
			m := *n
			m.Role = graph.Signal
			n = &m
		}
		sub.Nets = append(sub.Nets, n)
	}
	return ac.NewTransfer(sub, inName, outName, gangMid.options())
}

// filterParts marks the parts reached from out without passing in, nor,
// with atGround, any other net the solver takes as ground (a rail, a
// heater line, chassis).
func (x *figCtx) filterParts(in, out int, atGround bool) []bool {
	keep := make([]bool, len(x.w.parts))
	seen := map[int]bool{out: true, in: true, groundNet: true}
	frontier := []int{out}
	for len(frontier) > 0 {
		var next []int
		for _, id := range frontier {
			for _, ci := range x.w.conns[id] {
				if keep[ci] {
					continue
				}
				keep[ci] = true
				for _, o := range x.w.pins[ci] {
					if !seen[o] {
						seen[o] = true
						if !atGround || !x.w.role[o].IsACGround() {
							next = append(next, o)
						}
					}
				}
			}
		}
		frontier = next
	}
	return keep
}

// keepsDiode tells whether a diode, or a valve diode, is among the parts
// marked: the solver gives it its DC load from the circuit's DC paths.
func (x *figCtx) keepsDiode(keep []bool) bool {
	for ci, p := range x.w.parts {
		if keep[ci] && (p.Kind == graph.Diode || p.Kind == graph.Valve && (p.Type == "diode" || p.Type == "double-diode")) {
			return true
		}
	}
	return false
}
