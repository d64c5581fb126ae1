package align

import (
	"pare/graph"
	"pare/rules/stages"
)

// Finding the ganged tuned circuits on the bench's circuit: the
// oscillator's and the signal sections', each with its coil, trimmer and
// padder (tracking.go writes the steps that set them).

// oscTank finds the mixer's oscillator gang section and what sits on it.
func oscTank(c *graph.Circuit, mix *stages.Stage) tank {
	var t tank
	for _, ref := range mix.Parts {
		if p := c.Part(ref); p != nil && p.Kind == graph.Capacitor && p.Gang != "" && p.Type == graph.CapVariable {
			t.gang = p
			break
		}
	}
	if t.gang == nil {
		return t
	}
	return tankOn(c, t.gang)
}

// tankOn is the tuned circuit of the variable capacitor vc (a gang section
// or a single tuning capacitor): the trimmer across it, the padder in
// series, the coil.
func tankOn(c *graph.Circuit, vc *graph.Part) tank {
	t := tank{gang: vc}
	if ends := netsOf(vc); len(ends) == 2 && !tankGround(c, ends[0], vc) && !tankGround(c, ends[1], vc) {
		// A tank off ground (a Colpitts tank between grid and anode): a
		// trimmer across the capacitor's own two nets is in shunt, never
		// a padder, and the coil is the one across them.
		for _, p := range trimmersOn(c, ends) {
			if p != vc && hasNet(p, ends[0]) && hasNet(p, ends[1]) {
				t.trimmer = p
				break
			}
		}
		for _, p := range c.Parts {
			if (p.Kind == graph.Inductor || p.Kind == graph.Transformer) && hasNet(p, ends[0]) && hasNet(p, ends[1]) {
				t.coil = p
				break
			}
		}
		if t.coil != nil || t.trimmer != nil {
			return t
		}
	}
	hot := hotNet(c, t.gang)
	t.trimmer = shuntTrimmer(c, hot, t.gang, t.gang)
	t.padder = seriesCap(c, hot, t.gang)
	coilNet := hot
	if t.padder != nil {
		coilNet = otherNet(t.padder, hot)
	}
	t.coil = coilOn(c, coilNet)
	if t.trimmer == nil && t.padder != nil {
		t.trimmer = shuntTrimmer(c, coilNet, nil, t.gang)
	}
	if t.padder == nil && t.coil != nil {
		t.padder = coldPadder(c, t.coil, hot, t.gang)
	}
	return t
}

// coldPadder is a padder between the coil's cold end and ground (the
// other customary place for it, common practice): a capacitor from the far
// end of the winding on hot to AC ground, that end being no ground itself.
func coldPadder(c *graph.Circuit, coil *graph.Part, hot string, vc *graph.Part) *graph.Part {
	cold := farEnd(coil, hot)
	if cold == "" || tankGround(c, cold, vc) {
		return nil
	}
	for _, p := range c.Parts {
		if p.Kind == graph.Capacitor && len(p.Pins) == 2 && p.Type != graph.CapVariable &&
			hasNet(p, cold) && tankGround(c, otherNet(p, cold), vc) {
			return p
		}
	}
	return nil
}

// farEnd is the net at the other end of the winding of coil that has a pin
// on net (pins "s1"/"s2", "p1"/"p2", or a plain coil's two pins).
func farEnd(coil *graph.Part, net string) string {
	for _, pin := range coil.Pins {
		if pin.Net != net || pin.Name == "" {
			continue
		}
		w, end := pin.Name[:len(pin.Name)-1], pin.Name[len(pin.Name)-1]
		other := map[byte]string{'1': "2", '2': "1"}[end]
		if other == "" {
			continue
		}
		if n := coil.NetOf(w + other); n != "" {
			return n
		}
	}
	return ""
}

// sigTank is the first signal section ganged with the oscillator's.
func sigTank(c *graph.Circuit, oscGang *graph.Part) tank {
	if ts := sigTanks(c, oscGang); len(ts) > 0 {
		return ts[len(ts)-1]
	}
	return tank{}
}

