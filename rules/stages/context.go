package stages

import (
	"pare/graph"
	"pare/graph/safety"
)

// contextHolds tells whether the circuit around a match gives the
// evidence the pattern's context asks for: "fm", a set that receives FM
// with every part in an audio band (de-emphasis); "supply", evidence that
// a rectifier feeds a supply, not a signal (supplyEvidence).
func contextHolds(p *Pattern, w *world, st *Stage) bool {
	switch p.Context {
	case "fm":
		return fmReceived(w.c) && inAudioBand(w.c, st.Parts)
	case "supply":
		return supplyEvidence(w.c, st)
	}
	return true
}

// reservoirMinF is the least capacitance taken as a rectifier's reservoir:
// 1 µF. A valve set's reservoir is 8 to 100 µF, a transistor set's 100 µF
// and up; a detector's load capacitor is 100 pF to 10 nF (common practice,
// from memory), so the two never meet near 1 µF.
const reservoirMinF = 1e-6

// supplyEvidence tells a rectifier that makes a supply from a diode that
// detects a signal of the same shape (a diode on an IF transformer's
// secondary): one of the stage's transformers has a winding on the mains
// or a declared AC voltage (vac), or the rectifier's output is a declared
// supply rail, or it holds a reservoir (reservoirMinF) and reaches a
// declared rail through a resistor or choke.
func supplyEvidence(c *graph.Circuit, st *Stage) bool {
	for _, ref := range st.Parts {
		if p := c.Part(ref); p != nil && p.Kind == graph.Transformer && onMains(c, p) {
			return true
		}
	}
	out := st.nets["out"]
	if out == "" {
		return false
	}
	if c.RoleOf(out) == graph.Supply {
		return true
	}
	return hasReservoir(c, out) && feedsRail(c, out)
}

// onMains tells whether a transformer is a mains transformer: it declares
// the AC voltage it gives (vac), or one of its nets, or a port or part on
// one, speaks of the mains. The chassis is not such a net: in an AC/DC set
// it is tied to the mains neutral and says so ("chassis (mains
// neutral!)", a port "mains neutral: to chassis"), yet every winding that
// returns to it (the aerial coil, the IF cans, the output transformer's
// secondary) is a signal winding; a mains winding's other end is on the
// line side, which still speaks of the mains (review21 a05 had all five of
// its transformers dropped as mains transformers).
func onMains(c *graph.Circuit, t *graph.Part) bool {
	if _, ok := t.Param("vac"); ok {
		return true
	}
	for _, pin := range t.Pins {
		if c.RoleOf(pin.Net) == graph.Ground {
			continue
		}
		if n := c.Net(pin.Net); n != nil && (safety.SaysMains(n.Name) || safety.SaysMains(n.Label)) {
			return true
		}
		for _, cn := range c.ConnsOf(pin.Net) {
			if (cn.Part.Kind == graph.Port || cn.Part.Kind == graph.Generic) && safety.SaysMains(cn.Part.Label) {
				return true
			}
		}
	}
	return false
}

// hasReservoir: a capacitor of reservoirMinF or more from net to chassis.
func hasReservoir(c *graph.Circuit, net string) bool {
	for _, cn := range c.ConnsOf(net) {
		p := cn.Part
		if p.Kind != graph.Capacitor || p.Value.Max < reservoirMinF {
			continue
		}
		for _, pin := range p.Pins {
			if pin.Net != net && c.RoleOf(pin.Net) == graph.Ground {
				return true
			}
		}
	}
	return false
}

// feedsRail: a resistor or inductor (a smoothing resistor or choke) runs
// from net to a declared supply rail.
func feedsRail(c *graph.Circuit, net string) bool {
	for _, cn := range c.ConnsOf(net) {
		p := cn.Part
		if p.Kind != graph.Resistor && p.Kind != graph.Inductor {
			continue
		}
		for _, pin := range p.Pins {
			if pin.Net != net && c.RoleOf(pin.Net) == graph.Supply {
				return true
			}
		}
	}
	return false
}
