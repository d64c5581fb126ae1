package render

import "pare/graph"

// A detector diode reads straight off its IF can's secondary: the trade
// draws can, diode and the diode's load in one line, and hangs the delayed
// AGC diode and the AGC filter off it (../shared/DRAWING-NOTES.md: "an IF
// transformer is a pair of tuned windings in a can between two stages").
// The whole sheet's placement orders stretches by x, and a double-diode-
// triode whose second diode feeds the AGC line, or an AGC diode fed from
// the IF anode, stood a column further on than the AGC diode's stretch
// and the detector's IF filter: review19 a03's detector came three
// stretches after its can, too far to share a row with it, and a row and
// page break cut the can from its detector (cancuts.go keeps a can with the
// stage it feeds only where the stretches between fit a row).

// detectorsNext moves each stretch holding a diode that a tuned can's
// undriven winding feeds (takesIn on one of its nets: a detector, a diode
// fed from the secondary), with no active part or transformer of its own,
// with the branches hung on it (branchOf) that follow it, to stand before
// the stretches between it and the can that hang off it (wired to it: the
// delayed-AGC diode sharing its envelope, the IF filter on its load). The
// stretches after the can that only hang on the can's stretch (its tuning
// capacitors, a neutralising capacitor) or share no net with the
// detector's (a decoupler further down the supply line) keep their place
// before it: the detector does not push a decoupler a row away from the
// stage it was drawn beside. A detector is moved only where can and
// detector then fit one row of width (their stretches measured in line):
// one a row away from its can either way keeps its place, and the
// delayed-AGC diode drawn beside the IF anode that feeds it stays there
// (review19 b05's faded view, whose IF stage fills a row alone). The
// stretches' x are measured afresh in line (inLine) when one moved. A
// power rectifier (typed so, or on a transformer declared a mains one)
// keeps its place: it stands in its rectifier's frame. Stretches of another channel, ports, loose
// parts and supply filters kept apart are not moved. Each stretch moves at
// most once and only backwards, so the walk ends.
func detectorsNext(c *graph.Circuit, bs []block, width float64) []block {
	done := map[string]bool{}
	for j := 0; j < len(bs); j++ {
		b := bs[j]
		if b.port || b.loose || b.apart || len(b.refs) == 0 || done[b.refs[0]] {
			continue
		}
		can := canFeeding(c, bs, j)
		if can < 0 {
			continue
		}
		to := can + 1
		for to < j && (hangsOnlyOn(c, bs[to], bs[can]) || !sharesNet(c, bs[to], b)) {
			to++
		}
		if to >= j {
			continue
		}
		done[b.refs[0]] = true
		end := j + 1
		holders := netHolders(c, bs)
		for end < len(bs) && bs[end].ch == b.ch && branchOf(c, bs, holders, end) == j && !holdsActive(c, bs[end]) {
			end++
		}
		run := append([]block{}, bs[j:end]...)
		out := append(append([]block{}, bs[:to]...), run...)
		out = append(append(out, bs[to:j]...), bs[end:]...)
		inLine(out)
		if out[to].x1-out[can].x0 <= width {
			bs = out
		}
	}
	return bs
}

// canFeeding is the last stretch before stretch j, of its channel, holding
// a transformer whose undriven winding (drivenPins) feeds a diode of j
// (takesIn), where j holds no active part, transformer or power rectifier;
// -1 for none.
func canFeeding(c *graph.Circuit, bs []block, j int) int {
	var diodes []*graph.Part
	for _, r := range bs[j].refs {
		p := c.Part(r)
		switch {
		case p == nil || p.Kind == graph.Port:
		case p.IsActive() || p.Kind == graph.Transformer || p.Kind == graph.Diode && p.Type == "rectifier":
			return -1
		case p.Kind == graph.Diode || p.Kind == graph.Valve:
			diodes = append(diodes, p)
		}
	}
	if len(diodes) == 0 {
		return -1
	}
	for i := j - 1; i >= 0 && bs[i].ch == bs[j].ch; i-- {
		if bs[i].port || bs[i].loose {
			continue
		}
		for _, r := range bs[i].refs {
			if p := c.Part(r); p != nil && p.Kind == graph.Transformer && feedsDiode(c, p, diodes) {
				return i
			}
		}
	}
	return -1
}

// feedsDiode says whether an undriven winding of transformer t (not a
// mains transformer: vac or hz declared) has a net a pin of one of the
// diodes takes its signal in on.
func feedsDiode(c *graph.Circuit, t *graph.Part, diodes []*graph.Part) bool {
	if _, mains := t.Param("vac"); mains {
		return false
	}
	if _, mains := t.Param("hz"); mains {
		return false
	}
	driven := drivenPins(c, t)
	for _, pn := range t.Pins {
		n := pn.Net
		if driven[pn.Name] || n == "" || n == graph.NotConnected || c.RoleOf(n).IsACGround() {
			continue
		}
		for _, d := range diodes {
			for _, dp := range d.Pins {
				if dp.Net == n && takesIn(d, dp.Name) {
					return true
				}
			}
		}
	}
	return false
}

// sharesNet says whether stretches a and b hold parts on a common wired net.
func sharesNet(c *graph.Circuit, a, b block) bool {
	on := map[string]bool{}
	for _, r := range b.refs {
		if p := c.Part(r); p != nil {
			for _, n := range wiredNets(c, p) {
				on[n] = true
			}
		}
	}
	for _, r := range a.refs {
		if p := c.Part(r); p != nil {
			for _, n := range wiredNets(c, p) {
				if on[n] {
					return true
				}
			}
		}
	}
	return false
}

// hangsOnlyOn says whether stretch b holds only passive parts whose wired
// nets are all nets of stretch can: the can's tuning capacitors framed
// apart, a neutralising capacitor from its winding back to its device's
// base, a link winding's return bypass; they stay with the can (ports
// aside).
func hangsOnlyOn(c *graph.Circuit, b, can block) bool {
	on := map[string]bool{}
	for _, r := range can.refs {
		if p := c.Part(r); p != nil {
			for _, pn := range p.Pins {
				on[pn.Net] = true
			}
		}
	}
	held := false
	for _, r := range b.refs {
		p := c.Part(r)
		if p == nil || p.Kind == graph.Port {
			continue
		}
		if p.IsActive() || p.Kind == graph.Transformer || p.Kind == graph.Diode || p.Kind == graph.Valve {
			return false
		}
		for _, n := range wiredNets(c, p) {
			if !on[n] {
				return false
			}
		}
		held = true
	}
	return held
}