// sigTanks are the signal sections ganged with the oscillator's, in the
// order they are peaked (common practice: from the mixer back): RF tanks
// first, the aerial tank (its coil on the aerial input) last.
func sigTanks(c *graph.Circuit, oscGang *graph.Part) []tank {
	var rf, aerial []tank
	oscHot := hotNet(c, oscGang)
	for _, p := range c.Parts {
		if p == oscGang || p.Kind != graph.Capacitor || p.Gang != oscGang.Gang || p.Type != graph.CapVariable {
			continue
		}
		if hotNet(c, p) == oscHot {
			continue // a section in parallel with the oscillator's (or switched onto it) tunes the same tank
		}
		t := tank{gang: p}
		hot := hotNet(c, p)
		t.trimmer = shuntTrimmer(c, hot, p, p)
		t.coil = coilOn(c, hot)
		if t.aerial = t.coil != nil && len(c.Inputs) > 0 && fedFromAerial(c, t.coil, c.Inputs[0]); t.aerial || len(c.Inputs) == 0 {
			aerial = append(aerial, t)
			continue
		}
		rf = append(rf, t)
	}
	return append(rf, aerial...)
}

// hotNet is a gang section's net away from ground (tankGround: a
// decoupled line it returns to is its ground), or any other two-terminal
// part's net away from AC ground.
func hotNet(c *graph.Circuit, p *graph.Part) string {
	for _, pin := range p.Pins {
		if !tankGround(c, pin.Net, p) {
			return pin.Net
		}
	}
	return ""
}

func otherNet(p *graph.Part, net string) string {
	for _, pin := range p.Pins {
		if pin.Net != net {
			return pin.Net
		}
	}
	return ""
}

// shuntTrimmer is a trimmer from net to the ground of vc's tank
// (tankGround).
func shuntTrimmer(c *graph.Circuit, net string, not, vc *graph.Part) *graph.Part {
	for _, t := range trimmersOn(c, []string{net}) {
		if t != not && tankGround(c, otherNet(t, net), vc) {
			return t
		}
	}
	return nil
}

// seriesCap is the padder: a capacitor from the section's hot net to a
// net that is not AC ground (the coil's).
func seriesCap(c *graph.Circuit, net string, gang *graph.Part) *graph.Part {
	for _, p := range c.Parts {
		if p == gang || p.Kind != graph.Capacitor || len(p.Pins) != 2 || p.Type == graph.CapVariable {
			continue
		}
		if hasNet(p, net) && !tankGround(c, otherNet(p, net), gang) && coilOn(c, otherNet(p, net)) != nil {
			return p
		}
	}
	return nil
}

// coilOn is the coil or transformer with a pin on net.
func coilOn(c *graph.Circuit, net string) *graph.Part {
	for _, p := range c.Parts {
		if (p.Kind == graph.Inductor || p.Kind == graph.Transformer) && hasNet(p, net) {
			return p
		}
	}
	return nil
}

// holdRatio is how many times the tank's largest tuning capacitance a
// fixed capacitor to AC ground must be for the net it holds to count as
// the tank's ground: in series with the tuning capacitance C it moves the
// tank's frequency by about C/(2·Cb), under 0.5 % here, inside what a dial
// is read to (pare's choice, from the series-capacitance formula).
const holdRatio = 100

// tankGround says whether net is AC ground for the tank the variable
// capacitor vc tunes, as the AC solver sees it: by its role, or as a line
// held there by a bypass of its own (a decoupled supply line the gang
// section, its trimmer and its coil return to: an RF or oscillator
// section's "vcc_rf" fed from the rail through a resistor). A part that is
// no capacitor is judged by role alone.
func tankGround(c *graph.Circuit, net string, vc *graph.Part) bool {
	if c.RoleOf(net).IsACGround() {
		return true
	}
	if net == "" || vc == nil || vc.Kind != graph.Capacitor || vc.Value.Max <= 0 {
		return false
	}
	for _, cn := range c.ConnsOf(net) {
		b := cn.Part
		if b.Kind == graph.Capacitor && len(b.Pins) == 2 && b.Type != graph.CapVariable && b.Type != graph.CapTrimmer &&
			b.Value.Min >= holdRatio*vc.Value.Max && c.RoleOf(otherNet(b, net)).IsACGround() {
			return true
		}
	}
	return false
}
