package layout

import (
	"math"
	"slices"

	"pare/graph"
	"pare/render/geom"
	"pare/render/symbol"
)

// Bias returns: a cathode, emitter or source bias point bypassed to
// chassis is no rail, yet at every frequency the parts on it work at it
// is a return all the same. A capacitor or resistor from a signal net to
// it is a shunt, and the trade hangs it off the row towards the return,
// never in line between two parts of the row, where it reads as a series
// part (review21 a03: the detector's IF bypasses to the bypassed cathode
// of the double-diode-triode lay flat in the signal row).

// BiasReturns are the nets of c bypassed to chassis (bypassedReturn).
func BiasReturns(c *graph.Circuit) map[string]bool {
	out := map[string]bool{}
	for _, p := range c.Parts {
		for _, pn := range p.Pins {
			if _, seen := out[pn.Net]; !seen && pn.Net != "" {
				out[pn.Net] = bypassedReturn(c, pn.Net)
			}
		}
	}
	for n, ok := range out {
		if !ok {
			delete(out, n)
		}
	}
	return out
}

// bypassedReturn says whether net n, no rail itself and no declared end,
// a device's common electrode on it or one resistor away (commonNear) and
// feeding no device's control (drivesControl), has resistors only to chassis and capacitors to chassis whose reactance,
// at the lowest frequency any part on n works at, is under the resistors'
// parallel resistance, and dwarfing the capacitors from n to the signal:
// the bias point of a bypassed cathode or emitter.
func bypassedReturn(c *graph.Circuit, n string) bool {
	if c.RoleOf(n).IsACGround() || isEnd(c, n) || !commonNear(c, n) || drivesControl(c, n) {
		return false
	}
	capF, g, f, toSignal := 0.0, 0.0, math.Inf(1), 0.0
	for _, cn := range c.ConnsOf(n) {
		p := cn.Part
		if b := c.BandOf(p); b.Min > 0 {
			f = math.Min(f, b.Min)
		}
		if len(p.Pins) != 2 || p.Value.Max <= 0 {
			continue
		}
		other := p.Pins[0].Net
		if other == n {
			other = p.Pins[1].Net
		}
		role := c.RoleOf(other)
		switch {
		case !role.IsACGround() && p.Kind == graph.Capacitor:
			toSignal += p.Value.Max
		case !role.IsACGround():
		case p.Kind == graph.Resistor && role != graph.Ground:
			return false // fed from a rail: a decoupled line, not a return
		case p.Kind == graph.Resistor:
			g += 1 / p.Value.Max
		case p.Kind == graph.Capacitor:
			capF += p.Value.Max
		}
	}
	// a bypass dwarfs the capacitors to the signal; a capacitive
	// divider's tap (a Colpitts emitter) is no bypass point
	return capF > 0 && g > 0 && !math.IsInf(f, 1) && 1/(2*math.Pi*f*capF) < 1/g && capF > bypassRatio*toSignal
}

// commonNear says whether an amplifying device's common electrode
// (cathode, emitter, source) sits on net n, or one resistor away from a
// net that is no return itself (the bypassed lower part of a split
// cathode or emitter resistor): a bias point, not a filter's output,
// which a capacitor to chassis also holds at AC ground over the band of
// the part before it (a detector's IF filter: its output carries the
// audio).
func commonNear(c *graph.Circuit, n string) bool {
	if hasCommon(c, n) {
		return true
	}
	for _, cn := range c.ConnsOf(n) {
		if other, ok := farEnd(cn.Part, n); ok && cn.Part.Kind == graph.Resistor && !c.RoleOf(other).IsACGround() && hasCommon(c, other) {
			return true
		}
	}
	return false
}

// drivesControl says whether a two-terminal part joins net n to an
// amplifying device's control electrode: n feeds a stage (an oscillator's
// emitter, its feedback capacitor to chassis a tank's, coupled to a
// buffer), so it is no return however large its capacitor to chassis.
func drivesControl(c *graph.Circuit, n string) bool {
	for _, cn := range c.ConnsOf(n) {
		other, ok := farEnd(cn.Part, n)
		if !ok || c.RoleOf(other).IsACGround() {
			continue
		}
		for _, fc := range c.ConnsOf(other) {
			if amplifies(fc.Part) && graph.RoleOfPin(fc.Part.Kind, fc.Pin) == graph.RoleControl {
				return true
			}
		}
	}
	return false
}

// hasCommon says whether an amplifying device's common electrode is on n.
func hasCommon(c *graph.Circuit, n string) bool {
	for _, cn := range c.ConnsOf(n) {
		if amplifies(cn.Part) && graph.RoleOfPin(cn.Part.Kind, cn.Pin) == graph.RoleCommon {
			return true
		}
	}
	return false
}

// amplifies says whether p is an active part with a control electrode: a
// valve, transistor or FET, not a diode, whose cathode is no bias point.
func amplifies(p *graph.Part) bool {
	if !p.IsActive() {
		return false
	}
	for _, pn := range p.Pins {
		if graph.RoleOfPin(p.Kind, pn.Name) == graph.RoleControl {
			return true
		}
	}
	return false
}

// farEnd is the net at the other end of a two-terminal part from n.
func farEnd(p *graph.Part, n string) (string, bool) {
	if len(p.Pins) != 2 {
		return "", false
	}
	if p.Pins[0].Net == n {
		return p.Pins[1].Net, true
	}
	return p.Pins[0].Net, true
}

// bypassRatio is how many times the capacitance from a bias point to the
// signal its capacitor to chassis must be to count as its bypass (a
// cathode's 25 µF against a detector's 100 pF IF bypasses; a Colpitts
// divider's 1 nF against 470 pF is a tap, not a bypass).
const bypassRatio = 10

// isEnd says whether n is one of the circuit's declared inputs or outputs.
func isEnd(c *graph.Circuit, n string) bool {
	return slices.Contains(c.Inputs, n) || slices.Contains(c.Outputs, n)
}

// returnPin is the net of a capacitor's end on a bias return
// when its other end carries the signal: the part is a shunt, and that end
// points down as a shunt's to chassis does. "" for any other part.
func (ly *state) returnPin(cl *cell) string {
	pins := cl.part.Pins
	if len(pins) != 2 || cl.part.Kind != graph.Capacitor || cl.conn {
		// only a capacitor: a resistor to a bias return is mostly the
		// upper part of a split cathode or emitter resistor, which hung
		// down re-routed whole pages round it and raised the wire
		// ratchets (cmd/pare alongPartCeiling, connWireCeiling)
		return ""
	}
	for i, p := range pins {
		q := pins[1-i].Net
		if ly.returns[p.Net] && !ly.returns[q] && ly.carries(q) {
			return p.Net
		}
	}
	return ""
}

// hangsToReturn says whether a shunt to a bias return (returnPin) has that
// end pointing down in shape s; true for every other part. A turn the
// untangle search fixed, or a template's stand, holds only when it does:
// lying in the row, the shunt reads as a series part.
func (ly *state) hangsToReturn(cl *cell, s symbol.Shape) bool {
	ret := ly.returnPin(cl)
	if ret == "" {
		return true
	}
	for _, p := range s.Pins {
		if p.Net == ret && p.Dir != geom.Down {
			return false
		}
	}
	return true
}
