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

// cathodeStraps says, on a sheet of the original circuit, which grids of
// each valve are wired to the valve's own cathode (a suppressor, a
// heptode's outer grid): they are drawn as the trade's internal strap, as
// on the reduced sheet. As a lead, such a grid leaves on the right between
// the anode and the screen, so its way round to the cathode crosses the
// screen lead or the anode lead whichever way up the valve stands
// (review17 a04's push-pull pair's g3 leads across their screen leads;
// every heptode frequency changer of review13..19 its g5 lead, on its way
// to the cathode net, across its anode lead).
func cathodeStraps(full *graph.Circuit) map[string]map[string]render.Tie {
	out := map[string]map[string]render.Tie{}
	for _, p := range full.Parts {
		if p.Kind != graph.Valve {
			continue
		}
		k := p.NetOf(p.PinWithRole(graph.RoleCommon))
		for _, pn := range p.Pins {
			if k == "" || k == graph.NotConnected || pn.Net != k || graph.RoleOfPin(p.Kind, pn.Name) != graph.RoleGrid {
				continue
			}
			if out[p.Ref] == nil {
				out[p.Ref] = map[string]render.Tie{}
			}
			out[p.Ref][pn.Name] = render.TieCathode
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
