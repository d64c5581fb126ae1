package pipeline

import (
	"strings"

	"pare/graph"
	"pare/render"
)

// staticTies says, for each valve of the reduced circuit, where each
// electrode the reduction made static is held in the original: strapped to
// the cathode when it shared the cathode's net there, at a rail when its
// net was one or a line fed from one (a screen on its dropper: railOf),
// else at AC ground (the static-electrode rule drops a grid only on those
// grounds). The reduced sheet keeps such a grid's line with a stub to that
// mark, so a pentode still reads as a pentode; labels names, per valve,
// the rails its electrodes tied to a rail are held at, with their DC
// volts where the operating point gives them ("g2, g4 HT via R3 +96.2
// V"): review19 a02's heptode screens were stubs a technician could not
// read. Electrodes the netlist itself left unconnected get no mark: there
// is nothing to tie.
func (r *Result) staticTies(orig, reduced *graph.Circuit) (map[string]map[string]render.Tie, map[string]string) {
	out, labels := map[string]map[string]render.Tie{}, map[string]string{}
	var named *graph.Circuit // orig with the lines marked (railOf), made once
	for _, rp := range reduced.Parts {
		op := orig.Part(rp.Ref)
		if rp.Kind != graph.Valve || op == nil {
			continue
		}
		cathode := op.NetOf(op.PinWithRole(graph.RoleCommon))
		var order []string
		pins := map[string][]string{}
		for _, pn := range rp.Pins {
			was := op.NetOf(pn.Name)
			if pn.Net != graph.NotConnected || was == "" || was == graph.NotConnected ||
				graph.RoleOfPin(rp.Kind, pn.Name) != graph.RoleGrid {
				continue
			}
			t := render.TieGround
			if was == cathode && cathode != "" {
				t = render.TieCathode
			} else if rail := r.railOf(orig, &named, was); rail != "" {
				t = render.TieRail
				if len(pins[rail]) == 0 {
					order = append(order, rail)
				}
				pins[rail] = append(pins[rail], pn.Name)
			}
			if out[rp.Ref] == nil {
				out[rp.Ref] = map[string]render.Tie{}
			}
			out[rp.Ref][pn.Name] = t
		}
		var line []string
		for _, rail := range order {
			line = append(line, strings.Join(pins[rail], ", ")+" "+rail)
		}
		if len(line) > 0 {
			labels[rp.Ref] = strings.Join(line, "; ")
		}
	}
	return out, labels
}

// railOf is the name of the rail net n of the original circuit is, or of
// the line fed from a rail it is (graph.MarkDecoupled, on a copy made once
// into *named: "HT via R3"), with its DC volts where the operating point
// gives them; "" for chassis and a net held at AC ground otherwise.
func (r *Result) railOf(orig *graph.Circuit, named **graph.Circuit, n string) string {
	net := orig.Net(n)
	if net == nil || net.Role == graph.Ground {
		return ""
	}
	label := ""
	switch {
	case net.Role.IsRail():
		label = net.Label
		if label == "" {
			label = net.Name
		}
	default:
		if *named == nil {
			*named = orig.Clone()
		}
		if m := (*named).Net(n); m.Role == graph.Signal && !(*named).MarkDecoupled(n) || m.Label == "" {
			return ""
		}
		label = (*named).Net(n).Label
	}
	return label
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
