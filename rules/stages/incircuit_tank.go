package stages

import (
	"fmt"
	"math"
	"slices"
	"strings"

	"pare/graph"
	"pare/graph/ac"
	"pare/graph/figure"
	"pare/graph/value"
)

// tankPeaks is a tank's resonance as the solver finds it: at each gang
// setting, the peak of the impedance across the coil (at its hot end
// where the other is at AC ground) with everything else in the circuit
// connected, so
// every capacitance across the tank counts and every load damps it; q is
// the peak's f/(f2 − f1) from its −3 dB points at mid travel (NaN where one
// is missing, and at the ends of the travel).
type tankPeaks struct {
	net string
	gs  []gang
	f   []float64
	q   []float64
}

// tankSearch is how far either side of the formula's resonance the solver
// looks for the peak: a factor of three covers a tank whose formula missed
// most of the capacitance across it (common practice, no source).
const tankSearch = 3

// solveTank finds a tank's peaks between lo/tankSearch and hi·tankSearch;
// ok is false when the coil has no end off ground, the solver fails, or
// there is no peak in that span. refs are the capacitors the tank's formula
// counts: a declared input on one of their nets is left free (tankNets).
func (x *figCtx) solveTank(a, b int, lo, hi float64, refs []string) (tankPeaks, bool) {
	if !x.solve {
		return tankPeaks{}, false
	}
	if a == groundNet {
		a, b = b, a
	}
	t := tankPeaks{net: x.netName(a), gs: x.gangs()}
	if t.net == "" || !(lo > 0) || !(hi >= lo) || math.IsInf(hi, 0) {
		return t, false
	}
	c := freeInputs(quiet(x.solverCircuit()), x.tankNets(t.net, x.netName(b), refs)...)
	for _, g := range t.gs {
		var r *ac.Response
		var err error
		if b == groundNet {
			r, err = ac.NewTransimpedance(c, t.net, t.net, g.options())
		} else {
			r, err = ac.NewAcross(c, t.net, x.netName(b), g.options())
		}
		if err != nil {
			return t, false
		}
		f, mag, ok := peakOf(r, lo/tankSearch, hi*tankSearch)
		if !ok {
			return t, false
		}
		t.f = append(t.f, f)
		q := math.NaN()
		if g == gangMid { // the tuned check reads the middle's alone
			q = qOfPeak(r, f, mag, lo/tankSearch/2, hi*tankSearch*2)
		}
		t.q = append(t.q, q)
	}
	return t, true
}

// qOfPeak is f0/(f2 − f1) from the −3 dB points either side of a peak of
// magnitude mag at f0, searched out to lo and hi; NaN when one is missing.
func qOfPeak(r *ac.Response, f0, mag, lo, hi float64) float64 {
	level := mag / math.Sqrt2
	f1, ok1 := crossing(r, level, f0, lo)
	f2, ok2 := crossing(r, level, f0, hi)
	if !ok1 || !ok2 || f2 <= f1 {
		return math.NaN()
	}
	return f0 / (f2 - f1)
}

// resonanceFigure is a tank's f: the solver's peak with the formula
// 1/(2π√(LC)) beside it as the cross-check (formulaAt: the formula's f
// with the gang at frac), as a range where a gang turns. The words for a
// difference say what capacitance the coil resonates with in circuit
// against what the formula counts (refs).
func (x *figCtx) resonanceFigure(name, coil string, l float64, a, b int, formulaAt func(frac float64) float64, o figure.Origin, refs []string) {
	check := figure.Figure{Name: name, Unit: figure.Hertz, Origin: o}
	lo, hi := formulaAt(1), formulaAt(0)
	if hi > lo*1.0001 {
		check.Range = &value.Range{Min: lo, Max: hi}
	} else {
		check.Value = lo
	}
	t, ok := x.solveTank(a, b, lo, hi, refs)
	x.tank, x.tankOK = t, ok
	if !x.solve || !ok {
		x.put(check)
		return
	}
	sv := solved(name, figure.Hertz, t.f, "peak of |Z| across "+coil, t.gs)
	x.putChecked(sv, &check, func() string { return tankWhy(l, t, formulaAt, refs) })
}

// tankWhy says what the coil resonates with in circuit, at the setting
// where the formula strays most: C = 1/(ω²L) of the solver's peak against
// the capacitance the formula counts.
func tankWhy(l float64, t tankPeaks, formulaAt func(float64) float64, refs []string) string {
	worst, fs, ff := -1.0, 0.0, 0.0
	for i, f := range t.f {
		want := formulaAt(t.gs[i].frac)
		if d := math.Abs(f-want) / f; d > worst {
			worst, fs, ff = d, f, want
		}
	}
	cIn := 1 / (math.Pow(2*math.Pi*fs, 2) * l)
	cFormula := 1 / (math.Pow(2*math.Pi*ff, 2) * l)
	counted := "no capacitor"
	if len(refs) > 0 {
		counted = strings.Join(refs, ", ")
	}
	return fmt.Sprintf("in circuit the coil resonates with %s, the formula counts %s (%s): the rest is what else the circuit puts across the tank, or its loads' damping",
		figure.Format(cIn, figure.Farad, figure.Text), figure.Format(cFormula, figure.Farad, figure.Text), counted)
}

// refsOf lists parts' references.
func refsOf(ps []*graph.Part) []string {
	out := make([]string, len(ps))
	for i, p := range ps {
		out[i] = p.Ref
	}
	return out
}

// tankNets are the coil's ends and the nets of the capacitors its formula
// counts: the tank's own loop. A declared input on one of them (a
// Colpitts's emitter tap named as the point a buffer is probed from) held
// at 0 V would short a capacitor of the divider the coil resonates with,
// and the "tank alone" figure, and every pull measured from it, would be
// that of another tank.
func (x *figCtx) tankNets(hot, cold string, refs []string) []string {
	nets := []string{hot, cold}
	for _, r := range refs {
		if p := x.w.c.Part(r); p != nil {
			for _, pin := range p.Pins {
				nets = append(nets, pin.Net)
			}
		}
	}
	return nets
}

// freeInputs is c without the declared inputs among nets: the solver holds
// every other input at 0 V while it probes across a coil, and a tank that
// is itself the input (a frame aerial, whose loop the signal is induced
// in, returned to chassis through a bypass) would be shorted so. Its
// resonance is the tank's own, as a dip meter finds it.
func freeInputs(c *graph.Circuit, nets ...string) *graph.Circuit {
	var kept []string
	for _, in := range c.Inputs {
		if !slices.Contains(nets, in) {
			kept = append(kept, in)
		}
	}
	if len(kept) == len(c.Inputs) {
		return c
	}
	out := withPart(c, &graph.Part{})
	out.Inputs = kept
	return out
}
