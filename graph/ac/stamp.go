package ac

import (
	"fmt"
	"math"
	"sort"

	"pare/graph"
	"pare/graph/device"
)

// stamper turns parts into primitive elements on the numbered nodes of nl,
// collecting the errors of parts that have no model.
type stamper struct {
	nl   *netlist
	c    *graph.Circuit
	frac float64 // gang setting
	errs graph.ErrorList
	dc   *dcShare // the DC view for detector loads, built at the first diode
	// regions answers each coil's band (its winding loss), built at the
	// first coil: a whole set has a region per channel and a coil per
	// tank, and Circuit.BandCentre walks every region's lists per coil.
	regions *graph.RegionIndex
}

// bandCentre is c.BandCentre(p) through the stamper's region index.
func (st *stamper) bandCentre(c *graph.Circuit, p *graph.Part) float64 {
	if st.regions == nil {
		st.regions = c.RegionIndex()
	}
	return st.regions.BandCentre(p)
}

// node is the node of a net, -1 for an unconnected terminal.
func (st *stamper) node(net string) int {
	nl := st.nl
	if !usable(net) {
		return -1
	}
	if id, ok := nl.netNode[net]; ok {
		return id
	}
	// A net named by a pin but missing from the net list: give it a node.
	nl.nodes = append(nl.nodes, net)
	nl.netNode[net] = len(nl.nodes) - 1
	return len(nl.nodes) - 1
}

// two stamps a two-terminal element between two of p's pins.
func (st *stamper) two(k primKind, p *graph.Part, sub, pa, pb string, v float64) {
	a, b := st.node(p.NetOf(pa)), st.node(p.NetOf(pb))
	if a < 0 || b < 0 || a == b {
		return // an open end carries no current; both ends on one node do nothing
	}
	st.nl.prims = append(st.nl.prims, prim{kind: k, ref: p.Ref, sub: sub, a: a, b: b, v: v})
}

// vccs stamps gm·v(control, common) from out to common.
func (st *stamper) vccs(p *graph.Part, sub, out, common, control string, gm float64) {
	a, k, g := st.node(p.NetOf(out)), st.node(p.NetOf(common)), st.node(p.NetOf(control))
	if a < 0 || k < 0 || gm == 0 {
		return
	}
	if g < 0 {
		st.errs.Add(p.Pos, "%s %s: control terminal %s is not connected: the small-signal model needs it", p.Kind, p.Ref, control)
		return
	}
	if a == k {
		return
	}
	st.nl.prims = append(st.nl.prims, prim{kind: primVCCS, ref: p.Ref, sub: sub, a: a, b: k, c: g, d: k, v: gm})
}

func (st *stamper) fail(p *graph.Part, err error) { st.errs.Add(p.Pos, "%v", err) }

// part stamps one part's small-signal model. Valves, transistors, diodes
// and crystals take their values from graph/device (st.device), the one
// model the reduction's judgements and the stage figures use too.
func (st *stamper) part(c *graph.Circuit, p *graph.Part) {
	switch p.Kind {
	case graph.Resistor:
		if p.Value.Max > 0 {
			st.two(primR, p, "", "1", "2", p.Value.Max)
		}
	case graph.Capacitor:
		a, b := "1", "2"
		if p.Type == graph.CapElectrolytic {
			a, b = "+", "-"
		}
		if cv := p.Capacitance(st.frac); cv > 0 {
			st.two(primC, p, "", a, b, cv)
		}
	case graph.Loudspeaker:
		// Its rated impedance as a resistance: what an output transformer
		// reflects; the voice coil's inductance and cone resonance are not
		// in the netlist.
		if p.Value.Max > 0 {
			st.two(primR, p, "", "1", "2", p.Value.Max)
		}
	case graph.Inductor, graph.Transformer:
		st.nl.windings(p, func() float64 { return st.bandCentre(c, p) }, st.node, &st.errs)
	case graph.Valve, graph.BJT, graph.FET, graph.Diode, graph.Crystal:
		st.device(p)
	case graph.Pot:
		r := p.Value.Max
		if r > 0 && p.Set > 0 {
			st.two(primR, p, "1w", "1", "w", p.Set*r)
		}
		if r > 0 && p.Set < 1 {
			st.two(primR, p, "w2", "w", "2", (1-p.Set)*r)
		}
	}
}

