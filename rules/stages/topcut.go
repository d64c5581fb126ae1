package stages

import (
	"fmt"
	"math"

	"pare/graph"
	"pare/graph/ac"
	"pare/graph/figure"
)

// A fixed top-cut capacitor across an output transformer's primary: from
// anode to anode of a push-pull pair, or from a single-ended anode to AC
// ground (the HT end of the primary). It couples nothing: it shunts the
// treble the valves (or transistors) drive into the primary, and keeps a
// pair stable at the top. Its figures are the solver's, as the tone
// control's are: the impedance across the capacitor's ends with it
// against without it, over the band, the −3 dB point and the cut at the
// band's top; the handbook RC low-pass 1/(2πRC) with R that impedance at
// mid-band beside it (from memory).
func init() {
	calcs["top-cut"] = calc{args: []string{"c"}, required: []string{"c"}, fn: calcTopCut}
}

// topCutMinDB is the least cut at the band's top that names a capacitor a
// top cut: under 1 dB a listener hears no change (common practice, no
// source).
const topCutMinDB = 1.0

var byFixedTopCut = figure.ByFormula("f = 1/(2π·R·C), R the |Z| across the capacitor's ends without it at mid-band")

func calcTopCut(x *figCtx) {
	c := x.part("c")
	if c == nil || len(c.Pins) != 2 || !x.solve {
		return
	}
	b := x.w.c.BandOf(c)
	cv := c.Capacitance(0.5)
	if b.Min <= 0 || b.Max <= b.Min || cv <= 0 {
		return
	}
	na, nb := c.Pins[0].Net, c.Pins[1].Net
	base := x.solverCircuit()
	without := withPart(base, &graph.Part{})
	without.Parts = nil
	for _, p := range base.Parts {
		if p.Ref != c.Ref {
			without.Parts = append(without.Parts, p)
		}
	}
	across := func(k *graph.Circuit) (*ac.Response, error) {
		if k.RoleOf(nb).IsACGround() {
			return ac.NewTransimpedance(k, na, na, gangMid.options())
		}
		return ac.NewAcross(k, na, nb, gangMid.options())
	}
	bare, err := across(without)
	if err != nil {
		return
	}
	with, err := across(base)
	if err != nil {
		return
	}
	e, ok := cutOf(with, bare, b)
	r := magnitude(bare, math.Sqrt(b.Min*b.Max))
	if !ok || math.IsNaN(r) || r == 0 {
		x.st.unconfirmed = "the solver finds no impedance across " + c.Ref + "'s ends to compare"
		return
	}
	if e.cutDB < topCutMinDB {
		x.st.unconfirmed = fmt.Sprintf("%s cuts %s dB at the band's top (%s) in circuit, less than the %s dB a top cut gives",
			c.Ref, figure.Plain(e.cutDB), figure.Format(b.Max, figure.Hertz, figure.Text), figure.Plain(topCutMinDB))
		return
	}
	where := na + "–" + nb
	if k := base.RoleOf(nb); k.IsACGround() {
		where = na
	}
	if e.hasFC {
		sv := &figure.Figure{Name: "f_top_cut", Unit: figure.Hertz, Value: e.fc,
			Origin: figure.BySolver("−3 dB of |Z("+where+")| against the same without "+c.Ref, "in circuit")}
		check := &figure.Figure{Name: "f_top_cut", Unit: figure.Hertz, Value: 1 / (2 * math.Pi * r * cv), Origin: byFixedTopCut}
		x.putChecked(sv, check, func() string {
			return fmt.Sprintf("the formula takes |Z(%s)| as the plain resistance it is at mid-band; across the band the transformer's inductances and the load change it", where)
		})
	}
	x.put(figure.Figure{Name: "top_cut", Unit: figure.Decibel, Value: e.cutDB,
		Origin: figure.BySolver("|Z("+where+")| at the band's top against the same without "+c.Ref, "in circuit")})
}
