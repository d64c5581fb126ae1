package dc

import (
	"math"

	"pare/graph"
	dev "pare/graph/device"
)

// Small-signal parameters at the operating point. Where the user gives a
// device's characteristic (a JFET's idss and vp, a transistor's β and vbe)
// instead of its small-signal figures, the AC model should take them at the
// computed bias rather than at a default one. Biased returns a copy of the
// circuit with exactly those missing figures filled in, so the one AC model
// (which reads gm, ra, ic, … from the part) needs nothing new; Origins say
// which figures came from the operating point.
//
// Filled, only when not given: a BJT's ic and rπ (the AC model then takes
// gm = Ic/VT, rπ as filled, ro = VA/Ic); a JFET's gm = ∂Id/∂Vgs; an amplifying
// valve's gm = ∂Ia/∂Vg1 unless ra and mu are both given (the AC model
// completes any two of the three), and for a triode given none of them
// ra = 1/(∂Ia/∂Va).
// A signal diode is left alone unless it conducts at rest more than a peak
// detector would (diodebias.go): a detector conducts on the signal's
// peaks, so its small-signal resistance is a property of the DC bias only
// where the circuit forward-biases it. A zener that declares its
// breakdown takes its slope at the bias: rz in breakdown, off when it
// does not conduct (zener.go).

// Fills says whether Biased can fill any figure of c: only transistors,
// FETs, valves and signal diodes take figures at the bias (the devices
// Biased looks at are built from those kinds alone), so on a circuit of none the operating
// point changes nothing the small-signal model reads, and a command that
// wants only the biased circuit need not solve it (TestFillsOnlyDevices).
func Fills(c *graph.Circuit) bool {
	for _, p := range c.Parts {
		switch p.Kind {
		case graph.BJT, graph.FET, graph.Valve:
			return true
		case graph.Diode:
			if _, breaks := dev.ZenerOf(p); restDiode(p) || breaks {
				return true
			}
		}
	}
	return false
}

// Biased returns c with the missing small-signal figures taken at the
// operating point, and where each came from.
func (p *Point) Biased() (*graph.Circuit, []Origin) {
	out := p.Circuit.Clone()
	var origins []Origin
	set := func(part *graph.Part, name string, v float64, how string) {
		if !(v > 0) || math.IsInf(v, 0) || math.IsNaN(v) {
			return
		}
		if part.Params == nil {
			part.Params = map[string]float64{}
		}
		part.Params[name] = v
		origins = append(origins, Origin{part.Ref, name, v, paramUnitText(name), "operating point: " + how})
	}
	for _, d := range p.m.devices {
		part := out.Part(d.ref)
		if part == nil {
			continue
		}
		slopes := p.slopes(&d)
		switch d.kind {
		case devBJT:
			_, hasIc := part.Param("ic")
			if !hasIc {
				set(part, "ic", math.Abs(p.Current(d.ref, "c")), "collector current")
			}
			// rπ from the base current's slope, not β/gm: the DC law's
			// Early factor raises Ic and not Ib, so the β at the bias is
			// βF·(1 + Vcb/VA), as in SPICE's model (an emitter follower's
			// input, and the gain of the stage it loads, rest on it). The
			// slope is the base–emitter junction's alone (−∂Ib/∂Ve, the
			// hybrid-π's gπ; a saturated collector junction is rμ's), and
			// only beside a filled ic: a given ic states the bias figures.
			_, hasRpi := part.Param("rpi")
			if !hasIc && !hasRpi && -slopes[0][2] > 0 {
				set(part, "rpi", -1/slopes[0][2], "1/(∂Ib/∂Vbe) of Ebers–Moll with the Early effect")
			}
		case devFET:
			if _, ok := part.Param("gm"); !ok {
				set(part, "gm", slopes[1][0], "∂Id/∂Vgs of the square law")
			}
		case devValve:
			// The AC model completes any two of gm, ra and µ; fill only what
			// the given ones leave open.
			_, hasGm := part.Param("gm")
			_, hasRa := part.Param("ra")
			_, hasMu := part.Param("mu")
			if !hasGm && !(hasRa && hasMu) {
				set(part, "gm", slopes[0][1], "∂Ia/∂Vg1 of the three-halves law")
			}
			if !d.valve.pentode && !hasGm && !hasRa && !hasMu && slopes[0][0] > 0 {
				set(part, "ra", 1/slopes[0][0], "1/(∂Ia/∂Va) of the three-halves law")
			}
		}
	}
	p.diodeRds(out, set)
	p.zenerRds(out, set)
	return out, origins
}

// slopes evaluates the device's Jacobian at the operating point.
func (p *Point) slopes(d *device) [][]float64 {
	k := len(d.t)
	vt := make([]float64, k)
	cur := make([]float64, k)
	jac := make([][]float64, k)
	for i := range jac {
		jac[i] = make([]float64, k)
	}
	for i, t := range d.t {
		vt[i] = p.m.voltOf(p.v, t)
	}
	d.eval(vt, cur, jac)
	return jac
}

func paramUnitText(name string) string {
	switch name {
	case "gm":
		return "S"
	case "ra", "rpi", "rd":
		return "Ω"
	case "ic":
		return "A"
	}
	return ""
}
