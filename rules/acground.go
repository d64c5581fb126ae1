package rules

import (
	"pare/graph"
)

// ground-merge: several ground nets (gnd, chassis, 0) are one node.
var groundMerge = Rule{
	Name:    "ground-merge",
	Purpose: "join every ground net (gnd, chassis, 0 …) into one",
	Level:   LevelTidy,
	Nets:    true,
	Match: func(x *Ctx, a Anchor) *Plan {
		if a.Net.Role != graph.Ground {
			return nil
		}
		g := x.ground()
		if a.Net.Name == g {
			return nil
		}
		return &Plan{Nets: []string{a.Net.Name, g},
			Why: a.Net.Name + " and " + g + " are both ground (0 V): one net"}
	},
	Apply: func(x *Ctx, m *Plan) Step {
		x.Join(m.Nets[1], m.Nets[0])
		return Step{Joined: []string{m.Nets[1], m.Nets[0]}}
	},
}

// rail-ground: supply, heater and bias nets are AC ground for the signal.
// The assumption is the one every hand reduction makes and is stated in the
// why: the rail is stiff (well decoupled) at signal frequencies.
var railGround = Rule{
	Name:    "rail-ground",
	Purpose: "treat supply rails, heater supplies and bias supplies as AC ground",
	Level:   LevelSignal,
	Nets:    true,
	Match: func(x *Ctx, a Anchor) *Plan {
		n := a.Net
		switch n.Role {
		case graph.Supply, graph.Heater, graph.Bias:
		default:
			return nil
		}
		if x.IsEnd(n.Name) {
			return nil // a declared signal net keeps its signal, whatever its role
		}
		what := n.Name
		if n.Label != "" {
			what += " (" + n.Label + ")"
		}
		var why string
		switch n.Role {
		case graph.Supply:
			why = what + " is a supply rail: AC ground for the signal (assumes the rail is stiff/decoupled at signal frequencies)"
		case graph.Heater:
			why = what + " is a heater supply: AC ground for the signal (assumes heater–cathode coupling and hum are not of interest)"
		case graph.Bias:
			why = what + " is a fixed bias supply: AC ground for the signal (assumes it is decoupled)"
		}
		return &Plan{Nets: []string{n.Name}, Why: why}
	},
	Apply: func(x *Ctx, m *Plan) Step {
		g := x.GroundNet(m.Nets[0])
		return Step{Grounded: []string{m.Nets[0]}, Joined: []string{g, m.Nets[0]}}
	},
}
