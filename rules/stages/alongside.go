package stages

import "pare/graph"

// alongside lists the capacitors that sit across the same two nets as
// matched part i when that part is a capacitor, leaving out the match's own
// parts. A pattern binds one part per capacitor, but the circuit may keep
// several in parallel (a trimmer marked keep = true across a gang section,
// which the parallel rule then leaves alone): the capacitance across a tank
// is all of them, so a figure counts them and the stage owns them.
func alongside(w *world, m *match, i int) []*graph.Part {
	ci := m.parts[i]
	if ci < 0 || w.parts[ci].Kind != graph.Capacitor || len(w.pins[ci]) != 2 {
		return nil
	}
	a, b := w.pins[ci][0], w.pins[ci][1]
	if a == b {
		return nil
	}
	across := func(o int) bool {
		p := w.pins[o]
		return w.parts[o].Kind == graph.Capacitor && len(p) == 2 && (p[0] == a && p[1] == b || p[0] == b && p[1] == a)
	}
	for _, o := range m.parts[:i] {
		if o >= 0 && across(o) {
			return nil // an earlier capacitor of the match on these nets owns them
		}
	}
	var out []*graph.Part
	for _, o := range w.across[netPair(a, b)] {
		if o != ci && !inMatch(m, o) {
			out = append(out, w.parts[o])
		}
	}
	return out
}

// capsAcross indexes the two-terminal capacitors of w by the two nets they
// sit across, each list in part order, as a walk of either net's parts
// (w.conns, sorted) finds them: alongside read every part on one of the
// two nets, for every capacitor of every match, and on a bank whose
// channels' decouplers share a rail and the chassis that was every
// decoupler of the set each time.
func capsAcross(w *world) map[[2]int][]int {
	out := map[[2]int][]int{}
	for o, p := range w.pins {
		if w.parts[o].Kind == graph.Capacitor && len(p) == 2 && p[0] != p[1] {
			k := netPair(p[0], p[1])
			out[k] = append(out[k], o)
		}
	}
	return out
}

// netPair is the key of two nets, the lower id first.
func netPair(a, b int) [2]int {
	if a > b {
		a, b = b, a
	}
	return [2]int{a, b}
}

func inMatch(m *match, ci int) bool {
	for _, p := range m.parts {
		if p == ci {
			return true
		}
	}
	return false
}
