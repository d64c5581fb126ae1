package stages

import (
	"fmt"
	"math"

	"pare/graph"
	"pare/graph/ac"
	"pare/graph/figure"
)

// A Zobel network: a resistor and a capacitor in series across the
// loudspeaker (or whatever load the output drives), whatever drives it (a
// transistor pair through its output capacitor, a valve through its output
// transformer's secondary). It keeps the load the output sees near the
// loudspeaker's rating above the band, where the voice coil's inductance
// would make it rise and a feedback amplifier ring; in the band it takes
// next to nothing. It is named only when the solver bears that out on the
// load network as connected (the loudspeaker with the Zobel and whatever
// else sits across it, the driver cut off): |Z| stays within zobelFloor of
// the loudspeaker's rating across the band, and the Zobel's resistor is
// within a factor of zobelRSpan of it, so the network holds the load near
// the rating where it takes over, 1/(2πRC) (handbook, from memory). A
// series RC that halves the load in the band is a treble cut or a
// mistake, not a Zobel. The loudspeaker is modelled as its rating
// (docs/netlist.md), so the solver shows what the Zobel adds, not the
// voice coil it compensates.
func init() {
	calcs["zobel"] = calc{args: []string{"r", "c", "speaker", "coupling"}, required: []string{"r", "c", "speaker"}, fn: calcZobel}
}

// zobelFloor is the least |Z| across the band, as a share of the
// loudspeaker's rating, that leaves the load "near" it: within 2 dB
// (common practice, no source: an output stage's power into 80 % of its
// rated load changes by about 1 dB).
const zobelFloor = 0.8

// zobelRSpan bounds the Zobel's resistor against the loudspeaker's rating:
// a Zobel's R is about the voice coil's resistance, a little under the
// rating (common practice, from memory); a factor of two either way.
const zobelRSpan = 2.0

var byZobelCorner = figure.ByFormula("f = 1/(2πRC)")

func calcZobel(x *figCtx) {
	r, c, spk := x.part("r"), x.part("c"), x.part("speaker")
	if r == nil || c == nil || spk == nil || len(spk.Pins) != 2 {
		return
	}
	rating, rv, cv := spk.Value.Max, r.Value.Max, c.Capacitance(0.5)
	b := x.w.c.BandOf(r)
	if rating <= 0 || rv <= 0 || cv <= 0 || b.Min <= 0 || b.Max <= b.Min {
		return
	}
	if rv < rating/zobelRSpan || rv > rating*zobelRSpan {
		return // no figures: the guard drops the match
	}
	hot := spk.Pins[0].Net
	if x.w.c.RoleOf(hot).IsACGround() {
		hot = spk.Pins[1].Net
	}
	also := []string{r.NetOf(r.Pins[0].Name), r.NetOf(r.Pins[1].Name)}
	if co := x.part("coupling"); co != nil && len(co.Pins) == 2 {
		// The Zobel stands at the amplifier's output, the output
		// capacitor between it and the loudspeaker: the load is what the
		// output sees, the Zobel across the capacitor and loudspeaker.
		also = append(also, hot)
		hot = co.Pins[0].Net
		if hot == spk.Pins[0].Net || hot == spk.Pins[1].Net {
			hot = co.Pins[1].Net
		}
	}
	lo, hi, ok := loadSpan(x.w.c, hot, also, b.Min, b.Max)
	if !ok || lo < zobelFloor*rating {
		return
	}
	x.span("z_load", figure.Ohm, lo, hi,
		figure.BySolver("|Z("+hot+")| of "+spk.Ref+" with "+r.Ref+" and "+c.Ref+" and what else sits across it, the driver cut off", "across the band"))
	x.set("f_zobel", figure.Hertz, 1/(2*math.Pi*rv*cv), byZobelCorner)
	x.st.Notes = append(x.st.Notes, fmt.Sprintf("%s is modelled as its %s rating: the solver shows what the Zobel adds across it, not the voice coil's rise it compensates",
		spk.Ref, figure.Format(rating, figure.Ohm, figure.Text)))
}

// loadSpan is the least and most |Z| into net across the band (24 points a
// decade, log spaced) of the load network as connected: the parts whose
// every terminal is on net, on one of the nets in also, or at AC ground.
func loadSpan(c *graph.Circuit, net string, also []string, fLo, fHi float64) (lo, hi float64, ok bool) {
	on := map[string]bool{net: true}
	for _, n := range also {
		on[n] = true
	}
	load := withPart(c, &graph.Part{})
	load.Parts = nil
	load.Inputs, load.Outputs = nil, nil
	for _, p := range c.Parts {
		keep := len(p.Pins) > 0
		for _, pin := range p.Pins {
			if !on[pin.Net] && !c.RoleOf(pin.Net).IsACGround() {
				keep = false
			}
		}
		if keep {
			load.Parts = append(load.Parts, p)
		}
	}
	z, err := ac.NewTransimpedance(load, net, net, gangMid.options())
	if err != nil {
		return 0, 0, false
	}
	n := max(2, int(math.Ceil(24*math.Log10(fHi/fLo))))
	lo, hi = math.Inf(1), 0
	for i := 0; i <= n; i++ {
		m := magnitude(z, fLo*math.Pow(fHi/fLo, float64(i)/float64(n)))
		if math.IsNaN(m) {
			return 0, 0, false
		}
		lo, hi = min(lo, m), max(hi, m)
	}
	return lo, hi, true
}
