package stages

import (
	"fmt"
	"math"
	"math/cmplx"

	"pare/graph"
	model "pare/graph/device"
	"pare/graph/figure"
)

// In-circuit Q and impedances: what a repairer reads off a tuned circuit
// (how sharp it is as it sits) and off an amplifier stage (what it loads
// its driver with, what it drives its load from). Each is the solver's on
// the reduced circuit at the stage's band centre, with the textbook
// formula beside it as the cross-check.

var (
	byOwnQ    = figure.ByFormula("Q of the winding alone (its q)")
	byZinBJT  = figure.ByFormula("Zin = RB ∥ (rπ + (β+1)·RE)")
	byZinGrid = figure.ByFormula("Zin = RG (the grid or gate draws no signal current)")
	byZoutOut = figure.ByFormula("Zout = RL ∥ rout·(1 + gm·(RE∥rπ)) + RE∥rπ")
)

// maxLoadedQ is the largest loaded Q written: above it nothing in the model
// damps the tank (a winding without its q, no load), and the number is the
// solver's rounding, not a coil's (broadcast coils run at Q 50–300: common
// practice, no source).
const maxLoadedQ = 1000

// loadedQ writes a tank's Q as it sits in circuit: f0/(f2 − f1) of the −3 dB
// points of its impedance with the gang at mid travel (solveTank; the
// devices quiet, as for its f), beside the winding's own q. Nothing where
// the tank did not solve or either −3 dB point is missing.
func (x *figCtx) loadedQ(coil string, q float64) {
	if !x.tankOK || len(x.tank.q) == 0 {
		return
	}
	v := x.tank.q[len(x.tank.q)/2]
	if math.IsNaN(v) || v <= 0 || v > maxLoadedQ {
		return
	}
	sv := &figure.Figure{Name: "q_loaded", Unit: figure.Ratio, Value: v,
		Origin: figure.BySolver("f0/(f2 − f1) of |Z| across "+coil, gangMid.at)}
	var check *figure.Figure
	if q > 0 {
		check = &figure.Figure{Name: "q_loaded", Unit: figure.Ratio, Value: q, Origin: byOwnQ}
	}
	x.putChecked(sv, check, func() string {
		return "the winding's q is its own, unloaded; in circuit what hangs across the tank (the device it feeds, the next stage, the capacitors' paths) damps it"
	})
}

// stageImpedances writes an amplifier stage's input impedance at its control
// net and output impedance at its output net, each the magnitude of the
// driving-point impedance at the device's band centre with the device live
// and the stage cut from its neighbours: the parts that feed the control net
// from upstream, and those that carry the output on downstream, are left
// out (a part not in the stage with no end at AC ground). So Zin is what
// the stage loads its driver with and Zout what it drives its load from.
// rk is the unbypassed resistance in the common lead (0: bypassed).
func (x *figCtx) stageImpedances(p *graph.Part, form string, d device, rk float64) {
	if !x.solve || (form != "common" && form != "degenerated") {
		return
	}
	in, out := x.gainNets(form)
	band := x.w.c.BandOf(p)
	if in == "" || out == "" || band.Min <= 0 || band.Max <= 0 {
		return
	}
	f := math.Sqrt(band.Min * band.Max)
	at := hz(f) + ", " + gangMid.at
	c := x.solverCircuit()
	if z, ok := impedanceAt(withoutRefs(c, x.neighbours(in, p)), in, f); ok {
		sv := &figure.Figure{Name: "z_in", Unit: figure.Ohm, Value: cmplx.Abs(z),
			Origin: figure.BySolver("|Z| into "+in+", the driver cut off", at)}
		rb := x.resistanceToGround(in)
		check := &figure.Figure{Name: "z_in", Unit: figure.Ohm, Value: parZ(rb, d.small.ZControl(rk)), Origin: byZinBJT}
		if math.IsInf(d.small.RPi, 1) {
			check.Value, check.Origin = rb, byZinGrid
		}
		x.putChecked(sv, check, func() string {
			return "the solver counts what the formula leaves out: feedback from the output to the input (Miller), and paths to AC ground other than resistors"
		})
	}
	if z, ok := impedanceAt(withoutRefs(c, x.neighbours(out, p)), out, f); ok {
		sv := &figure.Figure{Name: "z_out", Unit: figure.Ohm, Value: cmplx.Abs(z),
			Origin: figure.BySolver("|Z| into "+out+", the load cut off", at)}
		check := &figure.Figure{Name: "z_out", Unit: figure.Ohm, Value: parZ(x.resistanceToGround(out), d.small.ZOutput(rk)), Origin: byZoutOut}
		x.putChecked(sv, check, func() string { return x.zOutWhy(p, d) })
	}
}

