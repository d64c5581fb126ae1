package align

import (
	"fmt"
	"math"

	"pare/graph"
	"pare/graph/dc"
	"pare/graph/figure"
)

// devCurrent is a device's quiescent current: the current into its output
// electrode (collector, anode, drain), as a magnitude; pin names it.
func devCurrent(op *dc.Point, d *graph.Part) (amps float64, pin string) {
	for _, pn := range d.Pins {
		if graph.RoleOfPin(d.Kind, pn.Name) == graph.RoleOutput {
			return math.Abs(op.Current(d.Ref, pn.Name)), pn.Name
		}
	}
	return 0, ""
}

// moved is one device whose quiescent current the preset's travel moves.
type moved struct {
	d      *graph.Part
	lo, hi float64 // its current at the two ends of the travel
	at0    float64 // at the travel's 0 % end
}

// biasPreset: a preset whose travel moves a device's quiescent current by
// biasShift or more (the DC solver at both ends) sets that device's bias;
// where two such devices' common electrodes meet at one net (directly or
// each through one resistor: the mid-point of a complementary or
// push-pull pair), it sets the output pair's quiescent current, and the
// mid-point volts are read with it.
func biasPreset(c *graph.Circuit, op *dc.Point, p *graph.Part) (Preset, bool) {
	if op == nil {
		return Preset{}, false
	}
	_, op0, ok0 := atSetting(c, p.Ref, presetEnds[0])
	_, op1, ok1 := atSetting(c, p.Ref, presetEnds[1])
	if !ok0 || !ok1 {
		return Preset{}, false
	}
	var ms []moved
	for _, d := range c.Parts {
		if !d.IsActive() {
			continue
		}
		a, _ := devCurrent(op0, d)
		b, _ := devCurrent(op1, d)
		if hi := math.Max(a, b); hi > 0 && math.Abs(a-b)/hi >= biasShift {
			ms = append(ms, moved{d: d, lo: math.Min(a, b), hi: hi, at0: a})
		}
	}
	if len(ms) == 0 {
		return Preset{}, false
	}
	ps := Preset{Part: p.Ref, order: jobBias, Points: netPoints(op, p)}
	if x, y, mid, ok := outputPair(c, ms); ok {
		biasPair(&ps, c, op, op0, op1, p, x, y, mid)
		return ps, true
	}
	m := ms[0]
	i, _ := devCurrent(op, m.d)
	ps.Job = fmt.Sprintf("bias: %s sets %s's quiescent current", p.Ref, m.d.Ref)
	ps.Measure = fmt.Sprintf("a meter on %s's quiescent current (in series with its supply feed, or across its common-lead resistor, I = V/R): set it to the service data's figure", m.d.Ref)
	ps.Points = append(ps.Points, fmt.Sprintf("%s's current %s at the nominal setting, %s–%s over the travel, from the DC solver", m.d.Ref, mA(i), mA(m.lo), mA(m.hi)))
	ps.Caution = leastEnd(p, m) + "; no signal while setting it"
	return ps, true
}

// biasPair fills the output pair's procedure: its quiescent current and
// the mid-point, nominal and over the travel, and the emitter (cathode)
// resistor the current is read across.
func biasPair(ps *Preset, c *graph.Circuit, op, op0, op1 *dc.Point, p *graph.Part, x, y moved, mid string) {
	i, _ := devCurrent(op, x.d)
	ps.Job = fmt.Sprintf("output bias: %s sets the quiescent current of the pair %s/%s (their common electrodes meet at %s, the mid-point)", p.Ref, x.d.Ref, y.d.Ref, mid)
	ps.Measure = fmt.Sprintf("no signal, the load connected: a meter in series with the supply feed, or in mV across %s's common-lead resistor (I = V/R); set the current the service data gives, then check %s, the mid-point, is near half the supply", x.d.Ref, mid)
	if r := commonResistor(c, x.d, mid); r != nil {
		ps.Measure = fmt.Sprintf("no signal, the load connected: a meter in mV across %s (%s, %s's common lead; I = V/R), or in series with the supply feed; set the current the service data gives, then check %s, the mid-point, is near half the supply", r.Ref, figure.Format(r.Value.Max, figure.Ohm, figure.Text), x.d.Ref, mid)
		ps.Points = append(ps.Points, fmt.Sprintf("across %s: %s at the nominal setting", r.Ref, volts(i*r.Value.Max)))
	}
	ps.Points = append(ps.Points, fmt.Sprintf("%s's quiescent current %s at the nominal setting, %s–%s over the travel, from the DC solver", x.d.Ref, mA(i), mA(x.lo), mA(x.hi)))
	if v, ok := op.Volts(mid); ok {
		v0, _ := op0.Volts(mid)
		v1, _ := op1.Volts(mid)
		ps.Points = append(ps.Points, fmt.Sprintf("the mid-point %s %s DC at the nominal setting, %s at 0 %% and %s at 100 %% of the travel", mid, signedVolts(v), signedVolts(v0), signedVolts(v1)))
	}
	ps.Caution = leastEnd(p, x) + ", with a current-limited supply or a series lamp; let the heat sink warm for ten minutes and set it again: too much current runs away thermally and destroys the pair"
}

// leastEnd says which end of the travel gives the least current: the
// setting to start from.
func leastEnd(p *graph.Part, m moved) string {
	end := "100 %"
	if m.at0 <= m.lo {
		end = "0 %"
	}
	return fmt.Sprintf("start with %s at the end that gives the least current (%s of its travel, by the DC solver)", p.Ref, end)
}

// outputPair finds two moved devices whose common electrodes meet at one
// net other than a rail, directly or each through one resistor.
func outputPair(c *graph.Circuit, ms []moved) (x, y moved, mid string, ok bool) {
	meets := func(d *graph.Part) map[string]bool {
		k := d.NetOf(d.PinWithRole(graph.RoleCommon))
		out := map[string]bool{}
		if k == "" || c.RoleOf(k).IsACGround() {
			return out
		}
		out[k] = true
		if r := onlyResistor(c, k); r != nil {
			for _, pn := range r.Pins {
				if !c.RoleOf(pn.Net).IsACGround() {
					out[pn.Net] = true
				}
			}
		}
		return out
	}
	for i := range ms {
		for j := i + 1; j < len(ms); j++ {
			a, b := meets(ms[i].d), meets(ms[j].d)
			for _, n := range c.Nets {
				if a[n.Name] && b[n.Name] {
					return ms[i], ms[j], n.Name, true
				}
			}
		}
	}
	return moved{}, moved{}, "", false
}

// onlyResistor is the one resistor on net k besides the device, when the
// net holds only the device's electrode and that resistor (an emitter
// resistor leading to the mid-point); nil otherwise.
func onlyResistor(c *graph.Circuit, k string) *graph.Part {
	var r *graph.Part
	for _, cn := range c.ConnsOf(k) {
		switch {
		case cn.Part.IsActive():
		case cn.Part.Kind == graph.Resistor && r == nil:
			r = cn.Part
		default:
			return nil
		}
	}
	return r
}

// commonResistor is the resistor from device d's common electrode to the
// mid-point, nil when it meets it directly.
func commonResistor(c *graph.Circuit, d *graph.Part, mid string) *graph.Part {
	r := onlyResistor(c, d.NetOf(d.PinWithRole(graph.RoleCommon)))
	if r == nil || (r.Pins[0].Net != mid && r.Pins[1].Net != mid) {
		return nil
	}
	return r
}
