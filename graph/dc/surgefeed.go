package dc

import (
	"math"

	"pare/graph"
)

// A surge resistor on the AC side of a rectifier into a declared rail (an
// AC/DC set's limiter from the mains to the rectifier's anode) carries the
// rectifier's charging pulses, which the DC solve cannot see: the mains is
// a 0 V port, so the solve gives it 0 W. Its heat is the pulses' RMS
// squared times R. The pulses follow from what is known: the rail's
// declared volts, the load the DC solve draws from it, the reservoir, the
// junction's law and R as the source resistance. The mains peak is the one
// at which the reservoir's periodic steady state (rectwave.go) holds the
// rail's mean at its declared volts with that load; the steady state then
// gives the charging current's RMS.

// FeedHeatNote says where a feed resistor's watts come from.
const FeedHeatNote = "the charging pulses' RMS current squared times R, from the rectifier's steady state at the declared rail and its load"

// railFedSurgeHeat is the heat of a resistor in series with the anode of a
// rectifier into a declared rail, false when part is no such resistor.
func (p *Point) railFedSurgeHeat(part *graph.Part) (float64, bool) {
	if part.Kind != graph.Resistor || len(part.Pins) != 2 || !(part.Value.Max > 0) {
		return 0, false
	}
	for end, pin := range part.Pins {
		far := part.Pins[1-end].Net
		if !p.isACSource(far) || !p.isACSource(pin.Net) {
			continue
		}
		rect, amps, paths := p.anodeFeed(pin.Net, part)
		if rect == nil {
			continue
		}
		k := rect.NetOf("k")
		vdc, _ := p.Volts(k)
		r := rectifier{valve: rect.Kind == graph.Valve, hz: def("mains", "hz"), rs: part.Value.Max,
			c: reservoir(p.Circuit, k), diodes: 1, full: paths > 1}
		r.junctionLaw(rect)
		rms, ok := r.pulseRMSAt(vdc, amps*float64(paths))
		if !ok {
			return 0, false
		}
		// full-wave: this path carries every other pulse, half the square
		return rms * rms / float64(paths) * part.Value.Max, true
	}
	return 0, false
}

// anodeFeed is the rectifier whose anode net is net, fed only through
// feed (the net holds nothing else but the rectifier's anodes and
// capacitors), with the mean current through feed and the number of paths
// into the rail; nil when there is none.
func (p *Point) anodeFeed(net string, feed *graph.Part) (*graph.Part, float64, int) {
	var rect *graph.Part
	for _, cn := range p.Circuit.ConnsOf(net) {
		q := cn.Part
		switch {
		case q == nil || q == feed || q.Kind == graph.Capacitor:
		case (q.Kind == graph.Diode || q.Kind == graph.Valve && !q.IsActive()) && (rect == nil || rect == q):
			rect = q
		default:
			return nil, 0, 0
		}
	}
	if rect == nil {
		return nil, 0, 0
	}
	shares, ok := p.railFedShare(rect)
	if !ok {
		return nil, 0, 0
	}
	amps, paths := 0.0, 1
	for _, an := range rectAnodes {
		if rect.NetOf(an) == net {
			amps += shares[an]
		}
	}
	if amps > 0 {
		paths = max(1, int(math.Round(p.railCurrent(rect.NetOf("k"))/amps)))
	}
	return rect, amps, paths
}

// pulseRMSAt is the charging current's RMS when the reservoir's mean is
// vdc at load i: the peak found by bisection (the mean rises with it),
// between vdc and ten times vdc; false when no peak there gives vdc.
func (r *rectifier) pulseRMSAt(vdc, i float64) (float64, bool) {
	if !(vdc > 0) || !(i > 0) || !(r.c > 0) {
		return 0, false
	}
	mean := func(peak float64) wave {
		r.peak, r.warm.set = peak, false
		return r.steady(i, r.formula(i))
	}
	lo, hi := vdc, 10*vdc
	if mean(hi).mean < vdc {
		return 0, false
	}
	for n := 0; n < 60 && hi-lo > 1e-9*vdc; n++ {
		mid := (lo + hi) / 2
		if mean(mid).mean < vdc {
			lo = mid
		} else {
			hi = mid
		}
	}
	return mean(hi).rms, true
}