// zOutWhy words a difference of the output impedance from its formula: an
// output resistance the formula does not have, or reactances at the output.
func (x *figCtx) zOutWhy(p *graph.Part, d device) string {
	if full, err := model.Of(p); err == nil && d.rOut == 0 && full.ROut > 0 && !math.IsInf(full.ROut, 1) && d.kind != graph.Valve {
		return fmt.Sprintf("the solver's ro of %s (from the default Early voltage) the formula leaves out",
			figure.Format(full.ROut, figure.Ohm, figure.Text))
	}
	return "the reactances at the output (a tuned winding, a bypass that is not complete) the formula leaves out"
}

// neighbours are the parts on net (other than the stage's device dev) that
// are not in the stage and have no end at AC ground: what connects the
// stage there to the stage before or after it.
func (x *figCtx) neighbours(net string, dev *graph.Part) []string {
	id, ok := x.w.netID[net]
	if !ok || id == groundNet {
		return nil
	}
	inStage := map[string]bool{}
	for _, ref := range x.st.Parts {
		inStage[ref] = true
	}
	var out []string
	for _, ci := range x.w.conns[id] {
		p := x.w.parts[ci]
		if p == dev || inStage[p.Ref] {
			continue
		}
		grounded := false
		for _, n := range x.w.pins[ci] {
			grounded = grounded || n == groundNet
		}
		if !grounded {
			out = append(out, p.Ref)
		}
	}
	return out
}

// resistanceToGround is the parallel of the resistors from net straight to
// AC ground (Inf where there is none).
func (x *figCtx) resistanceToGround(net string) float64 {
	id, ok := x.w.netID[net]
	if !ok || id == groundNet {
		return math.Inf(1)
	}
	g := 0.0
	for _, ci := range x.w.conns[id] {
		p := x.w.parts[ci]
		if p.Kind != graph.Resistor || len(x.w.pins[ci]) != 2 {
			continue
		}
		a, b := x.w.pins[ci][0], x.w.pins[ci][1]
		if (a == id && b == groundNet || b == id && a == groundNet) && p.Value.Max > 0 {
			g += 1 / p.Value.Max
		}
	}
	if g == 0 {
		return math.Inf(1)
	}
	return 1 / g
}

// withoutRefs is c less the parts refs names.
func withoutRefs(c *graph.Circuit, refs []string) *graph.Circuit {
	for _, ref := range refs {
		c = without(c, ref)
	}
	return c
}

// parZ is a ∥ b where either side may be missing: 0 or +Inf leaves the
// other (+Inf where both are missing: no formula figure).
func parZ(a, b float64) float64 {
	none := func(v float64) bool { return v == 0 || math.IsInf(v, 1) || math.IsNaN(v) }
	switch {
	case none(a) && none(b):
		return math.Inf(1)
	case none(a):
		return b
	case none(b):
		return a
	}
	return a * b / (a + b)
}

// followerROut writes a follower's output resistance: the solver's |Z|
// into its common electrode at the band centre with the load cut off (the
// parts beyond it, as stageImpedances cuts them) and the device live, with
// the formula that fits the device beside it (followerROutCheck); the
// formula alone where the solver cannot say.
func (x *figCtx) followerROut(p *graph.Part, d device, rk float64) {
	_, out := x.gainNets("follower")
	band := x.w.c.BandOf(p)
	if !x.solve || out == "" || band.Min <= 0 || band.Max <= 0 {
		x.put(x.followerROutCheck(p, d, rk, 0))
		return
	}
	f := math.Sqrt(band.Min * band.Max)
	check := x.followerROutCheck(p, d, rk, f)
	z, ok := impedanceAt(withoutRefs(x.solverCircuit(), x.neighbours(out, p)), out, f)
	if !ok {
		x.put(check)
		return
	}
	sv := &figure.Figure{Name: "r_out", Unit: figure.Ohm, Value: cmplx.Abs(z),
		Origin: figure.BySolver("|Z| into "+out+", the load cut off", hz(f)+", "+gangMid.at)}
	x.putChecked(sv, &check, func() string {
		if check.Origin == byROutBJT {
			return "the formula takes the transistor's re and β alone (no ro, no junction capacitance); the solver the whole circuit round the stage at " + hz(f)
		}
		return "the formula takes the device and its resistor alone; the solver the whole circuit round the stage at " + hz(f)
	})
}
