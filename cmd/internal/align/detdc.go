package align

import (
	"fmt"
	"math"

	"pare/graph"
	"pare/graph/dc"
)

// The DC solver's word on a detector's sides. A peak detector's load
// charges, through the diode, on the half-cycle that drives the diode
// harder, and its reservoir holds that level through the other half (the
// load's resistors recharge it far more slowly than a carrier's cycle).
// Holding the feed at its no-signal DC plus, then minus, the carrier's
// peak (a bias net of fixed volts in a copy of the circuit) and solving
// the DC shows both: the half-cycle that drives more current through the
// diode, and where the load goes on it. The way it goes is the sign of the
// detector's DC, and how far shows the load really follows the diode (a
// side held by something else hardly moves). Only a direct detector can be
// held so: with the load in the winding's cold end the winding ties the
// feed to the load for DC, and the wiring alone gives the sign there.

// detDC is what the DC solver showed at a carrier of Carrier volts RMS.
type detDC struct {
	Carrier float64 // RMS carrier held at the feed (its peak, √2 times)
	Idle    float64 // the load's DC with no carrier
	Loaded  float64 // the load's DC on the half-cycle that drives the diode
	// Sign is the way the load moved (+1, −1), 0 when neither half-cycle
	// drove the diode harder or the load hardly followed: no detector
	// action the solver could see.
	Sign int
}

// confirmByDC solves the detector's DC with and without the carrier's peak
// held at its feed; nil where it cannot (not a direct detector, the feed a
// rail, or the solver fails).
func confirmByDC(c *graph.Circuit, d *detSides, carrier float64) *detDC {
	if d == nil || !d.direct || c.Net(d.feed) == nil || c.RoleOf(d.feed) != graph.Signal {
		return nil
	}
	op, err := dc.Solve(c)
	if err != nil {
		return nil
	}
	feed0, ok1 := op.Volts(d.feed)
	load0, ok2 := op.Volts(d.load)
	if !ok1 || !ok2 {
		return nil
	}
	i0 := op.Current(d.diode, d.anode)
	peak := carrier * math.Sqrt2
	var v, i [2]float64
	for k, s := range []float64{1, -1} {
		held, ok := heldPoint(c, d.feed, feed0+s*peak)
		if !ok {
			return nil
		}
		v[k], _ = held.Volts(d.load)
		i[k] = held.Current(d.diode, d.anode)
	}
	drive := 0
	if i[1] > i[0] {
		drive = 1
	}
	out := &detDC{Carrier: carrier, Idle: load0, Loaded: v[drive]}
	if i[drive] > i[1-drive] && i[drive] > i0 && math.Abs(v[drive]-load0) > 0.2*peak {
		out.Sign = int(math.Copysign(1, v[drive]-load0))
	}
	return out
}

// heldPoint is the operating point with net held at v volts.
func heldPoint(c *graph.Circuit, net string, v float64) (*dc.Point, bool) {
	if v == 0 {
		v = 1e-9 // a bias net of 0 V is no held net (graph/dc)
	}
	held := c.Clone()
	n := held.Net(net)
	n.Role, n.Volts = graph.Bias, v
	op, err := dc.Solve(held)
	return op, err == nil
}

// dcWords is the DC solver's figure for a detector row or symptom: the
// load's no-signal DC and its DC with the carrier; "" when not solved.
func (d *detSides) dcWords() string {
	if d == nil || d.dc == nil || d.dc.Sign == 0 {
		return ""
	}
	dir := "rises"
	if d.dc.Sign < 0 {
		dir = "falls"
	}
	return fmt.Sprintf("%s sits at %s with no carrier and %s towards %s with %s of carrier at %s, by the DC solver with the carrier's peak held at %s: the diode's conduction angle leaves it a little short of that",
		d.load, signedVolts(d.dc.Idle), dir, signedVolts(d.dc.Loaded), volts(d.dc.Carrier), d.feed, d.feed)
}

// signedVolts writes a DC reading with its sign.
func signedVolts(v float64) string {
	if math.Abs(v) < 5e-4 {
		return "0 V"
	}
	if v > 0 {
		return "+" + volts(v)
	}
	return "−" + volts(-v)
}

// confirmDetector asks the DC solver about the detector's sides at the
// set's usual carrier (detLevels). Where it shows the load going the other
// way from the wiring's reading, the solver's sign stands (signOf) and the
// guide says so: the capture's diode, or pare's reading of it, is off.
func (g *Guide) confirmDetector(c *graph.Circuit) {
	if g.det == nil {
		return
	}
	g.det.dc = confirmByDC(c, g.det, detectorLevels(c).normal)
	if d := g.det.dc; d != nil && d.Sign != 0 && d.Sign != g.det.sign {
		g.Warnings = append(g.Warnings, fmt.Sprintf("the detector %s's wiring reads as a %s load on %s, but the DC solver moves %s %s with a carrier: the rows and symptoms follow the solver; check the diode's pins in the netlist",
			g.det.diode, signWord(g.det.sign), g.det.load, g.det.load, signWord(d.Sign)))
	}
}
