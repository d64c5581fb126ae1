package stages

import (
	"fmt"
	"math"

	"pare/graph"
	"pare/graph/ac"
	"pare/graph/figure"
	"pare/graph/value"
)

// The top-cut tone control: a capacitor in series with a variable
// resistor from a signal net (an anode, an output transformer's primary)
// to AC ground. With the resistance at nought the capacitor alone shunts
// the net and cuts the treble from f = 1/(2π·R·C), R what drives the net
// (handbook RC low-pass); with it at full, the resistor limits how deep
// the cut goes. What a device's output electrode makes of its current is
// the impedance of the net it drives, so the solver gives the figures as
// that impedance, V(net) for 1 A into it, with the pot at each end of its
// travel, against the same impedance with the control taken out: the −3 dB
// point, and how far down it is at the band's top. Registered at init like the output
// stage's calc (output.go).
func init() {
	calcs["tone"] = calc{args: []string{"c", "pot"}, required: []string{"c", "pot"}, fn: calcTone}
}

var byToneCut = figure.ByFormula("f = 1/(2π·C·√((R+Rv)² − 2Rv²)), R the net's |Z| without the control at mid-band, Rv the pot's")

// toneEnd is what the solver gives at one end of the pot's travel.
type toneEnd struct {
	fc, cutDB float64
	hasFC     bool
}

func calcTone(x *figCtx) {
	c, pot := x.part("c"), x.part("pot")
	if c == nil || pot == nil || len(c.Pins) != 2 {
		return
	}
	net := c.Pins[0].Net
	if pot.NetOf("1") == net || pot.NetOf("2") == net || pot.NetOf("w") == net {
		net = c.Pins[1].Net
	}
	b := x.w.c.BandOf(c)
	cv := c.Capacitance(0.5)
	if !x.solve || b.Min <= 0 || b.Max <= b.Min || cv <= 0 {
		return
	}
	base := x.solverCircuit()
	without := withPart(base, &graph.Part{})
	without.Parts = nil
	for _, p := range base.Parts {
		if p.Ref != c.Ref {
			without.Parts = append(without.Parts, p)
		}
	}
	bare, err := ac.NewTransimpedance(without, net, net, gangMid.options())
	if err != nil {
		return
	}
	var ends [2]toneEnd
	for i, set := range []float64{0, 1} {
		q := pot.Clone()
		q.Set = set
		e, ok := toneAt(withPart(base, q), bare, net, b)
		if !ok {
			return
		}
		ends[i] = e
	}
	r := magnitude(bare, math.Sqrt(b.Min*b.Max))
	if math.IsNaN(r) || r == 0 {
		return
	}
	var checks [2]toneEnd
	for i, rv := range []float64{potR(pot, 0), potR(pot, 1)} {
		checks[i].fc, checks[i].hasFC = toneFormula(r, rv, cv)
	}
	x.putTone(pot, net, ends, checks)
}

// toneFormula is the −3 dB point of a series R–C shunt across a net driven
// through R: H = (Rv + 1/jωC)/(R + Rv + 1/jωC), |H|² = ½ where
// 1/(ωC) = √((R+Rv)² − 2Rv²) (derived from the handbook divider; Rv = 0
// gives the plain RC low-pass 1/(2πRC)); ok is false when the shelf
// Rv/(R+Rv) stays above −3 dB.
func toneFormula(r, rv, c float64) (float64, bool) {
	x2 := (r+rv)*(r+rv) - 2*rv*rv
	if x2 <= 0 {
		return 0, false
	}
	return 1 / (2 * math.Pi * c * math.Sqrt(x2)), true
}

// potR is the resistance a pot wired as a variable resistor (wiper
// strapped to an end) puts in circuit at setting s: the track between the
// two pins on different nets.
func potR(p *graph.Part, s float64) float64 {
	switch {
	case p.NetOf("w") == p.NetOf("2"):
		return p.Value.Max * s
	case p.NetOf("w") == p.NetOf("1"):
		return p.Value.Max * (1 - s)
	}
	return p.Value.Max
}

// toneAt solves what the control does to the net at one setting: |Z(net)|
// with it against |Z(net)| without it (bare), over the band: the −3 dB
// point (if the cut reaches that far inside the band) and the cut at the
// top edge in decibels. The ratio leaves out what shapes the net's
// impedance anyway (an output transformer's primary at the bottom of the
// band).
func toneAt(c *graph.Circuit, bare *ac.Response, net string, b value.Range) (toneEnd, bool) {
	r, err := ac.NewTransimpedance(c, net, net, gangMid.options())
	if err != nil {
		return toneEnd{}, false
	}
	return cutOf(r, bare, b)
}

// cutOf compares an impedance with the control (r) and without it (bare)
// over the band b: the −3 dB point, if inside, and the cut at the top.
func cutOf(r, bare *ac.Response, b value.Range) (toneEnd, bool) {
	ratio := func(f float64) float64 { return magnitude(r, f) / magnitude(bare, f) }
	top := ratio(b.Max)
	if math.IsNaN(top) || top == 0 {
		return toneEnd{}, false
	}
	e := toneEnd{cutDB: -db(top)} // how deep the cut goes, a positive number of decibels
	e.fc, e.hasFC = bisectLog(func(f float64) (bool, bool) {
		v := ratio(f)
		return v >= 1/math.Sqrt2, !math.IsNaN(v)
	}, b.Min, b.Max)
	return e, true
}

// putTone writes the corner over the pot's travel (one value when only
// one end cuts 3 dB inside the band), the formula's at the same ends
// beside it, and the cut at the band's top at each end.
func (x *figCtx) putTone(pot *graph.Part, net string, ends, checks [2]toneEnd) {
	at := pot.Ref + " at each end of its travel"
	what := "−3 dB of |Z(" + net + ")| against the net without the control"
	sv := toneFigure(ends, figure.BySolver(what, at))
	if sv != nil && !(ends[0].hasFC && ends[1].hasFC) {
		sv.Origin.At = pot.Ref + " at the end that cuts; at the other the cut stays under 3 dB in the band"
	}
	check := toneFigure(checks, byToneCut)
	if sv != nil {
		x.putChecked(sv, check, func() string {
			return fmt.Sprintf("the formula takes what drives %s as the plain resistance it is at mid-band; in circuit it changes across the band (a transformer's inductances, what else loads %s), and with it the corner and how deep the cut goes", net, net)
		})
	}
	lo, hi := min(ends[0].cutDB, ends[1].cutDB), max(ends[0].cutDB, ends[1].cutDB)
	x.put(figure.Figure{Name: "top_cut", Unit: figure.Decibel, Range: &value.Range{Min: lo, Max: hi},
		Origin: figure.BySolver("|Z("+net+")| at the band's top against the net without the control", at)})
}

// toneFigure is the corner at the ends that have one: a range over both,
// one value for one, nil for none.
func toneFigure(ends [2]toneEnd, o figure.Origin) *figure.Figure {
	f := &figure.Figure{Name: "f_top_cut", Unit: figure.Hertz, Origin: o}
	switch {
	case ends[0].hasFC && ends[1].hasFC:
		lo, hi := min(ends[0].fc, ends[1].fc), max(ends[0].fc, ends[1].fc)
		f.Range = &value.Range{Min: lo, Max: hi}
		if hi <= lo*1.0001 {
			f.Range, f.Value = nil, lo
		}
	case ends[0].hasFC:
		f.Value = ends[0].fc
	case ends[1].hasFC:
		f.Value = ends[1].fc
	default:
		return nil
	}
	return f
}
