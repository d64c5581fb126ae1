package rules

import (
	"strings"

	"pare/graph"
)

// static-electrode: electrodes that carry no signal leave the active device:
// screen and suppressor grids at AC ground or tied to the cathode, internal
// shields, heaters, a FET's body tied to the source, and terminals written as
// not connected. The device keeps its signal terminals, and the why lists them.
var staticElectrode = Rule{
	Name:    "static-electrode",
	Purpose: "drop screens, suppressors, shields and heaters that sit at AC ground or on the cathode",
	Level:   LevelSignal,
	Kinds:   []graph.Kind{graph.Valve, graph.FET, graph.BJT},
	Match: func(x *Ctx, a Anchor) *Plan {
		p := a.Part
		if p.Keep {
			return nil // keep means as drawn, electrodes and all
		}
		common := p.NetOf(p.PinWithRole(graph.RoleCommon))
		var drop, reasons []string
		add := func(pin, reason string) {
			drop = append(drop, pin)
			reasons = append(reasons, pin+" "+reason)
		}
		for _, pin := range p.Pins {
			role := graph.RoleOfPin(p.Kind, pin.Name)
			switch {
			case pin.Net == "nc":
				// already written as not connected: the form a dropped required electrode takes
			case role == graph.RoleHeater:
				add(pin.Name, "(heater)")
			case role == graph.RoleGrid || role == graph.RoleShield:
				switch {
				case x.IsACGround(pin.Net):
					add(pin.Name, "at AC ground ("+electrode(p, pin.Name)+" on "+pin.Net+")")
				case pin.Net == common && common != "":
					add(pin.Name, "tied to the "+electrode(p, p.PinWithRole(graph.RoleCommon)))
				}
			}
		}
		if len(drop) == 0 || len(drop) == len(p.Pins) {
			return nil
		}
		var kept []string
		for _, pin := range p.Pins {
			if !contains(drop, pin.Name) && pin.Net != "nc" {
				kept = append(kept, pin.Name)
			}
		}
		why := p.Ref + " (" + p.Type + "): " + strings.Join(reasons, "; ") +
			": static electrodes carry no signal and are not drawn; " + p.Ref + " keeps " + strings.Join(kept, ", ")
		return &Plan{Parts: []*graph.Part{p}, Data: drop, Why: why}
	},
	Apply: func(x *Ctx, m *Plan) Step {
		p := m.Parts[0]
		var pins []string
		for _, name := range m.Data.([]string) {
			if requiredPin(p, name) {
				x.Unconnect(p, name)
			} else {
				x.DropPin(p, name)
			}
			pins = append(pins, p.Ref+"."+name)
		}
		return Step{Pins: pins}
	},
}

// requiredPin reports whether the netlist format requires the terminal on a
// part of this kind (every electrode of a valve type, b c e, g d s). Such a
// terminal is not deleted but moved to "nc", the format's "not connected", so
// the reduced netlist still loads; heaters, shields and a FET's body are
// optional and go entirely.
func requiredPin(p *graph.Part, pin string) bool {
	switch graph.RoleOfPin(p.Kind, pin) {
	case graph.RoleHeater, graph.RoleShield:
		return false
	}
	return p.Kind == graph.Valve || p.Kind == graph.BJT || p.Kind == graph.FET
}
