package stages

import "pare/graph"

// bypassesElectrode reports whether the two-terminal capacitor ci runs
// from a static electrode of an amplifying valve (a further grid: a
// screen, a suppressor not strapped to the cathode) to that valve's own
// cathode or to chassis. Such a capacitor holds the electrode at the
// cathode's AC potential (the screen bypass returned to the cathode, as
// the trade wires it where the cathode is not at AC ground): no signal is
// meant to pass it from one stage to the next, so it is no DC block
// between stages, whatever the resistor beside it (its feed) looks like.
// The signal grid is no static electrode: a capacitor from it to the
// cathode is the input's, not a bypass.
func (w *world) bypassesElectrode(ci int) bool {
	if len(w.pins[ci]) != 2 {
		return false
	}
	a, b := w.pins[ci][0], w.pins[ci][1]
	return w.electrodeTo(a, b) || w.electrodeTo(b, a)
}

// electrodeTo tells whether a further grid of an amplifying valve sits on
// net e (not strapped to that valve's cathode there) while that valve's
// cathode sits on net o, or o is chassis.
func (w *world) electrodeTo(e, o int) bool {
	for _, vi := range w.conns[e] {
		p := w.parts[vi]
		if p.Kind != graph.Valve || isValveDiode(p) {
			continue
		}
		onE, commonE, commonO := false, false, false
		for j, pid := range w.pins[vi] {
			switch role := w.roles[vi][j]; {
			case pid == e && role == graph.RoleGrid:
				onE = true
			case pid == e && role == graph.RoleCommon:
				commonE = true
			case pid == o && role == graph.RoleCommon:
				commonO = true
			}
		}
		if onE && !commonE && (commonO || o == groundNet) {
			return true
		}
	}
	return false
}
