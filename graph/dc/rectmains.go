package dc

import (
	"fmt"
	"math"

	"pare/graph"
)

// An AC/DC set has no mains transformer: its half-wave rectifier takes the
// mains straight from the inlet, through the fuse, the on/off switch and a
// surge resistor, and one side of the mains is the chassis. A port or a
// generic part (the inlet) that gives `vac` (the mains' RMS volts) and
// optionally `hz` is the source of such a rectifier: its reservoir becomes
// an estimated rail exactly as a transformer's does (rectifier.go), with
// the resistors in series on the way from the inlet to the anode as the
// source resistance, in place of a winding's rdc. The fuse and the switch
// are taken as closed, lossless connections; the mains itself as stiff
// (no source resistance of its own: a house supply's few tenths of an ohm
// are small beside a surge limiter's tens).

// mainsRectifierMethod is rectifierMethod with the series resistance from
// the mains in place of the winding's.
const mainsRectifierMethod = "capacitor-input filter: the reservoir's periodic steady state over the mains cycle (the series resistance from the mains, each junction's own law); cross-check: conduction angle (Schade, Proc. IRE 1943)"

// DropIn says where an estimate's drop (peak less the reservoir's top) is
// lost: in the diodes and the winding, or with no transformer in the
// diode and the resistance before it.
func (e *Estimate) DropIn() string {
	if e.Mains != "" {
		return "the rectifier and the resistance from the mains"
	}
	return "the diodes and winding"
}

// findMainsRectifiers finds the half-wave rectifier of every port or
// generic part that gives vac; a part whose mains reaches no rectifier
// (an inlet that feeds a mains transformer) gives none.
func findMainsRectifiers(c *graph.Circuit, diodes []rectDiode) ([]rectifier, error) {
	var out []rectifier
	for _, p := range c.Parts {
		vac, ok := p.Param("vac")
		if !ok || (p.Kind != graph.Port && p.Kind != graph.Generic) {
			continue
		}
		r, found, err := mainsRectifierOf(c, p, vac, diodes)
		if err != nil {
			return nil, &graph.Error{Pos: p.Pos, Msg: fmt.Sprintf("%s %s: %v", p.Kind, p.Ref, err)}
		}
		if found {
			out = append(out, r)
		}
	}
	return out, nil
}

// mainsRectifierOf is the rectifier fed from the mains at p: the junctions
// whose anode reaches a pin of p along a series path, all into one
// reservoir from one anode net.
func mainsRectifierOf(c *graph.Circuit, p *graph.Part, vac float64, diodes []rectDiode) (rectifier, bool, error) {
	var fwd []rectDiode
	var path mainsPath
	for _, d := range diodes {
		if !acNet(c, d.a) {
			continue
		}
		mp, ok := seriesPathTo(c, d.a, p)
		if !ok {
			continue
		}
		if len(fwd) > 0 && (d.a != fwd[0].a || d.k != fwd[0].k) {
			return rectifier{}, false, fmt.Errorf("vac is given and rectifiers on %s and %s take the mains: pare estimates one half-wave rectifier straight off the mains", fwd[0].a, d.a)
		}
		fwd, path = append(fwd, d), mp
	}
	if len(fwd) == 0 {
		return rectifier{}, false, nil
	}
	if !returnsToChassis(c, p, path.pin) {
		return rectifier{}, false, fmt.Errorf("vac is given but the mains side that does not feed rectifier %s reaches no chassis: pare estimates a half-wave rectifier with one side of the mains at chassis", fwd[0].part.Ref)
	}
	r := rectifier{net: fwd[0].k, xfmr: p.Ref, mains: true, hz: def("mains", "hz"), peak: math.Sqrt2 * vac, diodes: 1,
		wave: "half-wave", ends: path.nets, rs: path.ohms, valve: fwd[0].valve}
	if hz, ok := p.Param("hz"); ok {
		r.hz = hz
	}
	if len(path.resistors) == 1 { // the surge limiter: its heat is the pulses' (chart.go)
		r.surge, r.rsurge = path.resistors[0].Ref, path.resistors[0].Value.Max
	}
	r.junctionLaw(fwd[0].part)
	for _, d := range fwd {
		r.parts = appendNew(r.parts, d.part.Ref)
	}
	if r.c = reservoir(c, r.net); !(r.c > 0) {
		return rectifier{}, false, fmt.Errorf("no reservoir capacitor from %s to chassis: pare estimates capacitor-input filters only", r.net)
	}
	return r, true, nil
}

func appendNew(list []string, s string) []string {
	for _, x := range list {
		if x == s {
			return list
		}
	}
	return append(list, s)
}

// acNet tells whether a net can carry the mains: not chassis, a rail or a
// heater line.
func acNet(c *graph.Circuit, n string) bool {
	switch c.RoleOf(n) {
	case graph.Ground, graph.Supply, graph.Bias, graph.Heater:
		return false
	}
	return n != ""
}

// mainsPath is the series path from a rectifier's anode to the mains part:
// the pin of the part it reaches, its nets off chassis (the anode's first;
// they carry the mains' AC), its resistors and their sum.
type mainsPath struct {
	pin       string
	nets      []string
	resistors []*graph.Part
	ohms      float64
}

// maxSeries bounds the path: inlet, fuse, switch, a limiter or two.
const maxSeries = 8

