package dc

import (
	"fmt"
	"math"
	"regexp"
	"slices"
	"strconv"

	"pare/graph"
)

// A resistor in series with valve heaters (the dropper of an AC/DC set's
// heater chain, a ballast) carries the heaters' current, which is AC from
// the mains: the DC solve leaves heater pins out (the heater is its own
// circuit), so it sees no current there and would print 0 W for a part
// that runs hot. The heaters are resistive, so the chain's current is a
// sine of the heaters' rated RMS current, and the resistor dissipates
// I²·R with I that RMS current (handbook: P = I_rms²·R). The rated current
// is the valves' ih; the chain's valves must agree on it (a series chain
// has one current).

// heaterChainHeat is the dissipation of a resistor in series with a
// heater chain: the watts and a note on where they come from, or a note
// saying why they are not known; ok is false when the resistor is in no
// heater chain.
func (p *Point) heaterChainHeat(part *graph.Part) (w float64, note string, ok bool) {
	valves := p.chainValves(part)
	if len(valves) == 0 {
		return 0, "", false
	}
	var ih float64
	var from string
	for _, v := range valves {
		x, has := v.Param("ih")
		switch {
		case !has:
		case ih == 0:
			ih, from = x, v.Ref
		case math.Abs(x-ih) > 0.01*ih:
			return 0, fmt.Sprintf("in the heater chain of %s: its valves' ih differ (%s %.3g A, %s %.3g A), so the chain's current is not known", refs(valves), from, ih, v.Ref, x), true
		}
	}
	if ih == 0 {
		return 0, fmt.Sprintf("in the heater chain of %s (AC from the mains, outside the DC solve): give the valves' heater current ih for its dissipation", refs(valves)), true
	}
	if across, r, known := p.shunted(part); across != "" {
		// a shunt across a part of the chain (a dial lamp's): the chain's
		// current divides between the two by their resistances
		if !known {
			return 0, fmt.Sprintf("across %s in the heater chain of %s: its share of the chain's %.3g A is not known (give %s's resistance, or its rating as volts and amps)", across, refs(valves), ih, across), true
		}
		i := ih * r / (r + part.Value.Max)
		return i * i * part.Value.Max, fmt.Sprintf("AC: its share %.3g A RMS of the heater chain's %.3g A (ih of %s), across %s (%.3g Ω hot), squared times R", i, ih, from, across, r), true
	}
	return ih * ih * part.Value.Max, fmt.Sprintf("AC: heater chain current %.3g A RMS (ih of %s) squared times R", ih, from), true
}

// shunted names the part wired across resistor part (both its nets), if
// one is, with that part's resistance when known: a resistor's value, or a
// lamp's hot resistance from a rating in its label ("6.3 V 0.15 A": R =
// V/I, Ohm's law at its rated current, which the chain runs it near).
func (p *Point) shunted(part *graph.Part) (ref string, r float64, known bool) {
	if len(part.Pins) != 2 {
		return "", 0, false
	}
	a, b := part.Pins[0].Net, part.Pins[1].Net
	for _, cn := range p.Circuit.ConnsOf(a) {
		q := cn.Part
		if q == part || len(q.Pins) != 2 || q.Kind == graph.Capacitor || q.Kind == graph.Valve {
			continue
		}
		if !(q.Pins[0].Net == a && q.Pins[1].Net == b || q.Pins[0].Net == b && q.Pins[1].Net == a) {
			continue
		}
		if q.Kind == graph.Resistor {
			return q.Ref, q.Value.Max, q.Value.Max > 0
		}
		if m := lampRating.FindStringSubmatch(q.Label); m != nil {
			v, _ := strconv.ParseFloat(m[1], 64)
			i, _ := strconv.ParseFloat(m[2], 64)
			if v > 0 && i > 0 {
				return q.Ref, v / i, true
			}
		}
		return q.Ref, 0, false
	}
	return "", 0, false
}

// lampRating reads a lamp's rating from its label: "6.3 V 0.15 A".
var lampRating = regexp.MustCompile(`(\d+(?:\.\d+)?)\s*V\b[^0-9]*?(\d+(?:\.\d+)?)\s*A\b`)

// chainValves are the valves whose heaters lie in series with the
// resistor: from each of its ends on a net that holds exactly one valve's
// heater pin (one envelope: a series junction, not a parallel heater
// line), along the chain through each valve's other heater pin while the
// next junction again holds exactly one other valve. Chassis and held rails
// end the walk: they are no series junction. Nor is a net where the valve's
// own cathode sits on its heater pin: that is a directly heated filament
// doubling as the cathode (a rectifier's filament on the HT reservoir), and
// the net carries the HT's DC, not a chain's heater current (review 17's
// b05: its smoothing resistor from the reservoir was called a dropper).
func (p *Point) chainValves(part *graph.Part) []*graph.Part {
	var out []*graph.Part
	seen := map[string]bool{}
	for _, pin := range part.Pins {
		net := pin.Net
		for {
			v := p.soleHeater(net, seen)
			if v == nil {
				break
			}
			seen[envelope(v)] = true
			out = append(out, v)
			net = otherHeaterNet(v, net)
		}
	}
	return out
}

// soleHeater is the one valve (envelope) not yet seen with a heater pin
// on net; nil when net is chassis or a rail, or holds none or several.
func (p *Point) soleHeater(net string, seen map[string]bool) *graph.Part {
	switch p.Circuit.RoleOf(net) {
	case graph.Ground, graph.Supply, graph.Bias:
		return nil
	}
	var found *graph.Part
	envs := map[string]bool{}
	for _, c := range p.Circuit.ConnsOf(net) {
		if c.Part.Kind != graph.Valve || graph.RoleOfPin(graph.Valve, c.Pin) != graph.RoleHeater || seen[envelope(c.Part)] {
			continue // the valve the walk came through is behind it
		}
		if c.Part.NetOf("k") == net {
			return nil // a filament that is the cathode: the HT line, no chain
		}
		envs[envelope(c.Part)] = true
		found = c.Part
	}
	if len(envs) != 1 {
		return nil
	}
	return found
}

// otherHeaterNet is the net of v's heater pin that is not on net, "" if
// none.
func otherHeaterNet(v *graph.Part, net string) string {
	for _, pin := range v.Pins {
		if graph.RoleOfPin(graph.Valve, pin.Name) == graph.RoleHeater && pin.Net != net {
			return pin.Net
		}
	}
	return ""
}

func envelope(v *graph.Part) string {
	if v.Envelope != "" {
		return v.Envelope
	}
	return v.Ref
}

func refs(ps []*graph.Part) string {
	var out []string
	for _, p := range ps {
		if !slices.Contains(out, p.Ref) {
			out = append(out, p.Ref)
		}
	}
	s := ""
	for i, r := range out {
		switch {
		case i == 0:
		case i == len(out)-1:
			s += " and "
		default:
			s += ", "
		}
		s += r
	}
	return s
}
