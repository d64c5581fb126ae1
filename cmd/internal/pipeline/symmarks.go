package pipeline

import (
	"pare/graph"
	"pare/render"
)

// staticTies says, for each valve of the reduced circuit, where each
// electrode the reduction made static is held in the original: strapped to
// the cathode when it shared the cathode's net there, else at AC ground (the
// static-electrode rule drops a grid only on those two grounds). The reduced
// sheet keeps such a grid's line with a stub to that mark, so a pentode
// still reads as a pentode. Electrodes the netlist itself left unconnected
// get no mark: there is nothing to tie.
func staticTies(orig, reduced *graph.Circuit) map[string]map[string]render.Tie {
	out := map[string]map[string]render.Tie{}
	for _, rp := range reduced.Parts {
		op := orig.Part(rp.Ref)
		if rp.Kind != graph.Valve || op == nil {
			continue
		}
		cathode := op.NetOf(op.PinWithRole(graph.RoleCommon))
		for _, pn := range rp.Pins {
			was := op.NetOf(pn.Name)
			if pn.Net != graph.NotConnected || was == "" || was == graph.NotConnected ||
				graph.RoleOfPin(rp.Kind, pn.Name) != graph.RoleGrid {
				continue
			}
			t := render.TieGround
			if was == cathode && cathode != "" {
				t = render.TieCathode
			}
			if out[rp.Ref] == nil {
				out[rp.Ref] = map[string]render.Tie{}
			}
			out[rp.Ref][pn.Name] = t
		}
	}
	return out
}

// presets lists, per reduced part, the trimmers merged into it (in circuit
// order): each is an alignment point the repairer turns, so the merged
// symbol keeps the preset mark (its alignment mark names the trimmer).
func presets(orig *graph.Circuit, merged map[string]string) map[string][]string {
	out := map[string][]string{}
	for _, p := range orig.Parts {
		to, ok := merged[p.Ref]
		if !ok || p.Kind != graph.Capacitor || p.Type != graph.CapTrimmer {
			continue
		}
		out[to] = append(out[to], p.Ref)
	}
	return out
}
