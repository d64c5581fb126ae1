package stages

import (
	"math"

	"pare/graph/figure"
)

// The output stage into an output transformer and loudspeaker. What the
// valve or transistor works into is the speaker's impedance reflected
// through the transformer, n²·Z with n = √(Lp/Ls) (turns as √L, an ideal
// transformer; handbook); a capacitor across the primary (a top-cut or tone
// capacitor) cuts the treble at f = 1/(2π·R·C), R the device's output
// resistance in parallel with that reflected load (the source and the load
// the capacitor sees together; handbook RC low-pass). Registered at init
// like the loop's regeneration calc (regen.go).
func init() {
	calcs["output-load"] = calc{args: []string{"device", "xfmr", "speaker", "cap"}, required: []string{"xfmr", "speaker"}, fn: calcOutputLoad}
}

var (
	byReflected = figure.ByFormula("n²·Z, n = √(Lp/Ls)")
	byTopCut    = figure.ByFormula("f = 1/(2π·(Rout ∥ n²·Z)·C)")
)

func calcOutputLoad(x *figCtx) {
	calcRatio(x)
	n, ok := x.get("turns_ratio")
	spk := x.part("speaker")
	if !ok || spk == nil || spk.Value.Max <= 0 {
		return
	}
	z := n.Value * n.Value * spk.Value.Max
	x.set("r_reflected", figure.Ohm, z, byReflected)
	c, dev := x.part("cap"), x.part("device")
	if dev != nil && x.solve {
		x.outputGain(dev, n.Value, z)
		x.outputPower(dev, z)
	}
	if c == nil {
		return
	}
	r := z
	if dev != nil {
		d := deviceOf(dev)
		if out := d.ra + d.rOut; out > 0 { // a valve has ra, a transistor ro
			r = out * z / (out + z)
		}
	}
	if cv := c.Capacitance(0.5); cv > 0 {
		x.set("f_top_cut", figure.Hertz, 1/(2*math.Pi*r*cv), byTopCut)
	}
}
