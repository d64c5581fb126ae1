package device

import (
	"math"

	"pare/graph"
)

// Zener is the reverse breakdown of a zener diode: past its breakdown
// voltage Vz the diode conducts backwards, the current rising at 1/Rz
// (Rz, the dynamic resistance, is what the data books call rz or zz). The
// forward direction is an ordinary junction's (the DC law's Shockley
// diode). One model for the DC solve, which adds Reverse to the junction's
// current, and for the AC model, whose slope in breakdown is Rz.
//
// The knee is rounded over ZenerKnee so that the current and its slope are
// continuous, which Newton–Raphson needs at the turn-on:
//
//	Ir = (Vk/Rz)·ln(1 + e^((Vr − Vz)/Vk)),   Vr the cathode above the anode
//
// well past the knee Ir = (Vr − Vz)/Rz, the straight line of a shunt
// regulator's handbook calculation (I = (Vin − Vz)/R shared with the load,
// common practice); well below it Ir falls off as e^((Vr − Vz)/Vk), some
// 20 nA 0.3 V below Vz for the default Rz. Vz is the knee, where the
// straight line starts: a part marked 8V2 and run at a few milliamps
// reads Vz + Iz·Rz, a few tens of millivolts above, well inside a zener's
// usual 5 % tolerance (from memory).
type Zener struct {
	Vz        float64 // breakdown voltage, V
	Rz        float64 // dynamic resistance in breakdown, Ω
	RzAssumed bool    // Rz is the class default, not the part's own
}

// ZenerKnee is the width over which the breakdown turns on: the thermal
// voltage, the scale over which any junction's current turns on. A real
// zener's knee is softer still, and the figures a repairer reads (the
// line's volts at milliamps) lie past it, on the straight line.
const ZenerKnee = VT

// ZenerOf is the breakdown of a zener that declares its voltage (vz), with
// its rz or the class default. ok is false for any other diode and for a
// zener that declares no vz: pare then knows no breakdown, and the diode
// conducts forwards only.
func ZenerOf(p *graph.Part) (z Zener, ok bool) {
	if p.Kind != graph.Diode || p.Type != "zener" {
		return Zener{}, false
	}
	vz, ok := p.Param("vz")
	if !ok || !(vz > 0) {
		return Zener{}, false
	}
	z = Zener{Vz: vz}
	if rz, given := p.Param("rz"); given {
		z.Rz = rz
	} else {
		z.Rz, z.RzAssumed = def("zener", "rz"), true
	}
	return z, true
}

// NoBreakdown says whether p is a zener that declares no breakdown voltage:
// the DC solve and the AC model both treat it as open backwards, and the
// line it holds reads as if it were not there; the callers say so.
func NoBreakdown(p *graph.Part) bool {
	if p.Kind != graph.Diode || p.Type != "zener" {
		return false
	}
	_, ok := p.Param("vz")
	return !ok
}

// Reverse is the breakdown current for a reverse voltage vr (the cathode
// above the anode), flowing from cathode to anode, and its slope dIr/dvr.
// softplus in a form that neither overflows far past the knee nor loses
// the small current far below it.
func (z Zener) Reverse(vr float64) (i, g float64) {
	x := (vr - z.Vz) / ZenerKnee
	var soft, sig float64
	if x > 0 {
		e := math.Exp(-x)
		soft, sig = x+math.Log1p(e), 1/(1+e)
	} else {
		e := math.Exp(x)
		soft, sig = math.Log1p(e), e/(1+e)
	}
	return ZenerKnee / z.Rz * soft, sig / z.Rz
}
