package graph

import "sort"

// Where the signal enters a circuit that declares no input. A capture of a
// board with no port marked as its input (an oscillator, a stage cut out of
// a set) still has a signal path: it starts at an oscillator, the active
// part with a tank on one of its terminals (the circuit makes its own
// signal there), else at the first active part, the one whose control
// terminal no other device drives. The walk from there orders stages,
// tells which side of a coupling capacitor is driven, and is what `sweep`
// and `spice` drive when given no net.

// InferredInput returns the control net of the part where the signal is
// taken to start, the part, and why it was chosen ("oscillator" or "first
// active part"); all empty when the circuit has no active part with a
// signal net on its control terminal. Declared inputs are not consulted:
// callers use them first.
func InferredInput(c *Circuit) (net string, part *Part, why string) {
	driven := map[string]bool{} // nets on some active part's output terminal
	var cands []*Part
	for _, p := range c.Parts {
		if !p.IsActive() {
			continue
		}
		for _, pin := range p.Pins {
			if RoleOfPin(p.Kind, pin.Name) == RoleOutput {
				driven[pin.Net] = true
			}
		}
		if controlNet(c, p) != "" {
			cands = append(cands, p) // c.Parts is in ref order, so cands is too
		}
	}
	for _, p := range cands {
		if hasTank(c, p) {
			return controlNet(c, p), p, "oscillator"
		}
	}
	for _, p := range cands {
		if n := controlNet(c, p); !driven[n] {
			return n, p, "first active part"
		}
	}
	if len(cands) > 0 {
		return controlNet(c, cands[0]), cands[0], "first active part"
	}
	return "", nil, ""
}

// controlNet is the net on a device's control terminal (grid g1, base,
// gate), "" when it is at AC ground or unconnected.
func controlNet(c *Circuit, p *Part) string {
	for _, pin := range p.Pins {
		if RoleOfPin(p.Kind, pin.Name) == RoleControl && pin.Net != "nc" && !c.RoleOf(pin.Net).IsACGround() {
			return pin.Net
		}
	}
	return ""
}

// hasTank tells whether a device has a tank on one of its terminals: a net
// it shares with a coil (an inductor or a transformer winding) and a
// capacitor, the mark of an LC oscillator; or a net on a coil whose other
// end holds the capacitor (a cathode or emitter on the tank coil's tap,
// the tank itself beyond it). A buffer coupled to the tank through a
// capacitor has no coil on its own nets and is not taken for it.
func hasTank(c *Circuit, p *Part) bool {
	for _, pin := range p.Pins {
		if pin.Net == "nc" || c.RoleOf(pin.Net).IsACGround() {
			continue
		}
		coil, capacitor := tankParts(c, pin.Net)
		if coil && capacitor {
			return true
		}
		for _, cn := range c.ConnsOf(pin.Net) {
			if cn.Part.Kind != Inductor && cn.Part.Kind != Transformer {
				continue
			}
			for _, other := range cn.Part.Pins {
				if other.Net == pin.Net || other.Net == "nc" || c.RoleOf(other.Net).IsACGround() {
					continue
				}
				if _, capacitor := tankParts(c, other.Net); capacitor {
					return true
				}
			}
		}
	}
	return false
}

// tankParts tells whether a net holds a coil and a capacitor.
func tankParts(c *Circuit, net string) (coil, capacitor bool) {
	for _, cn := range c.ConnsOf(net) {
		switch cn.Part.Kind {
		case Inductor, Transformer:
			coil = true
		case Capacitor:
			capacitor = true
		}
	}
	return coil, capacitor
}

// UpstreamOf is where the signal comes from before it reaches net, a
// device's control: the net farthest from it through passive parts only
// (a coupling capacitor to a port, a tuned circuit), or net itself. A walk
// that orders stages starts there, so the parts feeding the first device
// come before it and a coupling capacitor's driven side is the far one.
// The walk goes no further than a net that holds an active part's output
// or common electrode (an anode, a collector, an emitter), which may itself
// be the answer: a feedback network from the device's own output (a
// phase-shift ladder, a Colpitts divider) starts there, but what lies
// beyond an output (a buffer on the oscillator's emitter) is what the
// device drives, never where its signal comes from.
func UpstreamOf(c *Circuit, net string) string {
	stop := drivenNets(c)
	enter := func(p *Part, pin string) bool { return !p.IsActive() && !stop[p.NetOf(pin)] }
	if far := farthest(c, net, enter); far != "" {
		return far
	}
	return net
}

// drivenNets are the nets on some active part's terminals other than its
// control: where a device puts its signal out.
func drivenNets(c *Circuit) map[string]bool {
	out := map[string]bool{}
	for _, p := range c.Parts {
		if !p.IsActive() {
			continue
		}
		for _, pin := range p.Pins {
			switch RoleOfPin(p.Kind, pin.Name) {
			case RoleOutput, RoleCommon:
				out[pin.Net] = true
			}
		}
	}
	return out
}

// FarthestNet is the signal net the walk from net reaches last, never
// crossing an AC-ground net: where a chain with no declared output ends.
// Ties go to the smaller name; "" when nothing is reached.
func FarthestNet(c *Circuit, net string) string { return farthest(c, net, nil) }

func farthest(c *Circuit, net string, enter func(*Part, string) bool) string {
	w := NewWalk(c.View())
	w.Enter = enter
	w.Follow = func(n string) bool { return !c.RoleOf(n).IsACGround() }
	w.FromNets([]string{net}, 0)
	var nets []string
	for _, n := range c.Nets {
		if _, ok := w.NetDist(n.Name); ok && n.Name != net && !n.Role.IsACGround() {
			nets = append(nets, n.Name)
		}
	}
	sort.SliceStable(nets, func(i, j int) bool {
		di, _ := w.NetDist(nets[i])
		dj, _ := w.NetDist(nets[j])
		return di > dj
	})
	if len(nets) == 0 {
		return ""
	}
	return nets[0]
}
