package device

import (
	"math"

	"pare/graph"
)

// The impedances looking into an amplifying part's electrodes, one formula
// each, from the same Small the solver stamps. Each is derived by nodal
// analysis of the model in Small (a current gm·v(control, common) with ROut
// across it and rπ from control to common) and reduces to the textbook form
// named beside it; ngspice_test.go checks all three against ngspice's own
// linearisation of a nonlinear triode, transistor and JFET.

// ZCommon is the impedance looking into the common electrode (cathode,
// emitter, source) with the control electrode at AC ground and rl from the
// output electrode to AC ground:
//
//	Zcommon = rπ ∥ (rout + rl)/(1 + gm·rout)
//
// For a valve (rπ infinite) this is the textbook (ra + RL)/(µ + 1); for a
// FET (rd + RL)/(1 + gm·rd); for a BJT rπ ∥ (ro + RL)/(1 + gm·ro), which is
// re = α/gm when ro is large (textbook small-signal results, from memory).
// With the output at AC ground (rl = 0) it is 1/(gm + 1/rout + 1/rπ), a
// little below 1/gm: the lower bound the reduction's bypass judgement uses,
// since it takes everything beyond a terminal as AC ground. An infinite
// rout gives the limit 1/gm (rπ aside).
func (s Small) ZCommon(rl float64) float64 {
	var z float64
	switch {
	case math.IsInf(s.ROut, 1):
		z = 1 / s.Gm
	default:
		z = (s.ROut + rl) / (1 + s.Gm*s.ROut)
	}
	return parallel(s.RPi, z)
}

// ZControl is the impedance looking into the control electrode with the
// output electrode at AC ground and rs from the common electrode to AC
// ground:
//
//	Zcontrol = rπ + (β + 1)·(rs ∥ rout),  β = gm·rπ
//
// the textbook rπ + (β + 1)·RE with the output resistance across RE. A
// valve's grid and a FET's gate draw no signal current: +Inf.
func (s Small) ZControl(rs float64) float64 {
	if math.IsInf(s.RPi, 1) {
		return s.RPi
	}
	return s.RPi + (s.Gm*s.RPi+1)*parallel(rs, s.ROut)
}

// ZOutput is the impedance looking into the output electrode (anode,
// collector, drain) with the control electrode at AC ground and rs from the
// common electrode to AC ground:
//
//	Zoutput = rout·(1 + gm·r) + r,  r = rs ∥ rπ
//
// the textbook ra + (µ + 1)·Rk for a valve (from memory); with the common
// electrode at AC ground it is rout.
func (s Small) ZOutput(rs float64) float64 {
	r := parallel(rs, s.RPi)
	return s.ROut*(1+s.Gm*r) + r
}

// ZFurtherGrid is the impedance a valve's further grid (a screen, an
// oscillator anode grid) presents when it draws current: screen/gm with the
// "valve screen" default (from memory, rough). The solver leaves these
// currents out (its further grids draw none), so counting one here only
// lowers the bound the bypass judgement works against: the judgement errs
// towards keeping a capacitor, and the AC proof settles the rest.
func (s Small) ZFurtherGrid() float64 { return ScreenFactor / s.Gm }

// ScreenFactor is the "valve screen" default of Defaults.
var ScreenFactor = def("valve", "screen")

// parallel is a ∥ b, with an infinite side leaving the other.
func parallel(a, b float64) float64 {
	switch {
	case math.IsInf(a, 1):
		return b
	case math.IsInf(b, 1):
		return a
	}
	return a * b / (a + b)
}

// Words are the names of an amplifying part's electrodes and of its output
// resistance, and the short form of ZCommon at rl = 0, for messages.
type Words struct {
	Control, Common, Output string
	ROut                    string // "ra", "ro", "rd"
	CommonRL                string // ZCommon(rl) as a formula in RL
	Common0                 string // ZCommon(0) as a formula
}

// WordsFor gives the words for a kind of amplifying part, the zero value for
// any other kind.
func WordsFor(k graph.Kind) Words {
	switch k {
	case graph.Valve:
		return Words{"grid", "cathode", "anode", "ra", "(ra+RL)/(µ+1)", "ra/(µ+1)"}
	case graph.BJT:
		return Words{"base", "emitter", "collector", "ro", "rπ ∥ (ro+RL)/(1+gm·ro)", "rπ ∥ ro/(1+gm·ro)"}
	case graph.FET:
		return Words{"gate", "source", "drain", "rd", "(rd+RL)/(1+gm·rd)", "rd/(1+gm·rd)"}
	}
	return Words{}
}
