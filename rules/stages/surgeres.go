package stages

import (
	"slices"

	"pare/graph"
)

// A surge resistor between a rectifier and its reservoir (review19 a05 as
// first captured: 47 Ω from the bridge's output to the reservoir) carries
// the charging pulses: it is part of the rectifier's feed, not a filter
// section, and the reservoir behind it is the rectifier's, with the ripple
// the DC estimate gives there (graph/dc models the resistor the same way).

// surgeReservoir is the reservoir behind a surge resistor from id: id holds
// no capacitor to chassis of its own and nothing but rectifying junctions
// and one two-terminal resistor, whose far end is a reservoir. It returns
// that net and the resistor's part index, or −1, −1.
func (x *figCtx) surgeReservoir(id int) (res, ri int) {
	res, ri = -1, -1
	if id < 0 || id == groundNet || x.isReservoir(id) {
		return -1, -1
	}
	junctions := 0
	for _, ci := range x.w.conns[id] {
		p := x.w.parts[ci]
		switch {
		case p.Kind == graph.Diode || p.Kind == graph.Valve && isValveDiode(p):
			junctions++
		case p.Kind == graph.Resistor && len(x.w.pins[ci]) == 2 && ri < 0:
			ri = ci
		default:
			return -1, -1
		}
	}
	if ri < 0 || junctions == 0 {
		return -1, -1
	}
	far := x.w.pins[ri][0]
	if far == id {
		far = x.w.pins[ri][1]
	}
	if !x.isReservoir(far) {
		return -1, -1
	}
	return far, ri
}

// chargedNet is the reservoir a junction's end id charges: id itself when
// it is a reservoir, the one behind a surge resistor from it, else −1.
func (x *figCtx) chargedNet(id int) int {
	if id < 0 {
		return -1
	}
	if x.isReservoir(id) {
		return id
	}
	res, _ := x.surgeReservoir(id)
	return res
}

// rectifierBehindSurge tells whether a power rectifier charges id through
// a surge resistor.
func (x *figCtx) rectifierBehindSurge(id int) bool {
	for _, ci := range x.w.conns[id] {
		if x.w.parts[ci].Kind != graph.Resistor || len(x.w.pins[ci]) != 2 {
			continue
		}
		near := x.w.pins[ci][0]
		if near == id {
			near = x.w.pins[ci][1]
		}
		if res, ri := x.surgeReservoir(near); res != id || ri != ci {
			continue
		}
		for _, cj := range x.w.conns[near] {
			if x.isPowerRectifier(cj) {
				return true
			}
		}
	}
	return false
}

// isSurgeSection tells whether series part si between in and out is a
// surge resistor into its reservoir, either way round.
func (x *figCtx) isSurgeSection(si, in, out int) bool {
	if res, ri := x.surgeReservoir(in); ri == si && res == out {
		return true
	}
	res, ri := x.surgeReservoir(out)
	return ri == si && res == in
}

// surgeResistors are the surge resistors between the match's rectifying
// junctions and their reservoirs (surgeReservoir) the match does not hold
// itself: a rectifier stage owns the resistor that carries its charging
// pulses, so a sheet frames it with the bridge, and the smoothing filter
// behind its reservoir follows the rectifier's frame, rather than drawing
// resistor and reservoir loose in a signal row (review19 a05 as first
// captured).
func (x *figCtx) surgeResistors() []string {
	var out []string
	for _, ci := range x.m.parts {
		if ci < 0 {
			continue
		}
		if p := x.w.parts[ci]; p.Kind != graph.Diode && !(p.Kind == graph.Valve && isValveDiode(p)) {
			continue
		}
		for _, id := range x.w.pins[ci] {
			_, ri := x.surgeReservoir(id)
			if ri < 0 || inMatch(x.m, ri) || slices.Contains(out, x.w.parts[ri].Ref) {
				continue
			}
			out = append(out, x.w.parts[ri].Ref)
		}
	}
	return out
}
