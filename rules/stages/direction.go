package stages

import (
	"math"
	"slices"
	"sort"

	"pare/graph"
)

// Which way the signal runs through a match: a calc asks so it can pair a
// resistor with the capacitor it really works with.

// backwards tells whether a series resistor runs against the signal into
// its shunt capacitor: the resistor's free end (not on the capacitor) is
// farther from the inputs than the capacitor's net. In a ladder R1 C1 R2 C2
// the pair R2–C1 has the shape of a section but C1 belongs to R1.
func (x *figCtx) backwards(rs, cs []*graph.Part) bool {
	if len(rs) != 1 || len(cs) != 1 {
		return false
	}
	ri, cj := x.partIndex(rs[0]), x.partIndex(cs[0])
	if ri < 0 || cj < 0 || len(x.w.pins[ri]) != 2 {
		return false
	}
	onC := map[int]bool{}
	for _, id := range x.w.pins[cj] {
		onC[id] = true
	}
	free, shared := -1, -1
	for _, id := range x.w.pins[ri] {
		if onC[id] && id != groundNet {
			shared = id
		} else {
			free = id
		}
	}
	if free < 0 || shared < 0 {
		return false
	}
	return x.netDist(free, ri, cj) > x.netDist(shared, ri, cj)
}

// upstream tells whether the shunt resistor of a coupling capacitor sits on
// the capacitor's driven side: the net it shares with the capacitor is
// nearer the inputs than the capacitor's other end. A coupling corner is
// set by the resistance the capacitor feeds (the next grid leak or load),
// f = 1/(2πRC); the resistor on the driving side (an anode load, a source
// resistor) is part of the source and sets no corner with it.
func (x *figCtx) upstream(rs, cs []*graph.Part) bool {
	if len(rs) != 1 || len(cs) != 1 {
		return false
	}
	ri, cj := x.partIndex(rs[0]), x.partIndex(cs[0])
	if ri < 0 || cj < 0 || len(x.w.pins[cj]) != 2 {
		return false
	}
	onR := map[int]bool{}
	for _, id := range x.w.pins[ri] {
		onR[id] = true
	}
	shared, other := -1, -1
	for _, id := range x.w.pins[cj] {
		if onR[id] && id != groundNet && shared < 0 {
			shared = id
		} else {
			other = id
		}
	}
	if shared < 0 || other < 0 || other == shared {
		return false
	}
	if sp := speakerLoad(x.w, other); sp > 0 && outputDriven(x.w, shared, cj, sp*drivenSeriesMax) {
		// an output device drives the resistor's side and the loudspeaker
		// is on the other: the signal runs into the speaker however near
		// the inputs an overall feedback resistor from it stands (review20
		// b04: C7 was paired with the mid-point's DC feedback resistor R2)
		return true
	}
	return x.netDist(shared, ri, cj) < x.netDist(other, ri, cj)
}

// netDist is how far a net lies from the inputs: a declared input -1, else
// the least distance of the parts on it other than those given, MaxInt when
// none is reached.
func (x *figCtx) netDist(net int, skip ...int) int {
	if x.w.isInput(net) {
		return -1
	}
	dist := x.w.forwardDist()
	d := math.MaxInt
	for _, ci := range x.w.conns[net] {
		if slices.Contains(skip, ci) {
			continue
		}
		if od, ok := dist[x.w.parts[ci].Ref]; ok && od < d {
			d = od
		}
	}
	return d
}

// loadsBeyond lists the parts outside the match on the signal nets of the
// given shunt parts that draw current: everything but ports and the control
// terminal of an amplifying device (a grid or gate takes next to none).
func (x *figCtx) loadsBeyond(shunts []*graph.Part) []string {
	in := map[int]bool{}
	for _, ci := range x.m.parts {
		in[ci] = true
	}
	seen := map[string]bool{}
	var out []string
	for _, p := range shunts {
		pi := x.partIndex(p)
		if pi < 0 {
			continue
		}
		for _, net := range x.w.pins[pi] {
			if net == groundNet || x.heldByMatch(net, pi) {
				continue
			}
			for _, ci := range x.w.conns[net] {
				q := x.w.parts[ci]
				if in[ci] || q.Kind == graph.Port || seen[q.Ref] || x.controlOnly(ci, net) {
					continue
				}
				seen[q.Ref] = true
				out = append(out, q.Ref)
			}
		}
	}
	sort.Strings(out)
	return out
}

// controlOnly tells whether part ci touches net only through its control
// terminal (grid, base, gate): a high-impedance input, not a load.
func (x *figCtx) controlOnly(ci, net int) bool {
	touches := false
	for j, id := range x.w.pins[ci] {
		if id != net {
			continue
		}
		if x.w.roles[ci][j] != graph.RoleControl {
			return false
		}
		touches = true
	}
	return touches
}

// heldByMatch tells whether another part of the match ties net to AC
// ground: the shunt's foot on a bypassed return (a cathode the pattern's
// bypass holds), whose other parts load the bypass, not the section.
func (x *figCtx) heldByMatch(net, shunt int) bool {
	for _, ci := range x.m.parts {
		if ci < 0 || ci == shunt || len(x.w.pins[ci]) != 2 {
			continue
		}
		a, b := x.w.pins[ci][0], x.w.pins[ci][1]
		if a == net && b == groundNet || b == net && a == groundNet {
			return true
		}
	}
	return false
}
