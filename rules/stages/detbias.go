package stages

import (
	"pare/graph"
	model "pare/graph/device"
	"pare/graph/figure"
)

// A detector diode the circuit forward-biases at rest (DC from an AGC
// line's bias or a delay network through it) loads the IF with its slope
// at the operating point, n·VT/Id, not with the RL/2 of a peak detector
// that conducts only on the carrier's peaks: the DC operating point fills
// that rd on the diode (graph/dc, diodebias.go) and every IF gain is solved
// with it. The stage shows the rd the solver took, RL/2 beside it as the
// named cross-check, and says plainly why they part (review17 b03: D1 at
// 74 µA, 348 Ω against 2.82 kΩ; the IF stage it loads 287 against
// ngspice's 288, RL/2 would give 546).

var (
	byRestRd = figure.BySolver("the diode's own small-signal rd in the solver (at its DC operating point, n·VT/Id, when it conducts at rest)", "")
	byHalfRL = figure.ByFormula("rin = RL/2 (peak detector)")
)

// restDetector records the rd a detector diode d takes for the IF when it
// is below RL/2 of its DC load rdc, with that formula beside it and a flag.
func (x *figCtx) restDetector(d *graph.Part, rdc float64) {
	rd, ok := d.Param("rd")
	if !ok || !(rdc > 0) {
		return
	}
	half := model.DetectorRd(rdc)
	if !(rd < half*(1-figure.CheckAgreement)) {
		return
	}
	sv := figure.Figure{Name: "rd_rest", Unit: figure.Ohm, Value: rd, Origin: byRestRd}
	check := figure.Figure{Name: "rd_rest", Unit: figure.Ohm, Value: half, Origin: byHalfRL}
	x.putChecked(&sv, &check, func() string {
		return "the diode conducts at rest: for a small carrier it is its slope at the bias, not a peak detector"
	})
	x.flag("detector diode %s conducts at rest: its load on the IF is lower than RL/2 (%s); the IF gains use its rd at the operating point, %s, right for a weak carrier (well under 26 mV at the diode); a strong one sees nearer RL/2",
		d.Ref, figure.Format(half, figure.Ohm, figure.Text), figure.Format(rd, figure.Ohm, figure.Text))
}
