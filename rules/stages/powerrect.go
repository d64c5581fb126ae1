package stages

import (
	"math"

	"pare/graph"
)

// A diode rectifies for the supply only where its wiring says so: it is fed
// from a mains or power winding (or the mains itself) and charges a
// reservoir that supplies stages. A large capacitor on one of its ends is
// not enough: a double-diode-triode's diodes share the triode's cathode,
// whose bypass is microfarads, and the signal diode there is fed from a
// tuned IF winding — a detector, its partner the delayed-AGC diode, never an
// HT rectifier. So a junction is a supply rectifier's when
//   - the net it charges has a reservoir-sized capacitor to chassis
//     (reservoirMin) and is no amplifying device's cathode, emitter or
//     source (a capacitor there is that device's bypass), and
//   - the net it is fed from is not the hot end of a tuned signal winding
//     (tunedSignalWinding), nor is the net it charges also charged from one
//     (chargedByDetector: the AGC diode beside a detector).
// A diode the netlist types "rectifier" is one as declared.

// isPowerRectifier tells whether part ci is a rectifier that feeds a
// supply: a diode the netlist types "rectifier", or a diode or valve diode
// with a junction that charges a reservoir from a supply feed
// (supplyJunction).
func (x *figCtx) isPowerRectifier(ci int) bool {
	p := x.w.parts[ci]
	if p.Kind == graph.Diode && p.Type == "rectifier" {
		return true
	}
	if p.Kind != graph.Diode && !(p.Kind == graph.Valve && isValveDiode(p)) {
		return false
	}
	for _, j := range x.junctions(ci) {
		if _, ok := x.supplyJunction(j); ok {
			return true
		}
	}
	return false
}

// junction is one anode–cathode path of a diode or valve diode, by net id.
type junction struct{ a, k int }

// junctions are part ci's anode–cathode paths: one for a diode, one per
// anode for a valve diode (its heater pins are no path at all). k is −1
// where the cathode is not connected.
func (x *figCtx) junctions(ci int) []junction {
	p := x.w.parts[ci]
	k, anodes := -1, []int{}
	for j, pin := range p.Pins {
		switch pin.Name {
		case "k":
			k = x.w.pins[ci][j]
		case "a", "a1", "a2":
			anodes = append(anodes, x.w.pins[ci][j])
		}
	}
	out := make([]junction, 0, len(anodes))
	for _, a := range anodes {
		out = append(out, junction{a, k})
	}
	return out
}

// supplyJunction is the net a junction is fed from where it charges a
// reservoir: a positive supply's cathode charges it, a negative supply's
// anode draws it down. ok is false where neither end is a reservoir, the
// reservoir is a device's bypass, or the feed is a tuned signal winding.
func (x *figCtx) supplyJunction(j junction) (src int, ok bool) {
	src, res := -1, -1
	switch {
	case x.chargedNet(j.k) >= 0:
		src, res = j.a, x.chargedNet(j.k)
	case x.chargedNet(j.a) >= 0:
		src, res = j.k, x.chargedNet(j.a)
	}
	if src < 0 || x.isBypassNet(res) || x.tunedSignalWinding(src) || x.chargedByDetector(res) {
		return 0, false
	}
	return src, true
}

// chargedByDetector tells whether a diode on id is fed from a tuned signal
// winding: id is then a detector's load, and another diode charging it
// (the delayed-AGC diode beside the signal diode) is the detector's
// partner, not a supply's rectifier.
func (x *figCtx) chargedByDetector(id int) bool {
	for _, ci := range x.w.conns[id] {
		if p := x.w.parts[ci]; p.Kind != graph.Diode && !(p.Kind == graph.Valve && isValveDiode(p)) {
			continue
		}
		for _, j := range x.junctions(ci) {
			switch {
			case j.k == id && x.tunedSignalWinding(j.a), j.a == id && j.k >= 0 && x.tunedSignalWinding(j.k):
				return true
			}
		}
	}
	return false
}

// A rectifier's wiring, as rectWave reads it.
type waveKind int

const (
	noRectifier waveKind = iota
	halfWave             // one anode path into the reservoir: one pulse per mains cycle
	fullWave             // two anodes on the two ends of a centre-tapped winding
	bridgeWave           // two paths in and two return diodes from chassis
)

// rectWave reads how the rectifier is wired, never its part's type: the
// distinct nets that feed a reservoir through a supply junction
// (supplyJunction: anodes strapped together are one path) are its sources.
// One source is half-wave; two are full-wave, a bridge when two more
// junctions return from chassis to those sources. refs are the parts that
// make the rectifier, in part order: every part with a supply junction,
// and a bridge's return diodes, so two diodes are named as two and a
// double-diode valve as one.
func (x *figCtx) rectWave() (waveKind, []*graph.Part) {
	var all []junction
	var owner []int
	sources := map[int]bool{}
	in := map[int]bool{}
	for ci, p := range x.w.parts {
		if !(p.Kind == graph.Diode || p.Kind == graph.Valve && isValveDiode(p)) {
			continue
		}
		for _, j := range x.junctions(ci) {
			all, owner = append(all, j), append(owner, ci)
			if src, ok := x.supplyJunction(j); ok && src != groundNet {
				sources[src], in[ci] = true, true
			}
		}
	}
	wave := fullWave
	switch len(sources) {
	case 0:
		return noRectifier, nil
	case 1:
		wave = halfWave
	default:
		var returns []int // the parts of the junctions back from chassis
		for i, j := range all {
			if j.a == groundNet && sources[j.k] || j.k == groundNet && sources[j.a] {
				returns = append(returns, owner[i])
			}
		}
		if len(returns) >= 2 {
			wave = bridgeWave
			for _, ci := range returns {
				in[ci] = true
			}
		}
	}
	var parts []*graph.Part
	for ci, p := range x.w.parts {
		if in[ci] {
			parts = append(parts, p)
		}
	}
	return wave, parts
}

