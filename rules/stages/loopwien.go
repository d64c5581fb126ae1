package stages

import (
	"math"
	"slices"

	"pare/graph"
	"pare/graph/ac"
	"pare/graph/figure"
)

// wien is a Wien network found among a stage's parts: its arms' values,
// the device whose control electrode it feeds, and the series arm's end
// on the amplifier's output, where the loop is broken.
type wien struct {
	r1, c1, r2, c2 float64
	device         string
	lift           ac.Lift
}

// findWien finds a Wien network among a stage's parts (refs, on the
// reduced circuit c): a device's control net with a resistor and a
// capacitor to AC ground (the parallel arm) and a resistor and a capacitor
// in series, through one net that nothing else touches, from another
// device's output (the series arm).
func findWien(c *graph.Circuit, ground func(string) bool, refs []string) (wien, bool) {
	in := map[string]bool{}
	var devs []*graph.Part
	for _, r := range refs {
		in[r] = true
		if p := c.Part(r); p != nil && p.IsActive() {
			devs = append(devs, p)
		}
	}
	for _, d := range devs {
		outs := map[string]bool{}
		for _, o := range devs {
			if o != d {
				outs[o.NetOf(o.PinWithRole(graph.RoleOutput))] = true
			}
		}
		g := d.NetOf(d.PinWithRole(graph.RoleControl))
		r2, c2 := armToGround(c, ground, in, g)
		arm, ok := seriesArm(c, in, g, outs)
		if r2 > 0 && c2 > 0 && ok {
			arm.r2, arm.c2, arm.device = r2, c2, d.Ref
			return arm, true
		}
	}
	return wien{}, false
}

// wienFigures puts the handbook's frequency and the gain the loop needs
// as formula figures (the loop's own frequency then takes the formula as
// its cross-check).
func wienFigures(st *Stage, w wien) {
	insertFigure(st, 0, figure.Figure{Name: "f", Label: "f", Unit: figure.Hertz, Value: 1 / (2 * math.Pi * math.Sqrt(w.r1*w.r2*w.c1*w.c2)), Origin: byWien})
	insertFigure(st, 1, figure.Figure{Name: "gain_min", Label: "gain needed to oscillate ≥", Unit: figure.Ratio, Value: 1 + w.r1/w.r2 + w.c2/w.c1, Origin: byWienGain})
}

// armToGround is the resistance (in parallel) and capacitance (summed)
// of the stage's two-pin parts from net g to AC ground.
func armToGround(c *graph.Circuit, ground func(string) bool, in map[string]bool, g string) (r, cap float64) {
	var gsum float64
	for _, p := range c.Parts {
		other, ok := otherEnd(p, g)
		if !in[p.Ref] || !ok || !ground(other) {
			continue
		}
		switch p.Kind {
		case graph.Resistor:
			if v := p.Value.Max; v > 0 {
				gsum += 1 / v
			}
		case graph.Capacitor:
			cap += p.Capacitance(0.5)
		}
	}
	if gsum > 0 {
		r = 1 / gsum
	}
	return r, cap
}

// seriesArm finds a resistor and a capacitor in series from net g through
// one middle net (touched by those two parts only) to one of outs: the
// arm's values and the end on the output to lift.
func seriesArm(c *graph.Circuit, in map[string]bool, g string, outs map[string]bool) (wien, bool) {
	for _, a := range c.Parts {
		m, on := otherEnd(a, g)
		if !in[a.Ref] || !on || len(partsOn(c, m)) != 2 {
			continue
		}
		for _, b := range partsOn(c, m) {
			o, on := otherEnd(b, m)
			if b == a || !on || !outs[o] || b.Kind == a.Kind {
				continue
			}
			res, capa := a, b
			if a.Kind == graph.Capacitor {
				res, capa = b, a
			}
			if res.Kind == graph.Resistor && capa.Kind == graph.Capacitor {
				return wien{r1: res.Value.Max, c1: capa.Capacitance(0.5), lift: ac.Lift{Part: b.Ref, Net: o}}, true
			}
		}
	}
	return wien{}, false
}

// otherEnd is the net at a two-pin part's other end from net n.
func otherEnd(p *graph.Part, n string) (string, bool) {
	if len(p.Pins) != 2 {
		return "", false
	}
	switch n {
	case p.Pins[0].Net:
		return p.Pins[1].Net, true
	case p.Pins[1].Net:
		return p.Pins[0].Net, true
	}
	return "", false
}

// partsOn are the parts with a pin on net n.
func partsOn(c *graph.Circuit, n string) []*graph.Part {
	var out []*graph.Part
	for _, p := range c.Parts {
		if slices.ContainsFunc(p.Pins, func(q graph.Pin) bool { return q.Net == n }) {
			out = append(out, p)
		}
	}
	return out
}