// seriesPathTo walks from net through series connections (resistors,
// closed switch contacts, two-pin generic parts such as a fuse) to a pin
// of p, breadth first so the path with fewest parts wins; false when none
// reaches it within maxSeries parts.
func seriesPathTo(c *graph.Circuit, net string, p *graph.Part) (mainsPath, bool) {
	prev := map[string]seriesStep{net: {}}
	level := []string{net}
	for hop := 0; hop <= maxSeries && len(level) > 0; hop++ {
		var next []string
		for _, n := range level {
			for _, cn := range c.ConnsOf(n) {
				q := cn.Part
				if q == p {
					return tracePath(prev, n, cn.Pin), true
				}
				for _, far := range seriesFar(q, n, true) {
					if _, seen := prev[far]; seen || !acNet(c, far) {
						continue
					}
					prev[far] = seriesStep{n, q}
					next = append(next, far)
				}
			}
		}
		level = next
	}
	return mainsPath{}, false
}

// seriesStep is how the walk reached a net: from which net, through which part.
type seriesStep struct {
	from string
	via  *graph.Part
}

// tracePath reads the walk back from the net where the mains part's pin was met.
func tracePath(prev map[string]seriesStep, at, pin string) mainsPath {
	mp := mainsPath{pin: pin}
	var nets []string
	for n := at; n != ""; n = prev[n].from {
		nets = append(nets, n)
		if q := prev[n].via; q != nil && q.Kind == graph.Resistor && q.Value.Max > 0 {
			mp.resistors = append([]*graph.Part{q}, mp.resistors...)
			mp.ohms += q.Value.Max
		}
	}
	for i := len(nets) - 1; i >= 0; i-- { // the anode's net first
		mp.nets = append(mp.nets, nets[i])
	}
	return mp
}

// seriesFar is the nets q joins to n in series: a resistor's other end
// (only a zero-ohm one unless ohmic), a closed switch contact's other
// side, a two-pin generic part's (a fuse's) other pin.
func seriesFar(q *graph.Part, n string, ohmic bool) []string {
	if q == nil {
		return nil
	}
	other := func() []string {
		if len(q.Pins) != 2 {
			return nil
		}
		if q.Pins[0].Net == n {
			return []string{q.Pins[1].Net}
		}
		return []string{q.Pins[0].Net}
	}
	switch q.Kind {
	case graph.Resistor:
		if ohmic || q.Value.Max == 0 {
			return other()
		}
	case graph.Generic:
		return other()
	case graph.Switch:
		var out []string
		if pos := int(q.Set); pos >= 1 && pos <= len(q.Closes) {
			for _, pr := range q.Closes[pos-1] {
				a, b := q.NetOf(pr[0]), q.NetOf(pr[1])
				switch n {
				case a:
					out = append(out, b)
				case b:
					out = append(out, a)
				}
			}
		}
		return out
	}
	return nil
}

// returnsToChassis tells whether the mains part's side other than pin
// reaches chassis through closed contacts, fuses and links: a one-pin port
// is the mains against chassis itself.
func returnsToChassis(c *graph.Circuit, p *graph.Part, pin string) bool {
	if len(p.Pins) < 2 {
		return true
	}
	var level []string
	seen := map[string]bool{}
	for _, pn := range p.Pins {
		if pn.Name != pin && pn.Net != "" {
			level, seen[pn.Net] = append(level, pn.Net), true
		}
	}
	for hop := 0; hop <= maxSeries && len(level) > 0; hop++ {
		var next []string
		for _, n := range level {
			if c.RoleOf(n) == graph.Ground {
				return true
			}
			for _, cn := range c.ConnsOf(n) {
				if cn.Part == p {
					continue
				}
				for _, far := range seriesFar(cn.Part, n, false) {
					if !seen[far] {
						seen[far] = true
						next = append(next, far)
					}
				}
			}
		}
		level = next
	}
	return false
}

// mainsHints says, for each rectifier straight off the mains into a rail
// the netlist declares (no inlet gives vac), how to have it estimated: an
// AC/DC set captured without the mains' volts gets its HT as declared and
// no ripple, and the reader should know the one key that changes that.
func mainsHints(c *graph.Circuit, rects []rectifier) []string {
	var out []string
	said := map[string]bool{}
	for _, d := range rectDiodes(c) {
		if !acNet(c, d.a) || c.RoleOf(d.k) != graph.Supply || !(reservoir(c, d.k) > 0) || said[d.k] || estimatedNet(rects, d.k) {
			continue
		}
		// The inlet is the farthest such part: a fuse on the way is one too.
		var inlet *graph.Part
		far := 0
		for _, p := range c.Parts {
			if p.Kind != graph.Port && p.Kind != graph.Generic {
				continue
			}
			mp, ok := seriesPathTo(c, d.a, p)
			if ok && len(mp.nets) > far && returnsToChassis(c, p, mp.pin) {
				inlet, far = p, len(mp.nets)
			}
		}
		if inlet != nil {
			said[d.k] = true
			out = append(out, fmt.Sprintf("rail %s is fed by %s straight off the mains at %s: it is held at its declared volts with no ripple; give %s vac (the mains' RMS volts, e.g. vac = \"230\") and hz for pare to estimate both", d.k, d.part.Ref, inlet.Ref, inlet.Ref))
		}
	}
	return out
}

// estimatedNet tells whether a rectifier estimate holds net.
func estimatedNet(rects []rectifier, net string) bool {
	for _, r := range rects {
		if r.net == net || r.feed == net {
			return true
		}
	}
	return false
}