// reservoirMin is the least capacitance that makes a rectifier's load a
// reservoir, not a detector's RF bypass (hundreds of picofarads): common
// practice.
const reservoirMin = 1e-6

// isReservoir tells whether id (not chassis) has a reservoir-sized
// capacitor to chassis.
func (x *figCtx) isReservoir(id int) bool {
	if id == groundNet {
		return false
	}
	for _, cj := range x.w.conns[id] {
		q := x.w.parts[cj]
		if q.Kind == graph.Capacitor && q.Value.Max >= reservoirMin && slicesHas(x.w.pins[cj], groundNet) {
			return true
		}
	}
	return false
}

// isBypassNet tells whether an amplifying device's common electrode (a
// valve's cathode, a transistor's emitter or source) sits on id: a large
// capacitor there bypasses that device's bias resistor, it holds no supply.
func (x *figCtx) isBypassNet(id int) bool {
	for _, ci := range x.w.conns[id] {
		p := x.w.parts[ci]
		if p.Kind == graph.Diode || p.Kind == graph.Valve && isValveDiode(p) {
			continue
		}
		for j, pid := range x.w.pins[ci] {
			if pid == id && x.w.roles[ci][j] == graph.RoleCommon {
				return true
			}
		}
	}
	return false
}

// tunedSignalMin is the lowest resonance that makes a winding with a
// capacitor across it a tuned signal winding (an IF or RF can, the lowest
// IFs near 110 kHz): a mains or power winding's snubber capacitor resonates
// with it in the audio band, hundreds of hertz (common practice).
const tunedSignalMin = 50e3

// tunedSignalWinding tells whether id is an end of a transformer winding
// with a capacitor across its two ends that tunes it above tunedSignalMin:
// a detector's feed, never a supply's.
func (x *figCtx) tunedSignalWinding(id int) bool {
	for _, ci := range x.w.conns[id] {
		p := x.w.parts[ci]
		if p.Kind != graph.Transformer {
			continue
		}
		for _, cl := range x.w.coils[ci] {
			a, b := x.pinNet(ci, cl.pins[0]), x.pinNet(ci, cl.pins[len(cl.pins)-1])
			if a != id && b != id || !(cl.l > 0) {
				continue
			}
			if c := x.capAcross(a, b); c > 0 && 1/(2*math.Pi*math.Sqrt(cl.l*c)) >= tunedSignalMin {
				return true
			}
		}
	}
	return false
}

// pinNet is the net id of part ci's pin called name, −1 where it has none.
func (x *figCtx) pinNet(ci int, name string) int {
	for j, pin := range x.w.parts[ci].Pins {
		if pin.Name == name {
			return x.w.pins[ci][j]
		}
	}
	return -1
}

// capAcross is the capacitance directly between nets a and b (the largest
// of each capacitor's range), 0 where none joins them.
func (x *figCtx) capAcross(a, b int) float64 {
	if a < 0 || b < 0 || a == b {
		return 0
	}
	sum := 0.0
	for _, ci := range x.w.conns[a] {
		q := x.w.parts[ci]
		if q.Kind == graph.Capacitor && slicesHas(x.w.pins[ci], a) && slicesHas(x.w.pins[ci], b) {
			sum += q.Value.Max
		}
	}
	return sum
}

func slicesHas(ids []int, v int) bool {
	for _, id := range ids {
		if id == v {
			return true
		}
	}
	return false
}

// Detector is a signal diode found by its wiring alone (for a command
// whose detector no pattern matched): Ref the diode or valve diode fed from
// a tuned signal winding's end, Load the net its audio and DC appear on.
type Detector struct{ Ref, Load string }

// Detectors are the circuit's diodes fed from a tuned signal winding
// (tunedSignalWinding), in the circuit's order. The load is the diode's far
// side, or, where that is chassis or held there by a bypass (a valve
// diode's cathode beside its triode's), the winding's other end: the load
// then sits below the winding (common practice).
func Detectors(c *graph.Circuit) []Detector {
	x := &figCtx{w: newWorld(c, true, nil)}
	var out []Detector
	for ci, p := range x.w.parts {
		if p.Kind != graph.Diode && !(p.Kind == graph.Valve && isValveDiode(p)) {
			continue
		}
		for _, j := range x.junctions(ci) {
			feed, far := j.a, j.k
			if !x.tunedSignalWinding(feed) {
				feed, far = j.k, j.a
			}
			if feed < 0 || far < 0 || !x.tunedSignalWinding(feed) {
				continue
			}
			load := far
			if far == groundNet || x.isReservoir(far) {
				load = x.windingOtherEnd(feed)
			}
			if load > groundNet {
				out = append(out, Detector{Ref: p.Ref, Load: x.w.names[load]})
				break
			}
		}
	}
	return out
}

// windingOtherEnd is the far end of the tuned winding id is an end of, −1
// where there is none.
func (x *figCtx) windingOtherEnd(id int) int {
	for _, ci := range x.w.conns[id] {
		if x.w.parts[ci].Kind != graph.Transformer {
			continue
		}
		for _, cl := range x.w.coils[ci] {
			a, b := x.pinNet(ci, cl.pins[0]), x.pinNet(ci, cl.pins[len(cl.pins)-1])
			switch id {
			case a:
				return b
			case b:
				return a
			}
		}
	}
	return -1
}
