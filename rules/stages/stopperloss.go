package stages

import (
	"fmt"
	"math"
	"math/cmplx"

	"pare/graph"
	"pare/graph/figure"
	"pare/graph/value"
)

// The stopper's own loss at the band's top, asked of the solver. The
// corner the Miller formula gives (gridstopper.go) takes one gain for the
// whole band and the input capacitance as a plain capacitor to ground;
// what a repairer wants to know is whether the stopper takes signal at the
// top of the band as the stage works. The solver has no interelectrode
// capacitances, so the device's typical ones (inputCaps) are put in for
// the question: Cin from the control electrode to the common one and Cf
// from the control electrode to the output, where the circuit's own output
// load (a transformer's leakage included) multiplies Cf as it really does.
// The loss is the output electrode's response with the stopper against
// with it shorted, driven from the circuit's first declared input where
// that reaches the control electrode, else from the stopper's far end. A
// flag only past stopperLossDB; the formula's loss from its corner beside.

// stopperLossDB is the loss at the band's top past which a stopper is said
// to cut the signal: 1 dB, common practice (a response flat within 1 dB
// over the band is the usual figure of an audio or IF stage).
const stopperLossDB = 1.0

// stopperCheckDB is the least loss, by either reckoning, at which the
// formula's is put beside the solver's.
const stopperCheckDB = 0.1

// shortOhms stands for a shorted stopper: far below any stopper's value,
// finite so the model keeps its nets apart.
const shortOhms = 1e-3

var byStopperFormula = figure.ByFormula("loss = 10·log10(1 + (f/fc)²) at the Miller corner")

// stopperLoss is the solver's loss in dB through stopper r of dev at f,
// the device's input capacitances cin and cf put in, and how it was driven.
func (x *figCtx) stopperLoss(dev, r *graph.Part, cin, cf, f float64) (float64, string, bool) {
	ctl := dev.NetOf(dev.PinWithRole(graph.RoleControl))
	out := dev.NetOf(dev.PinWithRole(graph.RoleOutput))
	com := dev.NetOf(dev.PinWithRole(graph.RoleCommon))
	far := r.NetOf("1")
	if far == ctl {
		far = r.NetOf("2")
	}
	if !x.solve || !(f > 0) || ctl == "" || out == "" || com == "" || far == "" || far == ctl {
		return 0, "", false
	}
	with := x.solverCircuit().Clone()
	for _, c := range []struct {
		ref, to string
		v       float64
	}{{dev.Ref + "~cin", com, cin}, {dev.Ref + "~cf", out, cf}} {
		with.AddPart(&graph.Part{Ref: c.ref, Kind: graph.Capacitor, Type: graph.CapFixed,
			Value: value.Range{Min: c.v, Max: c.v}, Pins: []graph.Pin{{Name: "1", Net: ctl}, {Name: "2", Net: c.to}}})
	}
	short := *r
	short.Value = value.Range{Min: shortOhms, Max: shortOhms}
	shorted := withPart(with, &short)
	// The first drive that reaches the output is the one: a region's or
	// the set's input the output does not hear is no source of this
	// stage's signal.
	in, how := far, "driven at "+far
	var hw complex128
	ok1 := false
	for _, src := range append(driveNets(with, dev), far) {
		if src == ctl {
			continue
		}
		if h, ok := transferComplex(with, src, out, f); ok && cmplx.Abs(h) > 0 {
			in, hw, ok1 = src, h, true
			if src != far {
				how = "driven from " + src
			}
			break
		}
	}
	hs, ok2 := transferComplex(shorted, in, out, f)
	if !ok1 || !ok2 || cmplx.Abs(hw) == 0 || cmplx.Abs(hs) == 0 {
		return 0, "", false
	}
	return db(cmplx.Abs(hs) / cmplx.Abs(hw)), how, true
}

// putStopperLoss records the loss at the band's top (the solver's where it
// answers, the formula's beside it) and flags it past stopperLossDB.
func (x *figCtx) putStopperLoss(dev, r *graph.Part, cin, cf, fc, top float64, what string) {
	formula := 10 * math.Log10(1+(top/fc)*(top/fc))
	check := figure.Figure{Name: "cut_top", Unit: figure.Decibel, Value: formula, Origin: byStopperFormula}
	loss, how, ok := x.stopperLoss(dev, r, cin, cf, top)
	if !ok {
		x.put(check)
		loss = formula
	} else {
		at := fmt.Sprintf("%s, %s, %s's input capacitance taken as %s", hz(top), how, dev.Ref, what)
		sv := figure.Figure{Name: "cut_top", Unit: figure.Decibel, Value: loss,
			Origin: figure.BySolver("V("+dev.NetOf(dev.PinWithRole(graph.RoleOutput))+") with "+r.Ref+" against with it shorted", at)}
		ck := &check
		if math.Max(math.Abs(loss), formula) < stopperCheckDB {
			ck = nil // both say "no cut": a percentage between two tenths of a dB says nothing
		}
		x.putChecked(&sv, ck, func() string {
			return "the formula takes one gain for the whole band and the input capacitance to ground; in circuit the output's load at the band's top sets the Miller multiplication"
		})
	}
	if loss > stopperLossDB {
		x.flag("%s with %s's input capacitance takes %.2g dB at the band's top %s (more than %g dB, common practice): it cuts the signal, not only parasitics",
			r.Ref, dev.Ref, loss, hz(top), stopperLossDB)
	}
}

// driveNets are the nets a stage's signal comes in at, in the order asked:
// the input of the device's region (an audio stage's is the detector's
// output, not the aerial, whose signal reaches it only as an envelope),
// then the circuit's first declared input.
func driveNets(c *graph.Circuit, dev *graph.Part) []string {
	var nets []string
	if r := c.RegionOf(dev); r != nil && r.Input != "" && c.Net(r.Input) != nil {
		nets = append(nets, r.Input)
	}
	if len(c.Inputs) > 0 {
		nets = append(nets, c.Inputs[0])
	}
	return nets
}
