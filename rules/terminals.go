package rules

import (
	"math"

	"pare/graph"
	"pare/graph/device"
)

// The impedances the bypass, coupling and choke judgements see at the
// terminals of active parts, diodes and crystals. Every device figure comes
// from graph/device, the model the AC solver stamps, so a judgement and the
// proof that checks it reason about the same valve or transistor
// (TestJudgementUsesSolverModel holds them together over every example and
// fixture).

// deviceBranch is the impedance an amplifying part presents at one of its
// terminals, each from its one formula in graph/device with whatever is
// beyond the part taken as AC ground (lowBranch's convention, which only
// lowers the figure):
//
//	common   ZCommon(0) = rπ ∥ rout/(1 + gm·rout): the textbook
//	         (ra + RL)/(µ + 1) into a cathode with the anode load RL → 0,
//	         a little below 1/gm
//	control  ZControl(0) = rπ (a valve's grid and a FET's gate are open)
//	output   ZOutput(0) = rout: ra, ro, rd with the common electrode at
//	         AC ground (UpperZ only counts it there)
//	further  a valve's further grid drawing current, 4/gm (rough)
//
// A valve diode's electrodes are diodes. A part the model rejects is an
// unknown impedance: the judgement then refuses, and the AC proof reports
// the model's error.
func deviceBranch(p *graph.Part, pin string) branch { return deviceBranchLoaded(p, pin, 0, "") }

// commonBranch is the impedance into an amplifying part's common electrode
// with the load on its output electrode counted: ZCommon(RL), the textbook
// (ra + RL)/(µ + 1) for a valve, with RL the lower bound of what the output
// net sees besides the part (LowerZ's own convention, one net deep). The
// load enters by its magnitude: exact for a resistive load, which an anode
// load is across an audio band and a tuned one at resonance; a reactive
// load of the same magnitude would add less to ra, and the AC proof of
// every step covers that. With the output electrode at AC ground RL is 0
// and the figure is ZCommon(0), a little below 1/gm.
func (x *Ctx) commonBranch(p *graph.Part, pin string, f float64) branch {
	out := p.NetOf(p.PinWithRole(graph.RoleOutput))
	if out == "" || out == "nc" || x.IsACGround(out) {
		return deviceBranch(p, pin)
	}
	rl, _ := x.lowerZ(out, f, false, p)
	if rl == 0 {
		return deviceBranch(p, pin) // something unbounded (a port) on the output: RL ≥ 0 is all that is known
	}
	return deviceBranchLoaded(p, pin, rl, out)
}

// deviceBranchLoaded is deviceBranch with rl on the output net out ("" when
// rl is 0 because the output is taken as AC ground).
func deviceBranchLoaded(p *graph.Part, pin string, rl float64, out string) branch {
	role := graph.RoleOfPin(p.Kind, pin)
	if p.Kind == graph.Valve && !p.IsActive() {
		if role == graph.RoleOutput || role == graph.RoleCommon {
			return diodeBranch(p, pin)
		}
		return branch{math.Inf(1), ""}
	}
	switch role {
	case graph.RoleCommon, graph.RoleControl, graph.RoleOutput, graph.RoleGrid:
	default:
		return branch{math.Inf(1), ""}
	}
	s, err := device.Of(p)
	if err != nil {
		return branch{0, p.Ref + " (" + err.Error() + ")"}
	}
	w := device.WordsFor(p.Kind)
	switch role {
	case graph.RoleCommon:
		z := s.ZCommon(rl)
		switch {
		case out == "":
			return branch{z, p.Ref + " " + w.Common + " ≈ " + w.Common0 + " " + ohms(z)}
		case math.IsInf(z, 1):
			return branch{z, p.Ref + " " + w.Common + " open (nothing else on " + out + ")"}
		}
		return branch{z, p.Ref + " " + w.Common + " ≈ " + w.CommonRL + " " + ohms(z) + " with RL ≥ " + ohms(rl) + " on " + out}
	case graph.RoleOutput:
		z := s.ZOutput(0)
		return branch{z, p.Ref + " " + w.Output + " ≈ " + w.ROut + " " + ohms(z)}
	case graph.RoleControl:
		z := s.ZControl(0)
		if math.IsInf(z, 1) {
			return branch{z, ""}
		}
		return branch{z, p.Ref + " " + w.Control + " ≈ rπ " + ohms(z)}
	}
	z := s.ZFurtherGrid()
	return branch{z, p.Ref + " " + pin + " ≈ " + num(device.ScreenFactor) + "/gm " + ohms(z)}
}

// diodeBranch is a conducting diode's rd as the part gives it. A diode
// without rd is counted open, and the why says so: a detector diode
// conducts only at the crests, and the solver's default rd (graph/device:
// conducting at 1 mA) would make every detector load look shorted. The AC
// proof, which does stamp the default, checks the judgement. A valve
// diode's cathode carries every section's current: rd over the number of
// anodes.
func diodeBranch(p *graph.Part, pin string) branch {
	if off, ok := p.Param("off"); ok && off != 0 {
		return branch{math.Inf(1), ""}
	}
	rd, assumed := device.DiodeRd(p, 0) // the detector default is never the judgement's: it counts an rd-less diode open
	if assumed {
		return branch{math.Inf(1), p.Ref + " counted open (no rd given)"}
	}
	if p.Kind == graph.Valve && graph.RoleOfPin(p.Kind, pin) == graph.RoleCommon {
		anodes := 0
		for _, q := range p.Pins {
			if graph.RoleOfPin(p.Kind, q.Name) == graph.RoleOutput {
				anodes++
			}
		}
		rd /= float64(max(anodes, 1))
	}
	return branch{rd, p.Ref + " rd " + ohms(rd)}
}

// crystalBranch: a crystal is at its lowest near series resonance, where it
// is its motional resistance Rm (the holder capacitance's reactance is far
// larger there).
func crystalBranch(p *graph.Part) branch {
	rm, _, _, _, err := device.Crystal(p)
	if err != nil {
		return branch{0, p.Ref + " (" + err.Error() + ")"}
	}
	return branch{rm, p.Ref + " " + ohms(rm) + " at series resonance"}
}
