package dc

import (
	"pare/graph"
)

// Supply test points. After the rails themselves a technician reads the
// supply where it is fed on: the HT after the smoothing choke or resistor,
// each decoupled HT line, a decoupled bias line (common practice: a
// service sheet's voltage chart lists them). A supply point is a net that
// is not held and no valve's or transistor's electrode (those are test
// points already), has a capacitor to chassis (the smoothing or decoupling
// capacitor), and is fed from a rail or another supply point through a
// resistor, a coil or a winding.

// SupplyPoint is one supply test point.
type SupplyPoint struct {
	Net     string  `json:"net"`
	Volts   float64 `json:"volts"`
	Reading float64 `json:"reading"` // what the chart's meter shows there
	Via     string  `json:"via"`     // the resistor or coil that feeds it
	From    string  `json:"from"`    // the rail or supply point it is fed from
	Cap     string  `json:"cap"`     // its smoothing or decoupling capacitor
}

// supplyPoints walks from the rails along feed resistors and coils, in
// part order, so the list reads from the reservoir outwards.
func (p *Point) supplyPoints(mt Meter) ([]SupplyPoint, error) {
	out := p.supplyWalk()
	for i := range out {
		v, _ := p.Volts(out[i].Net)
		r, err := p.Reading(out[i].Net, mt)
		if err != nil {
			return nil, err
		}
		out[i].Volts, out[i].Reading = clean(v), clean(r)
	}
	return out, nil
}

// supplyWalk is the supply points in the order supplyPoints lists them,
// without their voltages.
func (p *Point) supplyWalk() []SupplyPoint {
	var out []SupplyPoint
	fed := map[string]bool{}
	var frontier []string
	for _, name := range p.m.fixedNet {
		if name != "" && p.Circuit.RoleOf(name) != graph.Ground && p.Circuit.RoleOf(name) != graph.Heater {
			if r := p.m.surgeFed(name); r != nil {
				fed[name] = true // the walk starts from the reservoir, the rail
				name = r.net
			}
			frontier = append(frontier, name)
			fed[name] = true
		}
	}
	for len(frontier) > 0 {
		var next []string
		for _, from := range frontier {
			for _, sp := range p.fedFrom(from, fed) {
				fed[sp.Net] = true
				out = append(out, sp)
				next = append(next, sp.Net)
			}
		}
		frontier = next
	}
	return out
}

// fedFrom lists the supply points one feed part away from net from.
func (p *Point) fedFrom(from string, fed map[string]bool) []SupplyPoint {
	var out []SupplyPoint
	for _, c := range p.Circuit.ConnsOf(from) {
		part := c.Part
		if part.Kind != graph.Resistor && part.Kind != graph.Inductor && part.Kind != graph.Transformer {
			continue
		}
		for _, q := range part.Pins {
			if q.Name == c.Pin || fed[q.Net] || (part.Kind == graph.Transformer && !sameWinding(part, c.Pin, q.Name)) {
				continue
			}
			if cp := p.supplyCap(q.Net); cp != "" && !p.isElectrode(q.Net) && p.m.netTerm[q.Net] >= 0 {
				fed[q.Net] = true
				out = append(out, SupplyPoint{Net: q.Net, Via: part.Ref, From: from, Cap: cp})
			}
		}
	}
	return out
}

// sameWinding: pins a and b of a transformer lie on one winding.
func sameWinding(p *graph.Part, a, b string) bool {
	for _, w := range p.Windings {
		if (w.From == a || w.To == a) && (w.From == b || w.To == b) {
			return true
		}
	}
	return false
}

// supplyCap is the first capacitor from net to chassis ("" if none).
func (p *Point) supplyCap(net string) string { return GroundCap(p.Circuit, net) }

// GroundCap is the first capacitor (by ref) from net to chassis in c, ""
// if none: a rail's reservoir or a supply line's decoupler.
func GroundCap(c *graph.Circuit, net string) string {
	for _, cn := range c.ConnsOf(net) {
		if cn.Part.Kind != graph.Capacitor || len(cn.Part.Pins) != 2 {
			continue
		}
		other := cn.Part.Pins[0].Net
		if other == net {
			other = cn.Part.Pins[1].Net
		}
		if c.RoleOf(other) == graph.Ground {
			return cn.Part.Ref
		}
	}
	return ""
}

// isElectrode: a valve's, transistor's or diode's pin is on net.
func (p *Point) isElectrode(net string) bool {
	for _, c := range p.Circuit.ConnsOf(net) {
		switch c.Part.Kind {
		case graph.Valve, graph.BJT, graph.FET, graph.Diode:
			return true
		}
	}
	return false
}

// PositiveEarthLeads is the meter-lead line of the chart for a set whose
// supply rails are all negative to chassis (a positive-earth PNP set): the
// usual "negative lead to chassis" would make every reading swing the
// wrong way on an analogue meter (common practice).
const PositiveEarthLeads = "Positive-earth set: chassis is the positive side, so instead clip the meter's positive (red) lead to chassis and probe with the negative one; the chart gives the voltages as negative to chassis."

// PositiveEarth reports whether every supply rail is negative to chassis
// (and there is one).
func (p *Point) PositiveEarth() bool {
	n := 0
	for i, name := range p.m.fixedNet {
		if name == "" || p.Circuit.RoleOf(name) != graph.Supply {
			continue
		}
		if p.m.fixedV[i] >= 0 {
			return false
		}
		n++
	}
	return n > 0
}
