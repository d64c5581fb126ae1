package graph

// An AGC line is the net at the end of an RC low-pass from a signal
// detector's output to the bias point of a controlled stage: a resistor
// from the detector's load (or from the far end of the IF filter after
// it) into the line, a capacitor to chassis that holds it, and DC paths
// from the line to a base or control grid. A reduction ties the line to
// AC ground like a decoupled supply line, but it is no supply and is not
// named after one: its tag is "AGC line", whichever way the diode points
// and whether or not the netlist declares the net.

// agcDepth bounds the walk from a line to the electrode it biases: the
// feed resistor to the winding's cold end, the winding to the base or grid
// (common practice: an AGC line reaches its stage through a decoupling
// resistor and the coupling winding, no further).
const agcDepth = 3

// detectorCapMax is the most capacitance on a diode's terminal for it to
// be taken as a signal detector, not a power rectifier: 1 µF. A detector's
// load capacitor is 100 pF to tens of nF, a reservoir 8 µF and up (common
// practice, from memory; rules/stages uses the same bound).
const detectorCapMax = 1e-6

// AGCFeed tells whether net is an AGC line, and through which resistor and
// from which net the detector feeds it: a resistor from a net with a
// signal detector on it, or one series resistor (the IF filter) beyond it,
// to net, where net itself has no detector on it and its DC paths reach
// the control electrode of an amplifying device (a base, a control grid).
func (c *Circuit) AGCFeed(net string) (from, via string, ok bool) {
	if c.DetectorOn(net) {
		return "", "", false // the detector's own load, not a line after it
	}
	if c.notSignal(net) {
		// a supply rail or chassis: a standing-bias resistor from the rail
		// to the AGC line does not make the rail the line
		return "", "", false
	}
	for _, cn := range c.ConnsOf(net) {
		p := cn.Part
		if p.Kind != Resistor || len(p.Pins) != 2 {
			continue
		}
		other, _ := dcNeighbour(cn)
		if other.Net == net || c.notSignal(other.Net) || !c.DetectorFeeds(other.Net, p.Ref) {
			continue
		}
		if c.biasesControl(net, p.Ref) {
			return other.Net, p.Ref, true
		}
	}
	return "", "", false
}

// DetectorFeeds tells whether net carries a detector's DC output: a signal
// detector on it (a diode, or one at the far end of a winding from it: the
// load in the IF winding's cold end), or one series resistor other than
// skip away from such a net (after the IF filter).
func (c *Circuit) DetectorFeeds(net, skip string) bool {
	if c.DetectorOn(net) {
		return true
	}
	for _, cn := range c.ConnsOf(net) {
		if cn.Part.Kind != Resistor || cn.Part.Ref == skip {
			continue
		}
		if other, ok := dcNeighbour(cn); ok && other.Net != net && !c.notSignal(other.Net) && c.DetectorOn(other.Net) {
			return true
		}
	}
	return false
}

// DetectorOn tells whether a signal detector sits on net, or at the far
// end of a transformer winding from it; never on a net at AC ground.
func (c *Circuit) DetectorOn(net string) bool {
	if c.notSignal(net) {
		return false // chassis or a supply: a detector's output carries the signal
	}
	if c.signalDiodeOn(net) {
		return true
	}
	for _, cn := range c.ConnsOf(net) {
		if far, ok := windingEnd(cn); ok && far.Net != net && c.signalDiodeOn(far.Net) {
			return true
		}
	}
	return false
}

// signalDiodeOn tells whether a diode or valve diode on net is a signal
// detector: not typed a rectifier and with no reservoir-sized capacitor
// (detectorCapMax) on any of its terminals.
func (c *Circuit) signalDiodeOn(net string) bool {
	for _, cn := range c.ConnsOf(net) {
		p := cn.Part
		if p.Kind != Diode && !(p.Kind == Valve && !p.IsActive()) || p.Type == "rectifier" {
			continue
		}
		if !c.holdsReservoir(p) {
			return true
		}
	}
	return false
}

// holdsReservoir tells whether a capacitor of detectorCapMax or more sits
// on a terminal of p other than one on chassis or a heater (a valve
// diode's cathode and heater pins are there, beside every bypass in the
// set), or one on an amplifying device's common electrode: a detector
// returned to the cathode of the triode in its envelope (or to an
// emitter) finds that stage's bypass there, which holds a bias point, not
// a rectifier's output.
func (c *Circuit) holdsReservoir(p *Part) bool {
	for _, pin := range p.Pins {
		if r := c.RoleOf(pin.Net); r == Ground || r == Heater || c.commonOn(pin.Net) {
			continue
		}
		for _, cn := range c.ConnsOf(pin.Net) {
			if cn.Part.Kind == Capacitor && cn.Part.Capacitance(0.5) >= detectorCapMax {
				return true
			}
		}
	}
	return false
}

