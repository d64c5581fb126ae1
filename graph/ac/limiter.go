package ac

import "pare/graph"

// InverseParallel says whether a semiconductor diode's section a→cathode
// has another diode across it the other way round (its anode on this
// cathode's net, its cathode on this anode's net): an amplitude limiter or
// clipper, as in an oscillator's feedback path or across a meter. Neither
// diode carries DC at rest (each would be reverse biased by the other's
// forward drop), so for small signals, where an oscillator starts and where
// a gain is measured, the pair is open: its slope at 0 V is that of a
// diode far below its knee (Shockley: VT/Is, gigohms for silicon). The
// peak detector's RL/2 (graph/device DiodeRd) is the input of a diode
// charging a load capacitor to the carrier's peak, which a limiter's pair
// has not. A diode with an rd of its own (or one the operating point
// fills, forward biased at rest) keeps it.
func InverseParallel(c *graph.Circuit, p *graph.Part, a, cathode string) bool {
	if p.Kind != graph.Diode || p.Type == "zener" || p.Type == "varicap" || p.Type == "rectifier" {
		return false
	}
	an, kn := p.NetOf(a), p.NetOf(cathode)
	if an == "" || kn == "" || an == kn {
		return false
	}
	for _, cn := range c.ConnsOf(kn) {
		q := cn.Part
		if q == p || q.Kind != graph.Diode || cn.Pin != "a" || q.Type == "zener" || q.Type == "varicap" {
			continue
		}
		if q.NetOf("k") == an {
			return true
		}
	}
	return false
}