// device stamps an active part, a diode or a crystal with the values of
// graph/device.
func (st *stamper) device(p *graph.Part) {
	switch p.Kind {
	case graph.Valve:
		switch p.Type {
		case "diode":
			st.diode(p, "", []string{"a"}, "k")
		case "double-diode":
			st.diode(p, "a", []string{"a1", "a2"}, "k")
		default:
			s, err := device.Of(p)
			if err != nil {
				st.fail(p, err)
				return
			}
			st.two(primR, p, "ra", "a", "k", s.ROut)
			st.vccs(p, "gm", "a", "k", "g1", s.Gm)
			// A pentagrid converter's oscillator anode (g2) draws the
			// inner triode's current, ruled by g1 as the anode's is:
			// without it the oscillator loop through g2 is not there.
			if s.GmOsc > 0 && p.NetOf("g2") != "" {
				st.vccs(p, "gmo", "g2", "k", "g1", s.GmOsc)
			}
		}
	case graph.BJT:
		s, err := device.Of(p)
		if err != nil {
			st.fail(p, err)
			return
		}
		st.two(primR, p, "rpi", "b", "e", s.RPi)
		st.two(primR, p, "ro", "c", "e", s.ROut)
		st.vccs(p, "gm", "c", "e", "b", s.Gm)
	case graph.FET:
		s, err := device.Of(p)
		if err != nil {
			st.fail(p, err)
			return
		}
		st.two(primR, p, "rd", "d", "s", s.ROut)
		st.vccs(p, "gm", "d", "s", "g", s.Gm)
	case graph.Diode:
		st.diode(p, "", []string{"a"}, "k")
	case graph.Crystal:
		rm, lm, cm, c0, err := device.Crystal(p)
		if err != nil {
			st.fail(p, err)
			return
		}
		a, b := st.node(p.NetOf("1")), st.node(p.NetOf("2"))
		if a >= 0 && b >= 0 && a != b {
			st.nl.prims = append(st.nl.prims, prim{kind: primRLC, ref: p.Ref, sub: "m", a: a, b: b, r: rm, l: lm, C: cm})
			if c0 > 0 {
				st.two(primC, p, "c0", "1", "2", c0)
			}
		}
	}
}

// diode stamps each section of a diode, anode to cathode, with its rd from
// graph/device. A section's DC load (detector.go) is shared by the sections
// whose anodes are on the same net: each carries that many times the load,
// so together they take the detector's input resistance once. sub prefixes
// the anode's name in the element's piece name ("" for a lone section,
// whose piece is "").
func (st *stamper) diode(p *graph.Part, sub string, anodes []string, cathode string) {
	for _, a := range anodes {
		load := math.Inf(1)
		_, own := p.Param("rd")
		if !own && InverseParallel(st.c, p, a, cathode) {
			continue // a limiter's pair: off at rest, it conducts only on the swing
		}
		if !own && p.Type != "varicap" {
			load = st.detectorLoad(p, anodes, a, cathode)
		}
		piece := ""
		if sub != "" {
			piece = a
		}
		if rd, _ := device.DiodeRd(p, load); rd > 0 {
			st.two(primR, p, piece, a, cathode, rd)
		}
	}
}

// terminations stamps the stated terminations, in name order.
func (st *stamper) terminations(c *graph.Circuit, o Options) {
	var terms []string
	for net := range o.Terminate {
		terms = append(terms, net)
	}
	sort.Strings(terms)
	for i, net := range terms {
		r := o.Terminate[net]
		if r < 0 || math.IsNaN(r) {
			st.errs.Add(graph.Pos{File: c.File}, "termination of net %s must be a resistance ≥ 0, not %g", net, r)
			continue
		}
		id, ok := st.nl.netNode[net]
		if !ok {
			st.errs.Add(graph.Pos{File: c.File}, "termination names net %q, which is not in the circuit", net)
			continue
		}
		if r > 0 && id != 0 && !math.IsInf(r, 1) {
			st.nl.prims = append(st.nl.prims, prim{kind: primR, ref: fmt.Sprintf("term%d", i+1), a: id, b: 0, v: r})
		}
	}
}
