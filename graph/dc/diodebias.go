package dc

import (
	"fmt"
	"math"
	"slices"

	"pare/graph"
	"pare/graph/ac"
	dev "pare/graph/device"
	"pare/graph/figure"
)

// A detector that conducts at rest. The AC model takes a signal diode with
// a DC load for a peak detector, whose input resistance is half that load
// (device.DetectorRd): right for a diode that conducts only on the
// carrier's peaks. A diode the circuit forward-biases (DC from an AGC
// line's bias or a delay network flowing through it at rest) is, for a
// signal small beside n·VT, its Shockley slope at the bias, n·VT/Id, which
// can be far below RL/2: review17 b03's D1 carries 74 µA at rest, 348 Ω
// against RL/2 = 2.82 kΩ, and the IF stage it loads read 546 for ngspice's
// 288 (testdata/review17/spice/b/c03.cir). The solver takes the lower of
// the two, the operating point's, and says so; RL/2 stays the named
// cross-check (stages' detector figures).

// diodeRds fills rd on the semiconductor signal diodes of out that conduct
// at rest more than a peak detector would let them: the slope at the
// operating point below the rd the AC model would otherwise take. A given
// rd, an "off" diode, a rectifier, zener or varicap and a captured
// rectifier's diodes are left alone.
func (p *Point) diodeRds(out *graph.Circuit, set func(*graph.Part, string, float64, string)) {
	var diodes []*graph.Part
	var slope []float64
	for i := range p.m.devices {
		d := &p.m.devices[i]
		part := out.Part(d.ref)
		if d.kind != devDiode || part == nil || !restDiode(part) || p.rectifierDiode(d.ref) {
			continue
		}
		if g := p.slopes(d)[0][0]; g > 0 {
			diodes, slope = append(diodes, part), append(slope, g)
		}
	}
	if len(diodes) == 0 {
		return
	}
	loads := ac.DetectorLoads(p.Circuit, diodes)
	for i, part := range diodes {
		load, ok := loads[part.Ref+".a"]
		if !ok {
			load = math.Inf(1)
		}
		peak, _ := dev.DiodeRd(part, load)
		rd := 1 / slope[i]
		if !(rd < peak) {
			continue
		}
		id := math.Abs(p.Current(part.Ref, "a"))
		how := fmt.Sprintf("n·VT/Id, the diode conducting %.3g µA at rest", id*1e6)
		if !math.IsInf(load, 0) {
			how += fmt.Sprintf(" (below RL/2 = %s of a peak detector)", figure.Format(dev.DetectorRd(load), figure.Ohm, figure.Text))
		}
		set(part, "rd", rd, how)
	}
}

// restDiode: a semiconductor diode whose small-signal resistance the AC
// model takes from a default or its load, so the bias may say better.
func restDiode(part *graph.Part) bool {
	if _, ok := part.Param("rd"); ok {
		return false
	}
	if off, ok := part.Param("off"); ok && off != 0 {
		return false
	}
	return part.Kind == graph.Diode && part.Type != "rectifier" && part.Type != "zener" && part.Type != "varicap"
}

// rectifierDiode says whether ref is one of a captured rectifier's diodes,
// whose current the rectifier estimate carries.
func (p *Point) rectifierDiode(ref string) bool {
	for _, r := range p.m.rects {
		if slices.Contains(r.parts, ref) {
			return true
		}
	}
	return false
}
