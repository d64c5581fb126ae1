package stages

import (
	"math"
	"math/cmplx"

	"pare/graph"
	"pare/graph/ac"
	"pare/graph/figure"
)

// The AGC filter on a declared AGC line (patterns/agc-line-filter.toml),
// found on the original circuit: a resistor from the detector's DC output
// to the line and a capacitor from the line to chassis. The time constant
// is the solver's: the −3 dB corner fc of V(line)/V(detector) on the whole
// circuit, everything the line feeds connected, τ = 1/(2π·fc); τ = RC
// (handbook) beside it.
func init() {
	calcs["agc-line"] = calc{args: []string{"r", "c"}, required: []string{"r", "c"}, fn: calcAGCLine}
}

func calcAGCLine(x *figCtx) {
	r, c := x.part("r"), x.part("c")
	if r == nil || c == nil || r.Value.Max <= 0 || c.Capacitance(0.5) <= 0 {
		return
	}
	line := sharedNet(r, c)
	from := r.NetOf("1")
	if from == line {
		from = r.NetOf("2")
	}
	if line == "" || !fedByDetector(x.w.c, from) {
		return // not the detector's output: a feed from the line, no figures, the guard drops it
	}
	formula := &figure.Figure{Name: "tau", Unit: figure.Second, Value: r.Value.Max * c.Capacitance(0.5), Origin: byTau}
	sv := solvedLag(x.w.c, from, line)
	x.putChecked(sv, formula, func() string {
		return "in circuit the line also charges what it feeds (the grid filters' capacitors through their resistors)"
	})
	if f, ok := x.get("tau"); ok {
		x.checkAGC(f.Value)
	}
}

// sharedNet is the net two two-terminal parts share, "" if none.
func sharedNet(a, b *graph.Part) string {
	for _, p := range a.Pins {
		for _, q := range b.Pins {
			if p.Net == q.Net {
				return p.Net
			}
		}
	}
	return ""
}

// fedByDetector tells whether a diode sits on net, or on the far end of a
// winding from it (the load in the cold end of the IF winding).
func fedByDetector(c *graph.Circuit, net string) bool {
	diodeOn := func(n string) bool {
		for _, cn := range c.ConnsOf(n) {
			if cn.Part.Kind == graph.Diode || cn.Part.Kind == graph.Valve && !cn.Part.IsActive() {
				return true
			}
		}
		return false
	}
	if diodeOn(net) {
		return true
	}
	for _, cn := range c.ConnsOf(net) {
		if cn.Part.Kind != graph.Transformer {
			continue
		}
		for _, w := range cn.Part.Windings {
			ends := [2]string{cn.Part.NetOf(w.Name + "1"), cn.Part.NetOf(w.Name + "2")}
			if ends[0] == net && diodeOn(ends[1]) || ends[1] == net && diodeOn(ends[0]) {
				return true
			}
		}
	}
	return false
}

// solvedLag is the time constant of the low-pass from one net to another
// as the solver gives it: the frequency where |V(to)/V(from)| falls 3 dB
// below its value at 1 mHz, found by bisection on a log scale between
// 1 mHz and 10 kHz, the line freed from the AC ground its bias role puts
// it at; nil where the solver cannot give it.
func solvedLag(c *graph.Circuit, from, to string) *figure.Figure {
	// The solver holds a declared bias net at AC ground, as the signal
	// sees it; here the line is what is solved, so it is freed.
	c = c.Clone()
	if n := c.Net(to); n != nil {
		n.Role = graph.Signal
	}
	r, err := ac.NewTransfer(c, from, to, gangMid.options())
	if err != nil {
		return nil
	}
	mag := func(f float64) float64 {
		h, err := r.At(f)
		if err != nil || cmplx.IsNaN(h) {
			return math.NaN()
		}
		return cmplx.Abs(h)
	}
	lo, hi := 1e-3, 1e4
	ref := mag(lo)
	if !(ref > 0) || !(mag(hi) < ref/math.Sqrt2) {
		return nil
	}
	for i := 0; i < 60; i++ {
		mid := math.Sqrt(lo * hi)
		if mag(mid) > ref/math.Sqrt2 {
			lo = mid
		} else {
			hi = mid
		}
	}
	fc := math.Sqrt(lo * hi)
	return &figure.Figure{Name: "tau", Unit: figure.Second, Value: 1 / (2 * math.Pi * fc),
		Origin: figure.BySolver("1/(2π·fc), fc the −3 dB point of V("+to+")/V("+from+")", hz(fc))}
}
