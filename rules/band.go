package rules

import (
	"math"

	"pare/graph"
)

// bandOn gives the lowest and highest frequency of interest over the given
// parts and every part on the given nets: a net that also feeds an audio
// stage carries audio, whatever the region of the capacitor on it. from names
// the part that sets the low edge. A part with no band stops the reduction
// with a clear message.
func (x *Ctx) bandOn(parts []*graph.Part, nets ...string) (lo, hi float64, from *graph.Part, ok bool) {
	lo, hi = math.Inf(1), 0
	visit := func(p *graph.Part) {
		if p.Kind == graph.Port {
			return
		}
		b := x.c.Band
		if r := x.regionOf(p); r != nil {
			b = r.Band
		}
		if b.Max <= 0 || b.Min <= 0 {
			x.fail(p.Pos, "%s: no band of interest for this part (it is in no region, and the file has no top-level band): add band = \"LOW..HIGH\" or put %s in a region", p.Ref, p.Ref)
			ok = false
			return
		}
		if b.Min < lo {
			lo, from = b.Min, p
		}
		hi = math.Max(hi, b.Max)
	}
	ok = true
	for _, p := range parts {
		visit(p)
	}
	for _, n := range nets {
		for _, cn := range x.Conns(n) {
			visit(cn.Part)
		}
	}
	if from == nil {
		ok = false
	}
	return lo, hi, from, ok
}

// bandWhy says where the low edge comes from: "20 Hz (region audio, via C15)".
func (x *Ctx) bandWhy(lo float64, from *graph.Part, self *graph.Part) string {
	s := hz(lo)
	if from == nil {
		return s
	}
	where := "the default band"
	if r := x.regionOf(from); r != nil {
		where = "region " + r.Name
	}
	if from != self {
		return s + " (" + where + ", via " + from.Ref + " on the same net)"
	}
	return s + " (" + where + ")"
}

// resonance looks for a coil that forms a parallel tuned circuit with a
// capacitance range, resonating inside or near the band (within a factor of
// two of its edges): a coil path from one of the nets to AC ground, or
// between the two nets. A capacitor in such a circuit is a tank capacitor,
// not a bypass or a coupling capacitor. It returns the coil, its
// inductance and the resonant frequency range.
func (x *Ctx) resonance(nets []string, cmin, cmax, lo, hi float64, skip *graph.Part) (*graph.Part, float64, float64, float64, bool) {
	target := func(n string) bool {
		if x.IsACGround(n) {
			return true
		}
		for _, m := range nets {
			if m == n {
				return true
			}
		}
		return false
	}
	for _, n := range nets {
		for _, cn := range x.Conns(n) {
			p := cn.Part
			if p == skip || (p.Kind != graph.Inductor && p.Kind != graph.Transformer) {
				continue
			}
			for _, other := range p.Pins {
				if other.Name == cn.Pin || other.Net == n || !target(other.Net) {
					continue
				}
				l := pathL(p, cn.Pin, other.Name)
				if l <= 0 {
					continue
				}
				fHi := 1 / (2 * math.Pi * math.Sqrt(l*cmin))
				fLo := 1 / (2 * math.Pi * math.Sqrt(l*cmax))
				if fHi >= lo/2 && fLo <= hi*2 {
					return p, l, fLo, fHi, true
				}
			}
		}
	}
	return nil, 0, 0, 0, false
}
