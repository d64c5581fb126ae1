package ac

import (
	"math"

	"pare/graph"
)

// section is one diode section, anode pin a to cathode pin k, as a
// detector's rectified current passes it.
type section struct {
	p    *graph.Part
	a, k string
}

// maxLoopDiodes bounds the diodes a loop load is looked for through: a
// ratio detector has two, a bridge four; a set with more signal diodes than
// this on one loop is no detector of that kind, and the count of diodes in
// series (one DC network per diode) would grow with the set.
const maxLoopDiodes = 8

// sectionLoad is the DC load of one diode section: the resistance its own
// DC paths give between anode and cathode, or, where they give none, its
// share of a loop closed through other signal diodes (loopLoad).
func (d *dcNet) sectionLoad(p *graph.Part, a, cathode string) float64 {
	l := d.load(p.NetOf(a), p.NetOf(cathode))
	if !math.IsInf(l, 1) || d.c == nil {
		return l
	}
	// remembered with the network's loads: each loop load builds and
	// factors a network per diode on it
	k := [2]string{"\x00loop " + p.Ref, a}
	if r, ok := d.loads[k]; ok {
		return r
	}
	r := loopLoad(d.c, p, a, cathode)
	d.loads[k] = r
	return r
}

// loopLoad is the load of a diode section whose current returns only
// through other diodes: a ratio detector's two diodes in series round the
// secondary, their loads from the far ends to chassis, so neither has a
// DC path of its own. With the others conducting, as they do with a carrier,
// the loop's resistance R is one rectifier's load, shared by the n diodes
// in series on it: each takes R/n, so its rd = R/(2n) (device.DetectorRd)
// and the n together load the winding with R/2, as one peak detector of
// load R would (docs/devices.md; a ratio detector's input resistance is
// half its total load, common practice). A diode is in series on the loop
// when the loop has no DC path without it. +Inf where no loop closes.
func loopLoad(c *graph.Circuit, p *graph.Part, a, cathode string) float64 {
	others := signalSections(c, p)
	if len(others) == 0 || len(others) > maxLoopDiodes {
		return math.Inf(1)
	}
	an, kn := p.NetOf(a), p.NetOf(cathode)
	r := newDCNet(c, others...).load(an, kn)
	if math.IsInf(r, 1) || !(r > 0) {
		return math.Inf(1)
	}
	n := 1
	for i := range others {
		rest := append(append([]section{}, others[:i]...), others[i+1:]...)
		if math.IsInf(newDCNet(c, rest...).load(an, kn), 1) {
			n++
		}
	}
	return r / float64(n)
}

// signalSections are the sections of the circuit's signal diodes other
// than p: those DiodeRd gives a detector's rd (no rectifier, zener,
// varicap, no diode held off or with its own rd), in circuit order.
func signalSections(c *graph.Circuit, p *graph.Part) []section {
	var out []section
	for _, q := range c.Parts {
		if q == p || q.Ref == p.Ref || !signalDiode(q) {
			continue
		}
		anodes, k := diodeSections(q)
		for _, a := range anodes {
			out = append(out, section{p: q, a: a, k: k})
		}
	}
	return out
}

// signalDiode says whether a part is a diode the solver may take as a
// conducting detector (device.DiodeRd's detector branch).
func signalDiode(q *graph.Part) bool {
	anodes, _ := diodeSections(q)
	if len(anodes) == 0 {
		return false
	}
	switch q.Type {
	case "varicap", "rectifier", "zener":
		return false
	}
	if off, ok := q.Param("off"); ok && off != 0 {
		return false
	}
	_, own := q.Param("rd")
	return !own
}
