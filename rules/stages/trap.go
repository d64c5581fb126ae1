package stages

import (
	"math"
	"math/cmplx"

	"pare/graph"
	"pare/graph/figure"
)

// A series-tuned trap across a signal net (patterns/series-trap.toml). The
// notch is the solver's: the frequency, within ±30 % of the formula's
// f = 1/(2π√(LC)), where the net's driving-point impedance on the whole
// reduced circuit is least (golden-section search on a log scale, gang at
// mid travel). Its depth is how far the trap pulls the net down there: the
// net's impedance with the trap's coil removed over its impedance with the
// trap, in dB (what a source of high impedance, an aerial, loses at that
// frequency).
func init() {
	calcs["trap"] = calc{args: []string{"coil", "cap"}, required: []string{"coil", "cap"}, fn: calcTrap}
}

var byTrapF = figure.ByFormula("f = 1/(2π√(LC))")

func calcTrap(x *figCtx) {
	l, c := x.part("coil"), x.part("cap")
	if l == nil || c == nil || l.Value.Max <= 0 || c.Capacitance(0.5) <= 0 {
		return
	}
	f0 := 1 / (2 * math.Pi * math.Sqrt(l.Value.Max*c.Capacitance(0.5)))
	check := &figure.Figure{Name: "f_notch", Unit: figure.Hertz, Value: f0, Origin: byTrapF}
	net := trapNet(l, c)
	if !x.solve || net == "" {
		x.put(*check)
		return
	}
	sub := x.solverCircuit()
	zAt := func(f float64) float64 {
		z, ok := impedanceAt(sub, net, f)
		if !ok {
			return math.NaN()
		}
		return cmplx.Abs(z)
	}
	fn, ok := leastOf(zAt, f0/1.3, f0*1.3)
	if !ok {
		x.put(*check)
		return
	}
	x.putChecked(&figure.Figure{Name: "f_notch", Unit: figure.Hertz, Value: fn,
		Origin: figure.BySolver("least |Z| at "+net, "gang at mid travel")}, check, func() string {
		return "in circuit what else hangs on the net shifts the least impedance off the branch's own resonance"
	})
	without := sub.Clone()
	if _, ok := without.RemovePart(l.Ref); !ok {
		return
	}
	zw, ok1 := impedanceAt(without, net, fn)
	zt, ok2 := impedanceAt(sub, net, fn)
	if ok1 && ok2 && cmplx.Abs(zt) > 0 {
		x.set("notch_depth", figure.Decibel, 20*math.Log10(cmplx.Abs(zw)/cmplx.Abs(zt)),
			figure.BySolver("|Z| at "+net+" without the trap over with it", hz(fn)+", gang at mid travel"))
	}
}

// trapNet is the net the trap hangs on: the coil's end away from the
// junction with the capacitor.
func trapNet(l, c *graph.Part) string {
	j := sharedNet(l, c)
	for _, p := range l.Pins {
		if p.Net != j {
			return p.Net
		}
	}
	return ""
}

// leastOf finds the minimum of f on [lo, hi] by golden-section search on
// a log scale; ok is false when f is not finite there or the minimum sits
// on an edge (no notch inside).
func leastOf(f func(float64) float64, lo, hi float64) (float64, bool) {
	a, b := math.Log(lo), math.Log(hi)
	g := (math.Sqrt(5) - 1) / 2
	c, d := b-g*(b-a), a+g*(b-a)
	fc, fd := f(math.Exp(c)), f(math.Exp(d))
	for i := 0; i < 80; i++ {
		if math.IsNaN(fc) || math.IsNaN(fd) {
			return 0, false
		}
		if fc < fd {
			b, d, fd = d, c, fc
			c = b - g*(b-a)
			fc = f(math.Exp(c))
		} else {
			a, c, fc = c, d, fd
			d = a + g*(b-a)
			fd = f(math.Exp(d))
		}
	}
	m := math.Exp((a + b) / 2)
	if m < lo*1.001 || m > hi/1.001 {
		return 0, false
	}
	return m, true
}
