package stages

import (
	"math/cmplx"

	"pare/graph"
	"pare/graph/ac"
	"pare/graph/figure"
)

// A tuned amplifier whose load the gang tunes (an RF amplifier) gives a
// different gain at each end of the dial: the tank's dynamic resistance
// grows with frequency (Rd = Q·ωL) while the device's input and the
// coupling load it otherwise, so a gain at mid travel alone hides how far
// the stage falls off at one end. The solver gives the peak gain at each
// end of the travel, at the load's own peak there, to the same node as
// the stage's gain figure (common practice: a tracking check reads the
// gain at both ends of the band).

// bandEnds are the ends of the gang's travel, low frequency first.
var bandEnds = [2]struct {
	g    gang
	name string
}{{gangTravel[0], "gain_band_low"}, {gangTravel[len(gangTravel)-1], "gain_band_high"}}

// bandEndGains puts the gain from in to out at each end of the travel at
// the load's peak there, where the gang tunes the load (its tank solved
// at both ends); nothing otherwise. what names out for the origin.
func (x *figCtx) bandEndGains(c *graph.Circuit, in, out, what string) {
	var f0 [2]float64
	for i, e := range bandEnds {
		f, ok := x.tankAt(e.g)
		if !ok || !(f > 0) {
			return
		}
		f0[i] = f
	}
	if f0[0] >= f0[1] {
		return // a fixed-tuned load, or ends that do not order as a dial
	}
	for i, e := range bandEnds {
		r, err := ac.NewTransfer(c, in, out, e.g.options())
		if err != nil {
			return
		}
		f, _, ok := peakOf(r, f0[i]/tankSearch, f0[i]*tankSearch)
		if !ok {
			return
		}
		h, err := r.At(f)
		if err != nil || cmplx.IsNaN(h) || cmplx.IsInf(h) {
			return
		}
		g := cmplx.Abs(h)
		if real(h) < 0 {
			g = -g
		}
		at := figure.Figure{Name: e.name + "_at", Unit: figure.Hertz, Value: f}
		x.put(figure.Figure{Name: e.name, Unit: figure.Ratio, Value: g, At: &at,
			Origin: figure.BySolver("peak of V("+out+")/V("+in+"), "+what, hz(f)+", "+e.g.at)})
	}
}
