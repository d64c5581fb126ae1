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
	for _, o := range w.conns[a] {
		if o != ci && across(o) && !inMatch(m, o) {
			out = append(out, w.parts[o])
		}
	}
	return out
}

func inMatch(m *match, ci int) bool {
	for _, p := range m.parts {
		if p == ci {
			return true
		}
	}
	return false
}