// biasesControl walks from net through resistors, chokes and windings
// (never through skip, the feed, nor into a net at AC ground), at most
// agcDepth parts, and tells whether it meets a control electrode with no
// output or common electrode on the line itself or one part from it: a
// line that feeds a collector or anode through its load is a supply line.
// Further out an output electrode is another stage's, reached back through
// its supply (a standing-bias resistor from a decoupled rail), and says
// nothing of the line.
func (c *Circuit) biasesControl(net, skip string) bool {
	seen := map[string]bool{net: true}
	frontier := []string{net}
	for d := 0; d <= agcDepth && len(frontier) > 0; d++ {
		control, supplied := false, false
		var next []string
		for _, n := range frontier {
			for _, cn := range c.ConnsOf(n) {
				if cn.Part.IsActive() {
					switch RoleOfPin(cn.Part.Kind, cn.Pin) {
					case RoleControl:
						control = true
					case RoleOutput, RoleCommon:
						supplied = true
					}
					continue
				}
				if cn.Part.Ref == skip {
					continue
				}
				far, ok := dcNeighbour(cn)
				if ok && c.RoleOf(far.Net).IsACGround() && c.returnsControl(far, n) {
					control = true // a base return joined away, named as fed from here
				}
				if !ok {
					far, ok = windingEnd(cn)
				}
				if ok && !seen[far.Net] && !c.RoleOf(far.Net).IsACGround() {
					seen[far.Net] = true
					next = append(next, far.Net)
				}
			}
		}
		if supplied && d <= 1 {
			return false
		}
		if control {
			return true
		}
		frontier = next
	}
	return false
}

// notSignal tells whether a net is chassis or a supply or heater rail, at
// AC ground and no detector's output nor an AGC line (a bias net may be the
// line itself, declared).
func (c *Circuit) notSignal(net string) bool {
	r := c.RoleOf(net)
	return r.IsACGround() && r != Bias
}

// agcBranch tells whether net is a base or grid return the AGC line feeds
// through a resistor: net reaches control electrodes only (feedsOnlyControl)
// and a resistor joins it to the AGC line, still live (AGCFeed on the far
// net, through another resistor than this one: not the detector's side of
// the line's own filter) or already joined away (a rail of the bias role
// fed from a detector's output, or a declared bias net). A standing-bias
// resistor from a supply may feed the same net: the control voltage is
// what the line carries, so it is named after the line ("AGC line via R2"),
// never "bias via R1". It gives the line's net, its name and the resistor.
func (c *Circuit) agcBranch(net string) (line, name, via string, ok bool) {
	if !c.feedsOnlyControl(net) {
		return "", "", "", false
	}
	for _, cn := range c.ConnsOf(net) {
		if cn.Part.Kind != Resistor {
			continue
		}
		far, ok := dcNeighbour(cn)
		if !ok || far.Net == net {
			continue
		}
		if !c.RoleOf(far.Net).IsACGround() {
			if _, feed, ok := c.AGCFeed(far.Net); ok && feed != cn.Part.Ref {
				return far.Net, agcLineName, cn.Part.Ref, true
			}
			continue
		}
		if r := c.ReturnOf(far); r != nil && c.isAGCRail(r) {
			return r.Name, FeedName(r), cn.Part.Ref, true
		}
	}
	return "", "", "", false
}

// agcLineName is the tag of an AGC line found by its wiring.
const agcLineName = "AGC line"

// isAGCRail tells whether a rail a reduction joined away is an AGC line: of
// the bias role and fed from a net that carries a detector's output
// (MarkDecoupled set it so), or a bias net the netlist declares.
func (c *Circuit) isAGCRail(r *Net) bool {
	if r.Role != Bias {
		return false
	}
	if r.Declared {
		return true
	}
	return r.Fed != "" && c.Net(r.Fed) != nil && c.DetectorFeeds(r.Fed, "")
}

// returnsControl tells whether a terminal a reduction moved off a base or
// grid return is on a line fed from net that reaches control electrodes
// only: MarkDecoupled named it so (agcBranch) before it joined it to AC
// ground, when the line's way to the base still ran through it.
func (c *Circuit) returnsControl(far Pin, net string) bool {
	if far.Rail == "" {
		return false
	}
	r := c.ReturnOf(far)
	return r != nil && r.Role == Bias && r.Fed == net
}

// commonOn tells whether the common electrode of an amplifying device (a
// cathode, an emitter, a source) sits on net.
func (c *Circuit) commonOn(net string) bool {
	for _, cn := range c.ConnsOf(net) {
		if isCommonPin(cn) {
			return true
		}
	}
	return false
}
