package align

import (
	"fmt"
	"math"
	"slices"
	"strings"

	"pare/graph"
	"pare/rules/stages"
)

// An open bypass is worded with the figures it gives on this circuit: the
// stage's gain solved as captured and with the bypass capacitor's lead on
// the common electrode lifted (the AC solver on the whole circuit, at the
// middle of the device's band as the stage's own gain figure is solved),
// not a rule of thumb: how far a stage falls depends on its device and its
// unbypassed resistor (a triode of high µ with a small cathode resistor
// keeps two thirds of its gain, a transistor stage a small fraction).

const openBypass = "open cathode or emitter bypass"

// bypassUnsolved is the open bypass's injection words where no stage's
// fall was solved: no number, since a rule of thumb misleads as often.
const bypassUnsolved = "the stage gains less than its figure (its unbypassed gain); the level at its input row rises by the same factor"

// bypassFall is one stage's gain as captured and with its bypass open.
type bypassFall struct {
	stage, bypass string
	in, out       string
	f, was, open  float64
}

// fallOf solves stage s's gain with its bypass open; ok false when the
// stage has no device, no bypass from its common electrode to an AC
// ground, no band, or the solver fails.
func fallOf(c *graph.Circuit, s stages.Stage) (bypassFall, bool) {
	var dev *graph.Part
	for _, ref := range s.Parts {
		if p := c.Part(ref); p != nil && p.IsActive() {
			dev = p
			break
		}
	}
	if dev == nil {
		return bypassFall{}, false
	}
	common := dev.NetOf(dev.PinWithRole(graph.RoleCommon))
	in, out := dev.NetOf(signalGrid(c, dev)), dev.NetOf(dev.PinWithRole(graph.RoleOutput))
	band := c.BandOf(dev)
	if common == "" || in == "" || out == "" || band.Min <= 0 || band.Max <= band.Min {
		return bypassFall{}, false
	}
	for _, ref := range s.Parts {
		p := c.Part(ref)
		if p == nil || p.Kind != graph.Capacitor || len(p.Pins) != 2 || !hasNet(p, common) || !c.RoleOf(otherNet(p, common)).IsACGround() {
			continue
		}
		fl := bypassFall{stage: s.Name, bypass: p.Ref, in: in, out: out, f: math.Sqrt(band.Min * band.Max)}
		was, err1 := Response(c, in, out, fl.f, 0.5)
		open, err2 := Response(liftLead(c, p.Ref, common), in, out, fl.f, 0.5)
		if err1 != nil || err2 != nil || was <= 0 || open <= 0 || math.IsInf(was+open, 0) || math.IsNaN(was+open) {
			return bypassFall{}, false
		}
		fl.was, fl.open = was, open
		return fl, true
	}
	return bypassFall{}, false
}

// liftLead is c with part ref's lead on net left unconnected (the
// circuit-editing API's Unconnect, on a copy that owns only that part).
func liftLead(c *graph.Circuit, ref, net string) *graph.Circuit {
	m := c.CloneSharing(func(p *graph.Part) bool { return p.Ref == ref })
	for _, pin := range m.Part(ref).Pins {
		if pin.Net == net {
			m.Unconnect(ref, pin.Name)
			break
		}
	}
	return m
}

// bypassInject is the injection wording of the open-bypass fault for the
// stages named: each stage's solved fall, or, where none solved, the fall
// without a number.
func bypassInject(c *graph.Circuit, sts []stages.Stage, names []string) string {
	var falls []string
	for _, s := range sts {
		if !slices.Contains(names, s.Name) {
			continue
		}
		if fl, ok := fallOf(c, s); ok {
			falls = append(falls, fmt.Sprintf("%s's gain falls from ×%.3g to ×%.3g (V(%s)/V(%s) at %s, solved as captured and with %s open)",
				fl.stage, fl.was, fl.open, fl.out, fl.in, hz(fl.f), fl.bypass))
		}
	}
	if len(falls) == 0 {
		return bypassUnsolved
	}
	return strings.Join(falls, "; ") + "; the level at its input row rises by the same factor"
}
